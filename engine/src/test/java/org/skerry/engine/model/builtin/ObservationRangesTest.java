package org.skerry.engine.model.builtin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.util.CombinatoricsUtils;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.reference.LinearRegressionExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * The built-in models' likelihoods of observation ranges: the whole range against the full
 * likelihood bit for bit (the {@link ObservationLikelihood} contract), ranges against closed-form
 * Gaussian log-densities computed independently ({@link NormalMeanExact},
 * {@link LinearRegressionExact}: Cholesky through Commons Math 3.6.1) and against Commons Math's
 * binomial log-probabilities, additivity over random splits, and single terms against single
 * ranges bit for bit.
 *
 * <p>Rounding bound: recursive summation of N numbers errs by at most {@code (N − 1)·u·Σ|xᵢ|}
 * (Higham, Accuracy and Stability of Numerical Algorithms, 2nd ed. (2002), §4.2, eq. 4.4, u =
 * 2⁻⁵³). Two routes to one value (per-observation sums, sufficient statistics, a QR
 * factorisation, a Cholesky solve) are compared within {@code 16·(N + 1)·u} times the sum of the
 * magnitudes of the intermediate quantities: the factor 16 covers the rounding inside each term
 * and the two routes, a safety margin of common practice, fixed before looking at the errors.
 */
class ObservationRangesTest {

    private static final double UNIT_ROUNDOFF = 0x1p-53;

    private static double bound(int count, double magnitude) {
        return 16.0 * (count + 1) * UNIT_ROUNDOFF * magnitude;
    }

    /** Random cut points 0 = c₀ < … < c_m = n, with empty pieces allowed. */
    private static int[] randomCuts(SplittableRandom random, int n) {
        int pieces = 1 + random.nextInt(6);
        int[] cuts = new int[pieces + 1];
        for (int i = 1; i < pieces; i++) {
            cuts[i] = random.nextInt(n + 1);
        }
        cuts[pieces] = n;
        Arrays.sort(cuts);
        return cuts;
    }

    private static void assertTermsMatchSingleRanges(ObservationLikelihood model, double[] theta) {
        int n = model.observationCount();
        double[] terms = new double[n];
        model.logLikelihoodTerms(theta, 0, n, terms, null);
        for (int j = 0; j < n; j++) {
            assertEquals(Double.doubleToRawLongBits(model.logLikelihood(theta, j, j + 1, null)),
                    Double.doubleToRawLongBits(terms[j]), "term " + j + " against range [" + j + ", " + (j + 1) + ")");
        }
        double[] window = new double[3];
        model.logLikelihoodTerms(theta, n - 3, n, window, null);
        assertEquals(Arrays.toString(Arrays.copyOfRange(terms, n - 3, n)), Arrays.toString(window),
                "terms of a window at the end");
    }

    // ---- normal mean --------------------------------------------------------------------------

    /** Per-row magnitude of the intermediate quantities: d·|log σ√(2π)| + Σₖ(|y| + |μ|)²/(2σ²). */
    private static double normalMeanMagnitude(double[][] rows, int from, int to, double[] mu, double sigma) {
        double sum = 0.0;
        for (int j = from; j < to; j++) {
            sum += rows[j].length * Math.abs(Math.log(sigma) + 0.5 * Math.log(2.0 * Math.PI));
            for (int k = 0; k < mu.length; k++) {
                double a = Math.abs(rows[j][k]) + Math.abs(mu[k]);
                sum += a * a / (2.0 * sigma * sigma);
            }
        }
        return sum;
    }

    @Test
    @DisplayName("normal mean: ranges equal NormalMeanExact's Gaussian log-densities; [0, n) is the full likelihood bit for bit")
    void normalMeanRanges() {
        SplittableRandom random = new SplittableRandom(101);
        for (int d : new int[] {1, 3}) {
            double sigma = d == 1 ? 0.7 : 2.0;
            double[] truth = new double[d];
            Arrays.fill(truth, 1.5);
            double[][] rows = SyntheticData.normalRows(30L + d, 23, truth, sigma);
            int n = rows.length;
            NormalMeanModel model = NormalMeanModel.of(rows, sigma, 0.0, 10.0);
            NormalMeanExact exact = new NormalMeanExact(rows, sigma, 0.0, 10.0);
            assertEquals(n, model.observationCount());
            for (double[] mu : SyntheticData.uniformPoints(40L + d, 50, d, -2.0, 5.0)) {
                assertEquals(Double.doubleToRawLongBits(model.logLikelihood(mu, null)),
                        Double.doubleToRawLongBits(model.logLikelihood(mu, 0, n, null)), "whole range, d=" + d);
                for (int trial = 0; trial < 5; trial++) {
                    int from = random.nextInt(n);
                    int to = from + 1 + random.nextInt(n - from);
                    double magnitude = normalMeanMagnitude(rows, from, to, mu, sigma);
                    assertEquals(exact.logLikelihood(mu, from, to), model.logLikelihood(mu, from, to, null),
                            bound((to - from) * d, magnitude), "range [" + from + ", " + to + "), d=" + d);
                }
                int[] cuts = randomCuts(random, n);
                double pieces = 0.0;
                for (int i = 0; i + 1 < cuts.length; i++) {
                    pieces += model.logLikelihood(mu, cuts[i], cuts[i + 1], null);
                }
                assertEquals(model.logLikelihood(mu, null), pieces,
                        bound(n * d, normalMeanMagnitude(rows, 0, n, mu, sigma)), "split " + Arrays.toString(cuts));
                assertTermsMatchSingleRanges(model, mu);
            }
        }
    }

    // ---- linear regression --------------------------------------------------------------------

    /** Per-row magnitude: |log σ√(2π)| + (|yᵢ| + Σⱼ|xᵢⱼwⱼ|)²/(2σ²). */
    private static double regressionMagnitude(double[][] x, double[] y, int from, int to, double[] w, double sigma) {
        double sum = 0.0;
        for (int i = from; i < to; i++) {
            double a = Math.abs(y[i]);
            for (int j = 0; j < w.length; j++) {
                a += Math.abs(x[i][j] * w[j]);
            }
            sum += Math.abs(Math.log(sigma) + 0.5 * Math.log(2.0 * Math.PI)) + a * a / (2.0 * sigma * sigma);
        }
        return sum;
    }

    @Test
    @DisplayName("linear regression: ranges equal LinearRegressionExact's Gaussian log-densities; [0, n) is the full likelihood bit for bit")
    void linearRegressionRanges() {
        SplittableRandom random = new SplittableRandom(202);
        double sigma = 0.5;
        double[] weights = {0.5, -1.0, 2.0};
        double[][] x = SyntheticData.design(50L, 31, 3, -2.0, 2.0, true);
        double[] y = SyntheticData.regressionResponse(51L, x, weights, sigma);
        // A rank-deficient design (third column twice the second) takes the model's direct path.
        double[][] deficient = new double[x.length][];
        for (int i = 0; i < x.length; i++) {
            deficient[i] = new double[] {1.0, x[i][1], 2.0 * x[i][1]};
        }
        double[][] identity = {{4.0, 0.0, 0.0}, {0.0, 4.0, 0.0}, {0.0, 0.0, 4.0}};
        for (double[][] design : List.of(x, deficient)) {
            int n = design.length;
            LinearRegressionModel model = LinearRegressionModel.of(design, y, sigma,
                    MultivariateNormalPrior.of(new double[3], identity), List.of("a", "b", "c"));
            LinearRegressionExact exact = new LinearRegressionExact(design, y, sigma, new double[3], identity);
            assertEquals(n, model.observationCount());
            for (double[] w : SyntheticData.uniformPoints(52L, 50, 3, -3.0, 3.0)) {
                assertEquals(Double.doubleToRawLongBits(model.logLikelihood(w, null)),
                        Double.doubleToRawLongBits(model.logLikelihood(w, 0, n, null)), "whole range");
                for (int trial = 0; trial < 5; trial++) {
                    int from = random.nextInt(n);
                    int to = from + 1 + random.nextInt(n - from);
                    assertEquals(exact.logLikelihood(w, from, to), model.logLikelihood(w, from, to, null),
                            bound(3 * (to - from), regressionMagnitude(design, y, from, to, w, sigma)),
                            "range [" + from + ", " + to + ")");
                }
                assertEquals(exact.logLikelihood(w, 0, n), model.logLikelihood(w, null),
                        bound(3 * n, regressionMagnitude(design, y, 0, n, w, sigma)), "full likelihood");
                int[] cuts = randomCuts(random, n);
                double pieces = 0.0;
                for (int i = 0; i + 1 < cuts.length; i++) {
                    pieces += model.logLikelihood(w, cuts[i], cuts[i + 1], null);
                }
                assertEquals(model.logLikelihood(w, null), pieces,
                        bound(3 * n, regressionMagnitude(design, y, 0, n, w, sigma)), "split " + Arrays.toString(cuts));
                assertTermsMatchSingleRanges(model, w);
            }
        }
    }

    // ---- beta-binomial ------------------------------------------------------------------------

    /** Per-count magnitude: log C(n, k) + k·|log p| + (n − k)·|log(1 − p)|. */
    private static double binomialMagnitude(int[] trials, int[] successes, int from, int to, double p) {
        double sum = 0.0;
        for (int i = from; i < to; i++) {
            sum += CombinatoricsUtils.binomialCoefficientLog(trials[i], successes[i])
                    + successes[i] * Math.abs(Math.log(p)) + (trials[i] - successes[i]) * Math.abs(Math.log1p(-p));
        }
        return sum;
    }

    @Test
    @DisplayName("beta-binomial: ranges equal sums of Commons Math binomial log-probabilities; [0, n) is the full likelihood bit for bit")
    void betaBinomialRanges() {
        SplittableRandom random = new SplittableRandom(303);
        int n = 17;
        int[] trials = new int[n];
        int[] successes = new int[n];
        for (int i = 0; i < n; i++) {
            trials[i] = 1 + random.nextInt(40);
            successes[i] = SyntheticData.binomial(60L + i, trials[i], 0.3);
        }
        BetaBinomialModel model = BetaBinomialModel.of(successes, trials, 2.0, 3.0);
        assertEquals(n, model.observationCount());
        for (int point = 0; point < 100; point++) {
            double[] p = {random.nextDouble(0.01, 0.99)};
            assertEquals(Double.doubleToRawLongBits(model.logLikelihood(p, null)),
                    Double.doubleToRawLongBits(model.logLikelihood(p, 0, n, null)), "whole range at p=" + p[0]);
            int from = random.nextInt(n);
            int to = from + 1 + random.nextInt(n - from);
            double expected = 0.0;
            for (int i = from; i < to; i++) {
                expected += new BinomialDistribution(null, trials[i], p[0]).logProbability(successes[i]);
            }
            assertEquals(expected, model.logLikelihood(p, from, to, null),
                    bound(to - from, binomialMagnitude(trials, successes, from, to, p[0])),
                    "range [" + from + ", " + to + ") at p=" + p[0]);
            int[] cuts = randomCuts(random, n);
            double pieces = 0.0;
            for (int i = 0; i + 1 < cuts.length; i++) {
                pieces += model.logLikelihood(p, cuts[i], cuts[i + 1], null);
            }
            assertEquals(model.logLikelihood(p, null), pieces,
                    bound(n, binomialMagnitude(trials, successes, 0, n, p[0])), "split " + Arrays.toString(cuts));
            assertTermsMatchSingleRanges(model, p);
        }
        double[] outside = {1.0};
        assertEquals(Double.NEGATIVE_INFINITY, model.logLikelihood(outside, 2, 5, null), "p outside (0, 1)");
        assertEquals(0.0, model.logLikelihood(outside, 5, 5, null), "an empty range has likelihood 1");
        assertTrue(model.logLikelihood(new double[] {0.3}, 0, 1, null) < 0.0);
    }
}
