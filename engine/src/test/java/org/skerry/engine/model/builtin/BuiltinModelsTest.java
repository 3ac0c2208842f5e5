package org.skerry.engine.model.builtin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.distribution.MultivariateNormalDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.util.MathArrays;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.reference.BetaBinomialExact;
import org.skerry.engine.reference.GaussianMixtureExact;
import org.skerry.engine.reference.GaussianShellsExact;
import org.skerry.engine.reference.LinearRegressionExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.Quadrature;
import org.skerry.engine.reference.SyntheticData;

/**
 * Each built-in model's log-likelihood against a direct computation with Commons Math 3.6.1
 * densities at random points, and its prior × likelihood integrated numerically against the
 * closed forms in {@code org.skerry.engine.reference}.
 */
class BuiltinModelsTest {

    private static void assertClose(double expected, double actual, String what) {
        assertEquals(expected, actual, 1e-12 * Math.max(1.0, Math.abs(expected)), what);
    }

    private static double normalLogDensity(double x, double mean, double sd) {
        // A null generator: the distribution is only evaluated, and seeding one is slow.
        return new NormalDistribution(null, mean, sd).logDensity(x);
    }

    // ---- normal mean --------------------------------------------------------------------------

    @Test
    @DisplayName("normal mean: log-likelihood equals the sum of Commons Math normal log-densities (d = 1 and 3)")
    void normalMeanLikelihood() {
        for (int d : new int[] {1, 3}) {
            double[] truth = new double[d];
            java.util.Arrays.fill(truth, 40.0);
            double[][] rows = SyntheticData.normalRows(10L + d, 25, truth, 0.3);
            NormalMeanModel model = NormalMeanModel.of(rows, 0.3, 0.0, 100.0);
            for (double[] mu : SyntheticData.uniformPoints(20L, 200, d, 39.0, 41.0)) {
                double expected = 0.0;
                for (double[] row : rows) {
                    for (int k = 0; k < d; k++) {
                        expected += normalLogDensity(row[k], mu[k], 0.3);
                    }
                }
                assertClose(expected, model.logLikelihood(mu, null), "d=" + d);
            }
            assertEquals(d == 1 ? List.of("mu") : List.of("mu1", "mu2", "mu3"), model.parameters().names());
        }
    }

    @Test
    @DisplayName("normal mean: the model's prior x likelihood integrates to NormalMeanExact's evidence")
    void normalMeanEvidence() {
        double[][] rows = SyntheticData.normalRows(30L, 12, new double[] {1.3}, 2.0);
        NormalMeanModel model = NormalMeanModel.of(rows, 2.0, -1.0, 1.5);
        NormalMeanExact exact = new NormalMeanExact(rows, 2.0, -1.0, 1.5);
        assertEquals(exact.logEvidence(), logIntegral1(model, exact.posteriorMean(0),
                Math.sqrt(exact.posteriorVariance())), 1e-9);
    }

    private static double logJoint(Model model, double[] x) {
        return model.prior().logDensity(x) + model.logLikelihood(x, null);
    }

    private static double logIntegral1(Model model, double centre, double sd) {
        double shift = logJoint(model, new double[] {centre});
        double z = Quadrature.integrate(t -> Math.exp(logJoint(model, new double[] {t}) - shift),
                centre - 15 * sd, centre + 15 * sd, 1e-12);
        return shift + Math.log(z);
    }

    // ---- linear regression --------------------------------------------------------------------

    static Stream<Arguments> regressions() {
        return Stream.of(
                Arguments.of("full rank", 30, 3),
                Arguments.of("more weights than rows", 3, 5),
                Arguments.of("one row", 1, 2));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("regressions")
    @DisplayName("linear regression: log-likelihood equals the sum of Commons Math normal log-densities")
    void regressionLikelihood(String label, int n, int p) {
        double[][] x = SyntheticData.design(40L + n, n, p, -3, 3, true);
        double[] w = new double[p];
        w[0] = 100.0;
        double[] y = SyntheticData.regressionResponse(41L, x, w, 0.5);
        double[][] s0 = new double[p][p];
        for (int j = 0; j < p; j++) {
            s0[j][j] = 4.0;
        }
        List<String> names = new java.util.ArrayList<>();
        for (int j = 0; j < p; j++) {
            names.add("w" + j);
        }
        LinearRegressionModel model = LinearRegressionModel.of(x, y, 0.5, MultivariateNormalPrior.of(new double[p], s0), names);
        for (double[] point : SyntheticData.uniformPoints(42L, 200, p, -2, 2)) {
            point[0] += 100.0;
            double expected = 0.0;
            for (int i = 0; i < n; i++) {
                expected += normalLogDensity(y[i], MathArrays.linearCombination(x[i], point), 0.5);
            }
            assertClose(expected, model.logLikelihood(point, null), label);
        }
    }

    @Test
    @DisplayName("linear regression: the model's prior x likelihood integrates to LinearRegressionExact's evidence (2-D)")
    void regressionEvidence() {
        double[][] x = SyntheticData.design(50L, 10, 2, 0, 4, true);
        double[] y = SyntheticData.regressionResponse(51L, x, new double[] {-1.0, 0.7}, 0.9);
        double[] m0 = {0.5, 0.0};
        double[][] s0 = {{2.0, -0.3}, {-0.3, 0.5}};
        LinearRegressionModel model = LinearRegressionModel.of(x, y, 0.9, MultivariateNormalPrior.of(m0, s0),
                List.of("intercept", "slope"));
        LinearRegressionExact exact = new LinearRegressionExact(x, y, 0.9, m0, s0);
        double[] mN = exact.posteriorMean();
        double[][] sN = exact.posteriorCovariance();
        double shift = logJoint(model, mN);
        double r0 = 12 * Math.sqrt(sN[0][0]);
        double r1 = 12 * Math.sqrt(sN[1][1]);
        double z = Quadrature.integrate((a, b) -> Math.exp(logJoint(model, new double[] {a, b}) - shift),
                mN[0] - r0, mN[0] + r0, mN[1] - r1, mN[1] + r1, 1e-10);
        assertEquals(exact.logEvidence(), shift + Math.log(z), 1e-8);
    }

    // ---- beta-binomial ------------------------------------------------------------------------

    @Test
    @DisplayName("beta-binomial: log-likelihood equals the sum of Commons Math binomial log-probabilities")
    void betaBinomialLikelihood() {
        int[] k = {3, 0, 17};
        int[] n = {10, 4, 17};
        BetaBinomialModel model = BetaBinomialModel.of(k, n, 2.0, 2.0);
        for (int i = 1; i < 1000; i++) {
            double p = i / 1000.0;
            double expected = 0.0;
            for (int j = 0; j < k.length; j++) {
                expected += new BinomialDistribution(null, n[j], p).logProbability(k[j]);
            }
            assertClose(expected, model.logLikelihood(new double[] {p}, null), "p=" + p);
        }
        assertEquals(Double.NEGATIVE_INFINITY, model.logLikelihood(new double[] {1.0}, null));
    }

    @Test
    @DisplayName("beta-binomial: the model's prior x likelihood integrates to BetaBinomialExact's evidence")
    void betaBinomialEvidence() {
        BetaBinomialModel model = BetaBinomialModel.of(13, 40, 1.5, 4.0);
        BetaBinomialExact exact = new BetaBinomialExact(13, 40, 1.5, 4.0);
        double z = Quadrature.integrate(p -> Math.exp(logJoint(model, new double[] {p})), 1e-300, 1.0 - 1e-16, 1e-12);
        assertEquals(exact.logEvidence(), Math.log(z), 1e-9);
    }

    // ---- Gaussian mixture ---------------------------------------------------------------------

    @Test
    @DisplayName("mixture: log-likelihood equals log(w N1 + (1-w) N2) with Commons Math MultivariateNormalDistribution")
    void mixtureLikelihood() {
        double[] m1 = {-2.0, 1.0, 0.5};
        double[] m2 = {2.5, -1.0, 0.0};
        GaussianMixtureLikelihoodModel model = GaussianMixtureLikelihoodModel.of(0.3, m1, m2, 0.7, 10.0);
        double[][] cov = {{0.49, 0, 0}, {0, 0.49, 0}, {0, 0, 0.49}};
        MultivariateNormalDistribution n1 = new MultivariateNormalDistribution(null, m1, cov);
        MultivariateNormalDistribution n2 = new MultivariateNormalDistribution(null, m2, cov);
        for (double[] theta : SyntheticData.uniformPoints(60L, 500, 3, -4, 4)) {
            double expected = Math.log(0.3 * n1.density(theta) + 0.7 * n2.density(theta));
            assertClose(expected, model.logLikelihood(theta, null), "theta");
        }
    }

    @Test
    @DisplayName("mixture, 2-D: likelihood x prior integrated over the box equals GaussianMixtureExact (~ -2 log 20)")
    void mixtureEvidence() {
        GaussianMixtureLikelihoodModel model = GaussianMixtureLikelihoodModel.of(2, 0.3, -2.0, 2.0, 0.5, 10.0);
        GaussianMixtureExact exact = new GaussianMixtureExact(0.3, model.mean1(), model.mean2(), 0.5, 10.0);
        double z = Quadrature.square((a, b) -> Math.exp(logJoint(model, new double[] {a, b})), -10, 10, 100, 8);
        assertEquals(exact.logEvidence(), Math.log(z), 1e-9);
        assertEquals(-2 * Math.log(20.0), exact.logEvidence(), 1e-12, "the box holds all but ~1e-50 of the mass");
    }

    // ---- Gaussian shells ----------------------------------------------------------------------

    @Test
    @DisplayName("shells: log-likelihood equals log of summed Commons Math N(|theta - c|; r, w) densities (D = 2, 5, 10)")
    void shellsLikelihood() {
        NormalDistribution radial = new NormalDistribution(null, 2.0, 0.1);
        for (int d : new int[] {2, 5, 10}) {
            GaussianShellsModel model = GaussianShellsModel.standard(d);
            double[] c1 = new double[d];
            double[] c2 = new double[d];
            c1[0] = 3.5;
            c2[0] = -3.5;
            // Points near the shells, where the likelihood is not negligible.
            double[][] points = SyntheticData.uniformPoints(70L + d, 400, d, -1, 1);
            for (int i = 0; i < points.length; i++) {
                double[] t = points[i];
                double norm = Math.sqrt(MathArrays.linearCombination(t, t));
                double radius = 2.0 + 0.15 * t[0];
                for (int k = 0; k < d; k++) {
                    t[k] = t[k] / norm * radius + (i % 2 == 0 ? c1[k] : c2[k]);
                }
                double expected = Math.log(radial.density(MathArrays.distance(t, c1))
                        + radial.density(MathArrays.distance(t, c2)));
                assertClose(expected, model.logLikelihood(t, null), "D=" + d);
            }
        }
    }

    @Test
    @DisplayName("shells, 2-D: likelihood integrates to the radial closed form, and to Feroz et al.'s -1.75 (from memory)")
    void shellsEvidence() {
        double closedForm = GaussianShellsExact.logEvidence(2, 2.0, 0.1, 6.0);
        // The likelihood alone over [-7, 7]^2, which holds the shells' tails too, divided by the
        // published prior volume 12^2. 8-point rule on panels of width 0.025: the shell width 0.1
        // spans 32 nodes.
        GaussianShellsModel wide = GaussianShellsModel.of(2, 2.0, 0.1, 3.5, 7.0);
        double whole = Quadrature.square((a, b) -> Math.exp(wide.logLikelihood(new double[] {a, b}, null)),
                -7, 7, 560, 8);
        assertEquals(closedForm, Math.log(whole / 144.0), 1e-10);

        // Prior x likelihood of the standard problem: the box [-6, 6]^2 cuts off the part of each
        // shell beyond 5 widths, so the evidence falls short of the closed form by less than the
        // fraction Phi(-5) = 2.9e-7 of the radial mass beyond r + 5w.
        GaussianShellsModel model = GaussianShellsModel.standard(2);
        double z = Quadrature.square((a, b) -> Math.exp(logJoint(model, new double[] {a, b})), -6, 6, 480, 8);
        double tail = new NormalDistribution(null, 0, 1).cumulativeProbability(-5.0);
        double shortfall = closedForm - Math.log(z);
        assertTrue(shortfall > 0 && shortfall < tail, "shortfall " + shortfall);
        assertEquals(GaussianShellsExact.publishedLogEvidence(2), Math.log(z), 0.005);
    }

    // ---- common -------------------------------------------------------------------------------

    static Stream<Arguments> models() {
        double[][] rows = SyntheticData.normalRows(80L, 50, new double[] {0.0, 1.0}, 1.0);
        double[][] x = SyntheticData.design(81L, 50, 3, -1, 1, true);
        double[] y = SyntheticData.regressionResponse(82L, x, new double[] {1, 2, 3}, 1.0);
        double[][] s0 = {{1, 0, 0}, {0, 1, 0}, {0, 0, 1}};
        double[][] xWide = SyntheticData.design(83L, 2, 3, -1, 1, true);
        return Stream.of(
                Arguments.of(NormalMeanModel.of(rows, 1.0, 0.0, 10.0), SyntheticData.uniformPoints(1, 64, 2, -1, 2)),
                Arguments.of(LinearRegressionModel.of(x, y, 1.0, MultivariateNormalPrior.of(new double[3], s0),
                        List.of("a", "b", "c")), SyntheticData.uniformPoints(2, 64, 3, 0, 3)),
                Arguments.of(LinearRegressionModel.of(xWide, new double[] {1, 2}, 1.0,
                        MultivariateNormalPrior.of(new double[3], s0), List.of("a", "b", "c")),
                        SyntheticData.uniformPoints(3, 64, 3, 0, 3)),
                Arguments.of(BetaBinomialModel.of(3, 10, 1, 1), SyntheticData.uniformPoints(4, 64, 1, 0.01, 0.99)),
                Arguments.of(GaussianMixtureLikelihoodModel.of(4, 0.3, -2, 2, 0.5, 10),
                        SyntheticData.uniformPoints(5, 64, 4, -3, 3)),
                Arguments.of(GaussianShellsModel.standard(5), SyntheticData.uniformPoints(6, 64, 5, -6, 6)));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("models")
    @DisplayName("log-likelihood allocates nothing: under 1 KiB over a million calls (HotSpot thread allocation counter)")
    void allocationFree(Model model, double[][] points) {
        long bytes = Allocation.bytesPerMillionCalls(model, points);
        org.junit.jupiter.api.Assumptions.assumeTrue(bytes >= 0, "JVM has no thread allocation counter");
        // Any per-call allocation would cost at least 16 bytes a call, 16 MB in all.
        assertTrue(bytes < 1024, model + " allocated " + bytes + " bytes");
    }

    @Test
    @DisplayName("bad model arguments are refused with messages naming them")
    void refusals() {
        assertMessage(() -> NormalMeanModel.of(new double[][] {{1}}, -1, 0, 1), "sigma", "-1.0");
        assertMessage(() -> NormalMeanModel.of(new double[][] {{1, 2}, {3}}, 1, 0, 1), "row 1", "1");
        assertMessage(() -> BetaBinomialModel.of(5, 3, 1, 1), "successes[0]=5", "trials[0]=3");
        assertMessage(() -> BetaBinomialModel.of(1, 3, 0, 1), "a", "0.0");
        assertMessage(() -> GaussianMixtureLikelihoodModel.of(2, 1.5, -1, 1, 1, 5), "weight", "1.5");
        assertMessage(() -> GaussianShellsModel.of(0, 2, 0.1, 3.5, 6), "dimension", "0");
        assertMessage(() -> GaussianShellsModel.of(2, 2, -0.1, 3.5, 6), "width", "-0.1");
        assertMessage(() -> LinearRegressionModel.of(new double[][] {{1, 2}}, new double[] {1, 2}, 1,
                MultivariateNormalPrior.of(new double[2], new double[][] {{1, 0}, {0, 1}}), List.of("a", "b")),
                "response", "2");
    }

    static void assertMessage(Runnable action, String first, String second) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, action::run);
        assertTrue(e.getMessage().contains(first) && e.getMessage().contains(second), e.getMessage());
    }
}
