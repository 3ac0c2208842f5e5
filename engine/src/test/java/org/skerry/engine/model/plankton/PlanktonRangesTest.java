package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.Slow;

/**
 * The plankton model's likelihood of observation ranges (synthetic Lake Quellmar data): a range
 * solves only up to its last day yet takes the season solve's very steps, so its states and terms
 * are the season's bit for bit, at a fraction of the cost; ranges against Commons Math's
 * {@link LogNormalDistribution} at the solved trajectory; additivity over random splits.
 *
 * <p>Rounding bound as in {@code ObservationRangesTest}: {@code 16·(N + 1)·u·Σ|magnitudes|}
 * after Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed. (2002), §4.2.
 */
@Slow
class PlanktonRangesTest {

    private static final QuellmarBuoy DEMO = QuellmarScenario.demoBuoy();

    /**
     * The rounding bound for sums over {@code [from, to)}. A term is {@code −log y − log √(2π) −
     * log σ − q} with {@code q ≥ 0}, so the magnitudes of its parts add up to at most
     * {@code |term| + 2·(|log y| + log √(2π) + |log σ|)}.
     */
    private static double bound(double[] terms, double[][] rows, double sigma, int from, int to) {
        double magnitude = 0.0;
        for (int j = from; j < to; j++) {
            magnitude += Math.abs(terms[j]) + 2.0 * (Math.abs(Math.log(rows[j][1]))
                    + 0.5 * Math.log(2.0 * Math.PI) + Math.abs(Math.log(sigma)));
        }
        return 16.0 * (to - from + 1) * 0x1p-53 * magnitude;
    }

    /** Parameter vectors around the buoy's truth, log-normally spread (30 %). */
    private static double[][] draws(long seed, int count) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] out = new double[count][];
        for (int i = 0; i < count; i++) {
            out[i] = DEMO.trueParameters();
            for (int k = 0; k < out[i].length; k++) {
                out[i][k] *= Math.exp(0.3 * random.nextGaussian());
            }
        }
        return out;
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("states up to day k are the season solve's first k rows, bit for bit")
    void prefixStatesAreTheSeasonsStates(GrazingResponse grazing) {
        PlanktonModel model = QuellmarScenario.model(DEMO, QuellmarData.generate(DEMO, 7L), grazing);
        PlanktonDynamics dynamics = model.dynamics();
        for (double[] theta : draws(11L, 10)) {
            double[][] season = dynamics.integratedStates(theta);
            for (int k = 0; k <= season.length; k++) {
                double[][] prefix = dynamics.integratedStates(theta, k);
                assertEquals(k, prefix.length);
                for (int j = 0; j < k; j++) {
                    assertArrayEquals(season[j], prefix[j], "day " + j + " of a solve up to observation " + k);
                }
            }
        }
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("the range up to observation k equals the sum of the season solve's terms; [0, n) is the full likelihood bit for bit")
    void rangesAgainstSeasonTerms(GrazingResponse grazing) {
        double[][] rows = QuellmarData.generate(DEMO, 8L);
        PlanktonModel model = QuellmarScenario.model(DEMO, rows, grazing);
        int n = model.observationCount();
        assertEquals(rows.length, n);
        SplittableRandom random = new SplittableRandom(12L);
        for (double[] theta : draws(13L, 10)) {
            assertEquals(Double.doubleToRawLongBits(model.logLikelihood(theta, null)),
                    Double.doubleToRawLongBits(model.logLikelihood(theta, 0, n, null)), "whole range");
            double[] terms = new double[n];
            model.logLikelihoodTerms(theta, 0, n, terms, null);
            double prefix = 0.0;
            for (int k = 1; k <= n; k++) {
                prefix += terms[k - 1];
                assertEquals(prefix, model.logLikelihood(theta, 0, k, null), bound(terms, rows, theta[PlanktonModel.SIGMA], 0, k),
                        "range [0, " + k + ")");
            }
            for (int trial = 0; trial < 5; trial++) {
                int from = random.nextInt(n);
                int to = from + 1 + random.nextInt(n - from);
                double[] window = new double[to - from];
                model.logLikelihoodTerms(theta, from, to, window, null);
                assertArrayEquals(Arrays.copyOfRange(terms, from, to), window,
                        "terms of [" + from + ", " + to + ") from a shorter solve");
                for (int j = from; j < to; j++) {
                    assertEquals(Double.doubleToRawLongBits(model.logLikelihood(theta, j, j + 1, null)),
                            Double.doubleToRawLongBits(window[j - from]), "term " + j + " against its single range");
                }
            }
            int pieces = 1 + random.nextInt(6);
            int[] cuts = new int[pieces + 1];
            for (int i = 1; i < pieces; i++) {
                cuts[i] = random.nextInt(n + 1);
            }
            cuts[pieces] = n;
            Arrays.sort(cuts);
            double sum = 0.0;
            for (int i = 0; i + 1 < cuts.length; i++) {
                sum += model.logLikelihood(theta, cuts[i], cuts[i + 1], null);
            }
            assertEquals(model.logLikelihood(theta, null), sum, bound(terms, rows, theta[PlanktonModel.SIGMA], 0, n), "split " + Arrays.toString(cuts));
        }
    }

    @Test
    @DisplayName("ranges equal sums of Commons Math LogNormalDistribution.logDensity at the season's trajectory")
    void rangesMatchCommonsMath() {
        double[][] rows = QuellmarData.generate(DEMO, 9L);
        PlanktonModel model = QuellmarScenario.model(DEMO, rows, QuellmarScenario.TRUE_GRAZING);
        int n = rows.length;
        SplittableRandom random = new SplittableRandom(14L);
        for (double[] theta : draws(15L, 5)) {
            double[][] states = model.dynamics().states(theta);
            for (int trial = 0; trial < 5; trial++) {
                int from = random.nextInt(n);
                int to = from + 1 + random.nextInt(n - from);
                double expected = 0.0;
                for (int j = from; j < to; j++) {
                    double scale = StrictMath.log(DEMO.constants().chlorophyllPerNitrogen() * states[j][1]);
                    expected += new LogNormalDistribution(null, scale, theta[PlanktonModel.SIGMA]).logDensity(rows[j][1]);
                }
                // As in PlanktonModelTest: the same terms through other log implementations, a few
                // ulps per term.
                assertEquals(expected, model.logLikelihood(theta, from, to, null), 1e-11 * Math.abs(expected) + 1e-11,
                        "range [" + from + ", " + to + ")");
            }
        }
    }

    @Test
    @DisplayName("a solve up to mid-season costs fewer right-hand-side evaluations than the season's")
    void prefixSolveSavesWork() {
        PlanktonModel model = QuellmarScenario.model(DEMO, QuellmarData.generate(DEMO, 10L), QuellmarScenario.TRUE_GRAZING);
        PlanktonDynamics dynamics = model.dynamics();
        double[] days = model.days();
        double[] y0 = NpzEquations.toIntegrated(DEMO.constants().initialNutrient(),
                DEMO.constants().initialPhytoplankton(), DEMO.constants().initialZooplankton());
        int half = days.length / 2;
        NpzEquations equations = dynamics.equations(DEMO.trueParameters());
        long season = evaluations(equations, y0, days, days.length);
        long prefix = evaluations(equations, y0, days, half);
        assertTrue(prefix < season, "up to observation " + half + ": " + prefix + " evaluations, season " + season);
        assertEquals(0, evaluations(equations, y0, days, 1), "the first observation is on the initial day");
    }

    private static long evaluations(NpzEquations equations, double[] y0, double[] days, int count) {
        long[] counter = {0};
        FirstOrderDifferentialEquations counting = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return equations.getDimension();
            }

            @Override
            public void computeDerivatives(double t, double[] y, double[] yDot) {
                counter[0]++;
                equations.computeDerivatives(t, y, yDot);
            }
        };
        PlanktonDynamics.SOLVER.solve(counting, DEMO.constants().initialDay(), y0, days, count);
        return counter[0];
    }

    @Test
    @DisplayName("a range or a count outside the observations is refused with the bounds")
    void badRangesAreRefused() {
        PlanktonModel model = QuellmarScenario.model(DEMO, QuellmarData.generate(DEMO, 10L), QuellmarScenario.TRUE_GRAZING);
        int n = model.observationCount();
        double[] theta = DEMO.trueParameters();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> model.logLikelihood(theta, 3, n + 1, null));
        assertTrue(e.getMessage().contains("[3, " + (n + 1) + ")") && e.getMessage().contains("[0, " + n + ")"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> model.logLikelihoodTerms(theta, 2, 6, new double[3], null));
        assertTrue(e.getMessage().contains("terms must hold 4 values"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> model.dynamics().integratedStates(theta, n + 1));
        assertTrue(e.getMessage().contains("count must lie in [0, " + n + "]"), e.getMessage());
        assertEquals(0.0, model.logLikelihood(theta, 4, 4, null), "an empty range has likelihood 1");
    }
}
