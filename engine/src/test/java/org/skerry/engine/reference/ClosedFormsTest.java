package org.skerry.engine.reference;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The closed forms checked by an independent route: numerical integration of prior × likelihood
 * built from Commons Math densities (Legendre–Gauss integrators), direct summation, and a second
 * algebraic form of the same evidence.
 */
class ClosedFormsTest {

    private static double logNormalProduct(double[] y, double mean, double sd) {
        // A null generator: these distributions are only evaluated, and seeding one is slow.
        NormalDistribution n = new NormalDistribution(null, mean, sd);
        double sum = 0.0;
        for (double v : y) {
            sum += n.logDensity(v);
        }
        return sum;
    }

    @Test
    @DisplayName("truncated normal: mass, mean and sd equal numerical integrals of Commons Math's normal density")
    void truncatedNormal() {
        NormalDistribution n = new NormalDistribution(null, 1.3, 0.4);
        double[][] intervals = {{Double.NEGATIVE_INFINITY, 1.5}, {1.1, Double.POSITIVE_INFINITY}, {0.9, 1.6}};
        for (double[] ab : intervals) {
            TruncatedNormalExact exact = new TruncatedNormalExact(1.3, 0.4, ab[0], ab[1]);
            double low = Math.max(ab[0], 1.3 - 15 * 0.4);
            double high = Math.min(ab[1], 1.3 + 15 * 0.4);
            double mass = Quadrature.integrate(n::density, low, high, 1e-12);
            double mean = Quadrature.integrate(x -> x * n.density(x), low, high, 1e-12) / mass;
            double variance = Quadrature.integrate(x -> (x - mean) * (x - mean) * n.density(x), low, high, 1e-12) / mass;
            assertEquals(mass, exact.mass(), 1e-9);
            assertEquals(mean, exact.mean(), 1e-9);
            assertEquals(Math.sqrt(variance), exact.sd(), 1e-9);
        }
    }

    @Test
    @DisplayName("normal mean, 1-D: evidence and posterior moments equal numerical integrals (BDA3 §2.5, PRML eq. 2.115)")
    void normalMeanOneDimension() {
        double sigma = 1.5;
        double mu0 = 1.0;
        double tau = 3.0;
        double[][] rows = SyntheticData.normalRows(1L, 20, new double[] {2.2}, sigma);
        double[] y = SyntheticData.column(rows, 0);
        NormalMeanExact exact = new NormalMeanExact(rows, sigma, mu0, tau);
        NormalDistribution prior = new NormalDistribution(mu0, tau);
        double centre = exact.posteriorMean(0);
        double sd = Math.sqrt(exact.posteriorVariance());
        double shift = prior.logDensity(centre) + logNormalProduct(y, centre, sigma);
        java.util.function.DoubleUnaryOperator f =
                mu -> Math.exp(prior.logDensity(mu) + logNormalProduct(y, mu, sigma) - shift);
        double z = Quadrature.integrate(f, centre - 15 * sd, centre + 15 * sd, 1e-12);
        assertEquals(exact.logEvidence(), shift + Math.log(z), 1e-9);
        double m1 = Quadrature.integrate(mu -> mu * f.applyAsDouble(mu), centre - 15 * sd, centre + 15 * sd, 1e-12) / z;
        double m2 = Quadrature.integrate(mu -> (mu - m1) * (mu - m1) * f.applyAsDouble(mu),
                centre - 15 * sd, centre + 15 * sd, 1e-12) / z;
        assertEquals(exact.posteriorMean(0), m1, 1e-9);
        assertEquals(exact.posteriorVariance(), m2, 1e-9 * exact.posteriorVariance());
    }

    @Test
    @DisplayName("normal mean, 2-D: the summed per-coordinate evidence equals a nested 2-D integral")
    void normalMeanTwoDimensions() {
        double sigma = 0.8;
        double mu0 = -0.5;
        double tau = 2.0;
        double[][] rows = SyntheticData.normalRows(2L, 8, new double[] {1.0, -1.5}, sigma);
        double[] y1 = SyntheticData.column(rows, 0);
        double[] y2 = SyntheticData.column(rows, 1);
        NormalMeanExact exact = new NormalMeanExact(rows, sigma, mu0, tau);
        NormalDistribution prior = new NormalDistribution(mu0, tau);
        double c1 = exact.posteriorMean(0);
        double c2 = exact.posteriorMean(1);
        double sd = Math.sqrt(exact.posteriorVariance());
        double shift = prior.logDensity(c1) + prior.logDensity(c2)
                + logNormalProduct(y1, c1, sigma) + logNormalProduct(y2, c2, sigma);
        double z = Quadrature.integrate((a, b) -> Math.exp(prior.logDensity(a) + prior.logDensity(b)
                + logNormalProduct(y1, a, sigma) + logNormalProduct(y2, b, sigma) - shift),
                c1 - 12 * sd, c1 + 12 * sd, c2 - 12 * sd, c2 + 12 * sd, 1e-11);
        assertEquals(exact.logEvidence(), shift + Math.log(z), 1e-8);
    }

    @Test
    @DisplayName("linear regression: evidence and posterior mean equal a nested 2-D integral (PRML eqs. 3.49-3.51, 3.86)")
    void linearRegressionIntegral() {
        double sigma = 0.7;
        double[][] x = SyntheticData.design(3L, 15, 2, -2, 2, true);
        double[] y = SyntheticData.regressionResponse(4L, x, new double[] {0.5, -1.2}, sigma);
        double[] m0 = {0.2, 0.0};
        double[][] s0 = {{4.0, 0.5}, {0.5, 1.0}};
        LinearRegressionExact exact = new LinearRegressionExact(x, y, sigma, m0, s0);
        double[] mN = exact.posteriorMean();
        double[][] sN = exact.posteriorCovariance();
        MultivariateNormalDistribution prior = new MultivariateNormalDistribution(null, m0, s0);
        java.util.function.DoubleBinaryOperator logJoint = (a, b) -> {
            double lp = Math.log(prior.density(new double[] {a, b}));
            double ll = 0.0;
            for (int i = 0; i < y.length; i++) {
                ll += new NormalDistribution(null, x[i][0] * a + x[i][1] * b, sigma).logDensity(y[i]);
            }
            return lp + ll;
        };
        double shift = logJoint.applyAsDouble(mN[0], mN[1]);
        double r0 = 12 * Math.sqrt(sN[0][0]);
        double r1 = 12 * Math.sqrt(sN[1][1]);
        double z = Quadrature.integrate((a, b) -> Math.exp(logJoint.applyAsDouble(a, b) - shift),
                mN[0] - r0, mN[0] + r0, mN[1] - r1, mN[1] + r1, 1e-10);
        assertEquals(exact.logEvidence(), shift + Math.log(z), 1e-8);
        double mean0 = Quadrature.integrate((a, b) -> a * Math.exp(logJoint.applyAsDouble(a, b) - shift),
                mN[0] - r0, mN[0] + r0, mN[1] - r1, mN[1] + r1, 1e-10) / z;
        assertEquals(mN[0], mean0, 1e-7);
    }

    @Test
    @DisplayName("linear regression: N(y; X m0, sigma^2 I + X S0 X') equals Bishop's eq. 3.86 for S0 = I/alpha")
    void linearRegressionBishopForm() {
        double sigma = 0.3;
        double alpha = 0.25;
        double[][] x = SyntheticData.design(5L, 40, 3, -1, 3, true);
        double[] y = SyntheticData.regressionResponse(6L, x, new double[] {1.0, 0.5, -0.25}, sigma);
        double[][] s0 = {{1 / alpha, 0, 0}, {0, 1 / alpha, 0}, {0, 0, 1 / alpha}};
        LinearRegressionExact exact = new LinearRegressionExact(x, y, sigma, new double[3], s0);
        assertEquals(LinearRegressionExact.logEvidenceIsotropic(x, y, sigma, alpha), exact.logEvidence(), 1e-9);
    }

    @Test
    @DisplayName("beta-binomial: evidence summed over k = 0..n is 1, and equals the integral of Beta x Binomial (BDA3 §2.4)")
    void betaBinomial() {
        double total = 0.0;
        for (int k = 0; k <= 30; k++) {
            total += Math.exp(new BetaBinomialExact(k, 30, 2.5, 0.7).logEvidence());
        }
        assertEquals(1.0, total, 1e-12);

        BetaDistribution prior = new BetaDistribution(2.0, 3.0);
        BinomialDistribution b1 = new BinomialDistribution(20, 0.5);
        double z = Quadrature.integrate(p -> prior.density(p) * new BinomialDistribution(null, 20, p).probability(7)
                * new BinomialDistribution(null, 12, p).probability(5), 0, 1, 1e-12);
        BetaBinomialExact exact = new BetaBinomialExact(new int[] {7, 5}, new int[] {20, 12}, 2.0, 3.0);
        assertEquals(exact.logEvidence(), Math.log(z), 1e-10);
        assertEquals(20, b1.getNumberOfTrials());

        double q = exact.posteriorQuantile(0.9);
        double below = Quadrature.integrate(p -> prior.density(p) * new BinomialDistribution(null, 20, p).probability(7)
                * new BinomialDistribution(null, 12, p).probability(5), 0, q, 1e-12) / z;
        assertEquals(0.9, below, 1e-9);
        assertEquals((2.0 + 12) / (5.0 + 32), exact.posteriorMean(), 1e-15);
    }

    @Test
    @DisplayName("Gaussian shells: the radial-integral evidence matches Feroz et al. 2009 to their 2 decimals (quoted from memory)")
    void gaussianShellsPublished() {
        for (int d : new int[] {2, 5, 10}) {
            double logZ = GaussianShellsExact.logEvidence(d, 2.0, 0.1, 6.0);
            // The table rounds to two decimals, so the exact value lies within half a unit.
            assertEquals(GaussianShellsExact.publishedLogEvidence(d), logZ, 0.005, "D=" + d);
        }
        // In 2-D, ∫ρ N(ρ; r, w²) dρ = r exactly (up to a tail of e^{-200}), so Z = 2·2πr/12².
        assertEquals(Math.log(8 * Math.PI / 144), GaussianShellsExact.logEvidence(2, 2.0, 0.1, 6.0), 1e-10);
    }
}
