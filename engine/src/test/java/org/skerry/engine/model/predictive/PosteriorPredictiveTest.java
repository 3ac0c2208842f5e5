package org.skerry.engine.model.predictive;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.apache.commons.math3.stat.descriptive.rank.Percentile;
import org.apache.commons.math3.stat.descriptive.rank.Percentile.EstimationType;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.builtin.BetaBinomialModel;
import org.skerry.engine.model.builtin.GaussianShellsModel;
import org.skerry.engine.model.builtin.LinearRegressionModel;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.reference.LinearRegressionExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * The posterior predictive summary against closed-form predictive distributions, from exact or
 * importance-weighted posterior draws (made with {@link SplittableRandom} and Commons Math, not
 * the engine's generator), replicated over {@link #SEEDS} seeds: each check allows four standard
 * errors of the replicated mean. Also its determinism, its definitions and its refusals.
 */
class PosteriorPredictiveTest {

    private static final int SEEDS = 24;
    private static final int PARTICLES = 2000;
    private static final int DRAWS = PosteriorPredictive.DEFAULT_DRAWS;

    private static long seed(int s) {
        return 4100 + 7919L * s;
    }

    /** Four standard errors of the replicated mean of {@code stats}. */
    private static void assertWithin(double expected, SummaryStatistics stats, String what) {
        double error = stats.getStandardDeviation() / StrictMath.sqrt(stats.getN());
        assertTrue(StrictMath.abs(stats.getMean() - expected) <= 4 * error, what + ": replicated mean "
                + stats.getMean() + " ± " + error + " (1 s.e., " + stats.getN() + " seeds), expected " + expected);
    }

    // Normal mean: y ~ N(μ, σ²), μ ~ N(0, 2²), six observations.
    private static final double SIGMA = 1.0;
    private static final double[][] NORMAL_ROWS = SyntheticData.normalRows(31, 6, new double[] {0.7}, SIGMA);
    private static final NormalMeanModel NORMAL = NormalMeanModel.of(NORMAL_ROWS, SIGMA, 0.0, 2.0);
    private static final NormalMeanExact NORMAL_EXACT = new NormalMeanExact(NORMAL_ROWS, SIGMA, 0.0, 2.0);

    /**
     * Particles from a proposal twice as wide as the exact posterior, weighted by posterior over
     * proposal density and normalised: the weighted path, as a sampler's final population has it.
     */
    private static double[][] weightedNormalParticles(long seed) {
        double m = NORMAL_EXACT.posteriorMean(0);
        double s = StrictMath.sqrt(NORMAL_EXACT.posteriorVariance());
        NormalDistribution posterior = new NormalDistribution(m, s);
        NormalDistribution proposal = new NormalDistribution(m, 2 * s);
        SplittableRandom random = new SplittableRandom(seed);
        double[] values = new double[PARTICLES];
        double[] weights = new double[PARTICLES];
        double total = 0;
        for (int i = 0; i < PARTICLES; i++) {
            values[i] = m + 2 * s * random.nextGaussian();
            weights[i] = StrictMath.exp(posterior.logDensity(values[i]) - proposal.logDensity(values[i]));
            total += weights[i];
        }
        for (int i = 0; i < PARTICLES; i++) {
            weights[i] /= total;
        }
        return new double[][] {values, weights};
    }

    @Test
    @DisplayName("normal mean: predictive mean, sd, median and 95 % ends are those of N(μ_n, σ² + τ_n²) (BDA3 §2.5)")
    void normalMean() {
        // Gelman et al., Bayesian Data Analysis, 3rd ed., §2.5: the posterior predictive of a new
        // observation is N(μ_n, σ² + τ_n²); quantiles from Commons Math's NormalDistribution.
        double m = NORMAL_EXACT.posteriorMean(0);
        double sd = StrictMath.sqrt(SIGMA * SIGMA + NORMAL_EXACT.posteriorVariance());
        NormalDistribution predictive = new NormalDistribution(m, sd);
        SummaryStatistics mean = new SummaryStatistics();
        SummaryStatistics spread = new SummaryStatistics();
        SummaryStatistics[] quantiles = new SummaryStatistics[5];
        for (int q = 0; q < 5; q++) {
            quantiles[q] = new SummaryStatistics();
        }
        for (int s = 0; s < SEEDS; s++) {
            double[][] particles = weightedNormalParticles(seed(s));
            PredictiveSummary summary = PosteriorPredictive.summarise(NORMAL, particles[0], PARTICLES, particles[1],
                    DRAWS, seed(s));
            // Every value has the same predictive; their average is one estimate per seed.
            mean.addValue(average(summary.mean()));
            spread.addValue(average(summary.sd()));
            for (int q = 0; q < 5; q++) {
                quantiles[q].addValue(average(summary.quantile(q)));
            }
        }
        assertWithin(m, mean, "predictive mean");
        assertWithin(sd, spread, "predictive sd");
        for (int q = 0; q < 5; q++) {
            double p = PredictiveSummary.PROBABILITIES.get(q);
            assertWithin(predictive.inverseCumulativeProbability(p), quantiles[q], "predictive quantile " + p);
        }
    }

    @Test
    @DisplayName("linear regression: predictive mean x·m_N and variance σ² + xᵀS_N x per row (PRML eqs. 3.58–3.59)")
    void linearRegression() {
        double[][] x = SyntheticData.design(5, 8, 2, -2.0, 2.0, true);
        double sigma = 0.5;
        double[] y = SyntheticData.regressionResponse(6, x, new double[] {0.4, -1.1}, sigma);
        double[][] s0 = {{4.0, 0.0}, {0.0, 4.0}};
        LinearRegressionModel model = LinearRegressionModel.of(x, y, sigma,
                MultivariateNormalPrior.of(new double[] {0.0, 0.0}, s0), List.of("w0", "w1"));
        LinearRegressionExact exact = new LinearRegressionExact(x, y, sigma, new double[] {0.0, 0.0}, s0);
        double[] mN = exact.posteriorMean();
        double[][] sN = exact.posteriorCovariance();
        RealMatrix root = new CholeskyDecomposition(new Array2DRowRealMatrix(sN)).getL();
        SummaryStatistics[] mean = statistics(x.length);
        SummaryStatistics[] spread = statistics(x.length);
        double[] equal = new double[PARTICLES];
        java.util.Arrays.fill(equal, 1.0 / PARTICLES);
        for (int s = 0; s < SEEDS; s++) {
            // Exact posterior draws m_N + L·z with S_N = L·Lᵀ.
            SplittableRandom random = new SplittableRandom(seed(s));
            double[] values = new double[2 * PARTICLES];
            for (int i = 0; i < PARTICLES; i++) {
                double z0 = random.nextGaussian();
                double z1 = random.nextGaussian();
                values[2 * i] = mN[0] + root.getEntry(0, 0) * z0;
                values[2 * i + 1] = mN[1] + root.getEntry(1, 0) * z0 + root.getEntry(1, 1) * z1;
            }
            PredictiveSummary summary = PosteriorPredictive.summarise(model, values, PARTICLES, equal, DRAWS, seed(s));
            for (int i = 0; i < x.length; i++) {
                mean[i].addValue(summary.mean()[i]);
                spread[i].addValue(summary.sd()[i]);
            }
        }
        for (int i = 0; i < x.length; i++) {
            // Bishop, Pattern Recognition and Machine Learning (2006), eqs. 3.58–3.59.
            double expectedMean = x[i][0] * mN[0] + x[i][1] * mN[1];
            double quadratic = 0;
            for (int a = 0; a < 2; a++) {
                for (int b = 0; b < 2; b++) {
                    quadratic += x[i][a] * sN[a][b] * x[i][b];
                }
            }
            assertWithin(expectedMean, mean[i], "row " + i + " predictive mean");
            assertWithin(StrictMath.sqrt(sigma * sigma + quadratic), spread[i], "row " + i + " predictive sd");
        }
    }

    @Test
    @DisplayName("Beta–Binomial: predictive counts have the beta-binomial mean n·α/(α+β) and variance")
    void betaBinomial() {
        int[] k = {3, 7, 1, 12};
        int[] n = {10, 20, 5, 30};
        BetaBinomialModel model = BetaBinomialModel.of(k, n, 2.0, 3.0);
        double alpha = 2.0 + 23;
        double beta = 3.0 + 65 - 23;
        BetaDistribution posterior = new BetaDistribution(alpha, beta);
        SummaryStatistics[] mean = statistics(k.length);
        SummaryStatistics[] spread = statistics(k.length);
        double[] equal = new double[PARTICLES];
        java.util.Arrays.fill(equal, 1.0 / PARTICLES);
        for (int s = 0; s < SEEDS; s++) {
            SplittableRandom random = new SplittableRandom(seed(s));
            double[] values = new double[PARTICLES];
            for (int i = 0; i < PARTICLES; i++) {
                values[i] = posterior.inverseCumulativeProbability(random.nextDouble());
            }
            PredictiveSummary summary = PosteriorPredictive.summarise(model, values, PARTICLES, equal, DRAWS, seed(s));
            for (int i = 0; i < k.length; i++) {
                mean[i].addValue(summary.mean()[i]);
                spread[i].addValue(summary.sd()[i]);
            }
        }
        double ep = posterior.getNumericalMean();
        double vp = posterior.getNumericalVariance();
        for (int i = 0; i < k.length; i++) {
            // Beta-binomial moments (Johnson, Kemp & Kotz, Univariate Discrete Distributions,
            // 3rd ed. (2005), §6.7.2; from memory): mean nα/(α+β), variance
            // nαβ(α+β+n)/((α+β)²(α+β+1)); checked against the law of total variance with Commons
            // Math's Beta moments, n·E[p(1−p)] + n²·Var p.
            double closedVariance = n[i] * alpha * beta * (alpha + beta + n[i])
                    / ((alpha + beta) * (alpha + beta) * (alpha + beta + 1));
            double totalVariance = n[i] * (ep - vp - ep * ep) + (double) n[i] * n[i] * vp;
            assertEquals(closedVariance, totalVariance, 1e-12 * closedVariance, "reference variance, row " + i);
            assertWithin(n[i] * alpha / (alpha + beta), mean[i], "row " + i + " predictive mean");
            assertWithin(StrictMath.sqrt(closedVariance), spread[i], "row " + i + " predictive sd");
        }
    }

    @Test
    @DisplayName("same particles, weights and seed give the same summary bit for bit; another seed another")
    void deterministic() {
        double[][] particles = weightedNormalParticles(77);
        long[] index = new long[PARTICLES];
        FinalParticles finals = new FinalParticles(1, PARTICLES, particles[0], new double[PARTICLES],
                new double[PARTICLES], new double[PARTICLES], index, index);
        PredictiveSummary first = PosteriorPredictive.summarise(NORMAL, finals, particles[1], DRAWS, 5);
        PredictiveSummary again = PosteriorPredictive.summarise(NORMAL, particles[0].clone(), PARTICLES,
                particles[1].clone(), DRAWS, 5);
        PredictiveSummary other = PosteriorPredictive.summarise(NORMAL, finals, particles[1], DRAWS, 6);
        assertArrayEquals(first.mean(), again.mean(), 0.0);
        assertArrayEquals(first.sd(), again.sd(), 0.0);
        for (int q = 0; q < 5; q++) {
            assertArrayEquals(first.quantile(q), again.quantile(q), 0.0);
        }
        assertArrayEquals(first.residuals(), again.residuals(), 0.0);
        assertFalse(java.util.Arrays.equals(first.mean(), other.mean()));
    }

    @Test
    @DisplayName("each model's replicate from a stream at one address is the same bits every time")
    void replicatesRepeat() {
        List<PredictiveModel> models = List.of(NORMAL,
                NormalMeanModel.of(SyntheticData.normalRows(3, 4, new double[] {0.0, 1.0, 2.0}, 1.0), 1.0, 0.0, 1.0),
                BetaBinomialModel.of(new int[] {3, 0, 400}, new int[] {10, 0, 1000}, 1.0, 1.0));
        List<double[]> at = List.of(new double[] {0.3}, new double[] {0.1, 0.2, 0.3}, new double[] {0.4});
        for (int m = 0; m < models.size(); m++) {
            PredictiveModel model = models.get(m);
            double[] first = new double[model.observedCount()];
            double[] second = new double[model.observedCount()];
            model.replicate(at.get(m), new RandomStream(9, StreamPurpose.PREDICTIVE, 0, 3), first);
            model.replicate(at.get(m), new RandomStream(9, StreamPurpose.PREDICTIVE, 0, 3), second);
            assertArrayEquals(first, second, 0.0, model.toString());
            model.replicate(at.get(m), new RandomStream(9, StreamPurpose.PREDICTIVE, 0, 4), second);
            assertFalse(java.util.Arrays.equals(first, second), model.toString());
        }
    }

    @Test
    @DisplayName("quantiles are Hyndman & Fan's definition 7, as Commons Math's Percentile R_7 computes them")
    void quantileDefinition() {
        SplittableRandom random = new SplittableRandom(8);
        for (int size : new int[] {2, 3, 10, 401}) {
            double[] sorted = new double[size];
            for (int i = 0; i < size; i++) {
                sorted[i] = random.nextGaussian();
            }
            java.util.Arrays.sort(sorted);
            Percentile reference = new Percentile().withEstimationType(EstimationType.R_7);
            for (double p : PredictiveSummary.PROBABILITIES) {
                assertEquals(reference.evaluate(sorted, 100 * p), PosteriorPredictive.quantile(sorted, p), 1e-12,
                        "p = " + p + ", " + size + " values");
            }
        }
    }

    @Test
    @DisplayName("residuals are (observed − mean)/sd; NaN where every replicate is equal (zero trials)")
    void residuals() {
        BetaBinomialModel model = BetaBinomialModel.of(new int[] {3, 0}, new int[] {10, 0}, 1.0, 1.0);
        double[] values = {0.2, 0.5, 0.7};
        PredictiveSummary summary = PosteriorPredictive.summarise(model, values, 3, new double[] {0.2, 0.3, 0.5},
                50, 1);
        assertEquals((3 - summary.mean()[0]) / summary.sd()[0], summary.residuals()[0], 0.0);
        assertEquals(0.0, summary.sd()[1]);
        assertTrue(Double.isNaN(summary.residuals()[1]));
        assertArrayEquals(new double[] {3, 0}, summary.observed(), 0.0);
        assertArrayEquals(new double[] {0, 1}, summary.positions(), 0.0);
        assertEquals(Quantity.ROW, summary.positionQuantity());
        assertEquals(50, summary.draws());
    }

    @Test
    @DisplayName("a model without the capability is refused with a message naming it")
    void refusesModelWithout() {
        GaussianShellsModel shells = GaussianShellsModel.of(2, 2.0, 0.1, 3.5, 6.0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> PredictiveModel.of(shells));
        assertTrue(e.getMessage().contains(shells.toString()), e.getMessage());
        assertTrue(e.getMessage().contains(GaussianShellsModel.class.getName()), e.getMessage());
        assertTrue(e.getMessage().contains(PredictiveModel.class.getName()), e.getMessage());
        assertEquals(NORMAL, PredictiveModel.of(NORMAL));
    }

    @Test
    @DisplayName("bad arguments are refused with messages naming them")
    void refusesBadArguments() {
        double[] values = {0.1, 0.2};
        double[] weights = {0.5, 0.5};
        assertMessage(() -> PosteriorPredictive.summarise(NORMAL, values, 2, weights, 1, 1), "draws");
        assertMessage(() -> PosteriorPredictive.summarise(NORMAL, values, 3, weights, 10, 1), "values");
        assertMessage(() -> PosteriorPredictive.summarise(NORMAL, values, 2, new double[] {0.5, Double.NaN}, 10, 1),
                "weights[1]");
        assertMessage(() -> PosteriorPredictive.summarise(NORMAL, values, 2, new double[] {0, 0}, 10, 1), "weights");
        assertMessage(() -> PosteriorPredictive.summarise(null, values, 2, weights, 10, 1), "model");
        assertMessage(() -> NORMAL.replicate(new double[] {0}, new RandomStream(1, StreamPurpose.PREDICTIVE, 0, 0),
                new double[2]), "out");
    }

    private static void assertMessage(org.junit.jupiter.api.function.Executable call, String part) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, call);
        assertTrue(e.getMessage().contains(part), e.getMessage());
    }

    private static SummaryStatistics[] statistics(int count) {
        SummaryStatistics[] out = new SummaryStatistics[count];
        for (int i = 0; i < count; i++) {
            out[i] = new SummaryStatistics();
        }
        return out;
    }

    private static double average(double[] values) {
        double sum = 0;
        for (double v : values) {
            sum += v;
        }
        return sum / values.length;
    }
}
