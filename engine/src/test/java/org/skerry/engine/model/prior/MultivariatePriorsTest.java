package org.skerry.engine.model.prior;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.skerry.engine.model.prior.UnivariateDistributionsTest.assertMessage;

import java.util.SplittableRandom;
import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.GammaDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * {@link IndependentPrior} and {@link MultivariateNormalPrior} against Commons Math 3.6.1:
 * product densities, {@code MultivariateNormalDistribution.density}, and KS tests of draws.
 */
class MultivariatePriorsTest {

    /** Per-test KS level; 6 KS tests in this class, so at most 6e-4 chance of a false alarm. */
    private static final double KS_ALPHA = 1e-4;
    private static final int DRAWS = 20_000;

    private static final double[] MEAN = {1.0, -2.0, 0.5};
    private static final double[][] COVARIANCE = {
        {4.0, 1.2, -0.6},
        {1.2, 2.0, 0.3},
        {-0.6, 0.3, 0.5},
    };

    @Test
    @DisplayName("independent prior: log-density is the sum of Commons Math marginal log-densities")
    void independentLogDensity() {
        IndependentPrior prior = IndependentPrior.of(Normal.of(0, 2), Gamma.of(2, 3), Beta.of(2, 5));
        NormalDistribution n = new NormalDistribution(0, 2);
        GammaDistribution g = new GammaDistribution(2, 1.0 / 3.0);
        BetaDistribution b = new BetaDistribution(2, 5);
        SplittableRandom random = new SplittableRandom(3);
        for (int i = 0; i < 200; i++) {
            double[] x = {random.nextDouble(-5, 5), random.nextDouble(0.01, 3), random.nextDouble(0.01, 0.99)};
            double expected = n.logDensity(x[0]) + g.logDensity(x[1]) + b.logDensity(x[2]);
            assertEquals(expected, prior.logDensity(x), 1e-12 * Math.max(1, Math.abs(expected)));
        }
        assertEquals(Double.NEGATIVE_INFINITY, prior.logDensity(new double[] {0.0, -1.0, 0.5}));
        assertEquals(3, prior.dimension());
    }

    @Test
    @DisplayName("independent prior: each coordinate's draws pass KS against its Commons Math marginal")
    void independentDraws() {
        IndependentPrior prior = IndependentPrior.of(Normal.of(0, 2), Gamma.of(2, 3), Beta.of(2, 5));
        RandomStream random = new RandomStream(11L, StreamPurpose.TESTING, 0, 0);
        double[][] columns = new double[3][DRAWS];
        double[] x = new double[3];
        for (int i = 0; i < DRAWS; i++) {
            prior.sample(random, x);
            for (int k = 0; k < 3; k++) {
                columns[k][i] = x[k];
            }
        }
        KolmogorovSmirnovTest ks = new KolmogorovSmirnovTest();
        assertTrue(ks.kolmogorovSmirnovTest(new NormalDistribution(0, 2), columns[0]) > KS_ALPHA);
        assertTrue(ks.kolmogorovSmirnovTest(new GammaDistribution(2, 1.0 / 3.0), columns[1]) > KS_ALPHA);
        assertTrue(ks.kolmogorovSmirnovTest(new BetaDistribution(2, 5), columns[2]) > KS_ALPHA);
    }

    @Test
    @DisplayName("multivariate normal: log-density equals log of Commons Math MultivariateNormalDistribution.density")
    void multivariateNormalLogDensity() {
        MultivariateNormalPrior prior = MultivariateNormalPrior.of(MEAN, COVARIANCE);
        MultivariateNormalDistribution theirs = new MultivariateNormalDistribution(MEAN, COVARIANCE);
        SplittableRandom random = new SplittableRandom(5);
        for (int i = 0; i < 500; i++) {
            double[] x = {random.nextDouble(-6, 8), random.nextDouble(-8, 4), random.nextDouble(-3, 4)};
            double expected = Math.log(theirs.density(x));
            assertEquals(expected, prior.logDensity(x), 1e-12 * Math.max(1, Math.abs(expected)), "at " + i);
        }
    }

    @Test
    @DisplayName("multivariate normal: 1-D case equals Commons Math NormalDistribution.logDensity")
    void oneDimensional() {
        MultivariateNormalPrior prior = MultivariateNormalPrior.of(new double[] {3.0}, new double[][] {{0.25}});
        NormalDistribution theirs = new NormalDistribution(3.0, 0.5);
        for (int i = 0; i <= 100; i++) {
            double x = 1.0 + 0.04 * i;
            assertEquals(theirs.logDensity(x), prior.logDensity(new double[] {x}), 1e-12);
        }
    }

    @Test
    @DisplayName("multivariate normal draws: projections a'x pass KS against N(a'mu, a'Sigma a) (Commons Math)")
    void multivariateNormalDraws() {
        MultivariateNormalPrior prior = MultivariateNormalPrior.of(MEAN, COVARIANCE);
        double[][] directions = {{1, 0, 0}, {0, 0, 1}, {0.5, -1.0, 2.0}};
        RandomStream random = new RandomStream(13L, StreamPurpose.TESTING, 0, 0);
        double[][] projections = new double[directions.length][DRAWS];
        double[] x = new double[3];
        for (int i = 0; i < DRAWS; i++) {
            prior.sample(random, x);
            for (int a = 0; a < directions.length; a++) {
                projections[a][i] = dot(directions[a], x);
            }
        }
        for (int a = 0; a < directions.length; a++) {
            double[] d = directions[a];
            double variance = 0.0;
            for (int i = 0; i < 3; i++) {
                for (int j = 0; j < 3; j++) {
                    variance += d[i] * COVARIANCE[i][j] * d[j];
                }
            }
            NormalDistribution reference = new NormalDistribution(dot(d, MEAN), Math.sqrt(variance));
            double p = new KolmogorovSmirnovTest().kolmogorovSmirnovTest(reference, projections[a]);
            assertTrue(p > KS_ALPHA, "direction " + a + ": p = " + p);
        }
    }

    private static double dot(double[] a, double[] b) {
        double sum = 0.0;
        for (int i = 0; i < a.length; i++) {
            sum += a[i] * b[i];
        }
        return sum;
    }

    @Test
    @DisplayName("bad mean or covariance is refused with a message naming it")
    void refusals() {
        assertMessage(() -> MultivariateNormalPrior.of(new double[0], new double[0][0]), "mean", "empty");
        assertMessage(() -> MultivariateNormalPrior.of(new double[] {0, Double.NaN}, new double[][] {{1, 0}, {0, 1}}),
                "mean[1]", "NaN");
        assertMessage(() -> MultivariateNormalPrior.of(new double[] {0, 0}, new double[][] {{1, 0}}),
                "covariance", "1 rows");
        assertMessage(() -> MultivariateNormalPrior.of(new double[] {0, 0}, new double[][] {{1, 0.5}, {0.4, 1}}),
                "symmetric", "0.4");
        assertMessage(() -> MultivariateNormalPrior.of(new double[] {0, 0}, new double[][] {{1, 2}, {2, 1}}),
                "positive definite", "pivot 1");
        assertMessage(() -> IndependentPrior.of(), "marginals", "empty");
        assertMessage(() -> IndependentPrior.iid(Normal.of(0, 1), 0), "dimension", "0");
    }
}
