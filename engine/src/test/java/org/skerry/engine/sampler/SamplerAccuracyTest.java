package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.Slow;
import org.skerry.engine.model.builtin.BetaBinomialModel;
import org.skerry.engine.model.builtin.GaussianMixtureLikelihoodModel;
import org.skerry.engine.model.builtin.GaussianShellsModel;
import org.skerry.engine.model.builtin.LinearRegressionModel;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.reference.BetaBinomialExact;
import org.skerry.engine.reference.GaussianMixtureExact;
import org.skerry.engine.reference.GaussianShellsExact;
import org.skerry.engine.reference.LinearRegressionExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.temper.FixedSchedule;

/**
 * The sampler against closed forms and published values. Every tolerance is four standard errors
 * of the replicated estimate (false-alarm rate about 6·10⁻⁵ per check under a normal
 * approximation), computed from the spread over the seeds of the same test.
 */
@Slow
class SamplerAccuracyTest {

    private static final int SEEDS = 24;
    private static final double Z = 4.0;

    private static SamplerSettings.Builder base() {
        return SamplerSettings.builder().particles(1000);
    }

    static void assertWithin(double expected, SummaryStatistics replicated, String what) {
        double error = Z * Replicates.standardError(replicated);
        assertEquals(expected, replicated.getMean(), error, what + " (4 standard errors = " + error + ")");
    }

    static void assertEvidence(double exact, Replicates replicates) {
        SummaryStatistics logZ = replicates.logEvidence();
        double error = Z * Replicates.standardError(logZ);
        assertEquals(exact, replicates.correctedLogEvidence(), error,
                "mean(log Z) + Var/2 against exact (4 standard errors = " + error + ")");
    }

    private static final double[][] NORMAL_DATA_1D = SyntheticData.normalRows(11, 20, new double[] {1.5}, 2.0);

    @ParameterizedTest
    @EnumSource(ResamplingScheme.class)
    @DisplayName("Normal mean, 1-D: evidence and posterior moments against BDA3 §2.5 and PRML eq. 2.115")
    void normalMeanOneDimension(ResamplingScheme scheme) {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        NormalMeanExact exact = new NormalMeanExact(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        Replicates replicates = Replicates.run(model, base().resamplingScheme(scheme).build(), SEEDS);
        assertEvidence(exact.logEvidence(), replicates);
        assertWithin(exact.posteriorMean(0), replicates.mean(0), "posterior mean");
        assertWithin(Math.sqrt(exact.posteriorVariance()), replicates.sd(0), "posterior sd");
    }

    @ParameterizedTest
    @EnumSource(MoveKernel.class)
    @DisplayName("Normal mean, 3-D, both move kernels: evidence and moments against BDA3 §3.5 and PRML eq. 2.115")
    void normalMeanThreeDimensions(MoveKernel kernel) {
        double[][] data = SyntheticData.normalRows(12, 15, new double[] {-1.0, 0.5, 2.0}, 1.0);
        NormalMeanModel model = NormalMeanModel.of(data, 1.0, 0.0, 2.0);
        NormalMeanExact exact = new NormalMeanExact(data, 1.0, 0.0, 2.0);
        Replicates replicates = Replicates.run(model, base().moveKernel(kernel).build(), SEEDS);
        assertEvidence(exact.logEvidence(), replicates);
        for (int k = 0; k < 3; k++) {
            assertWithin(exact.posteriorMean(k), replicates.mean(k), "posterior mean " + k);
            assertWithin(Math.sqrt(exact.posteriorVariance()), replicates.sd(k), "posterior sd " + k);
        }
    }

    /** The regression case both sequences of targets are checked on: 30 synthetic rows, a correlated prior. */
    static final class RegressionCase {
        static final double[][] DESIGN = SyntheticData.design(13, 30, 2, -2.0, 2.0, true);
        static final double[] RESPONSE = SyntheticData.regressionResponse(14, DESIGN, new double[] {0.7, -1.2}, 0.5);
        static final double[] PRIOR_MEAN = {0.0, 0.0};
        static final double[][] PRIOR_COVARIANCE = {{4.0, 0.5}, {0.5, 2.0}};
        static final LinearRegressionModel MODEL = LinearRegressionModel.of(DESIGN, RESPONSE, 0.5,
                MultivariateNormalPrior.of(PRIOR_MEAN, PRIOR_COVARIANCE), List.of("intercept", "slope"));
        static final LinearRegressionExact EXACT = new LinearRegressionExact(DESIGN, RESPONSE, 0.5, PRIOR_MEAN,
                PRIOR_COVARIANCE);

        private RegressionCase() {
        }

        /** Evidence, posterior means and sds of the replicates against PRML §3.3 (3.49–3.51) and eq. 3.86. */
        static void check(Replicates replicates) {
            assertEvidence(EXACT.logEvidence(), replicates);
            double[] mean = EXACT.posteriorMean();
            double[][] covariance = EXACT.posteriorCovariance();
            for (int k = 0; k < 2; k++) {
                assertWithin(mean[k], replicates.mean(k), "posterior mean " + k);
                assertWithin(Math.sqrt(covariance[k][k]), replicates.sd(k), "posterior sd " + k);
            }
        }
    }

    @Test
    @DisplayName("Bayesian linear regression: evidence and weights against PRML §3.3 (3.49–3.51) and eq. 3.86")
    void linearRegression() {
        RegressionCase.check(Replicates.run(RegressionCase.MODEL, base().build(), SEEDS));
    }

    @Test
    @DisplayName("Beta–Binomial: evidence (BDA3 §2.4) and posterior quantiles against Beta(a+k, b+n−k)")
    void betaBinomial() {
        BetaBinomialModel model = BetaBinomialModel.of(17, 40, 2.0, 3.0);
        BetaBinomialExact exact = new BetaBinomialExact(17, 40, 2.0, 3.0);
        Replicates replicates = Replicates.run(model, base().resamplingScheme(ResamplingScheme.RESIDUAL).build(), SEEDS);
        assertEvidence(exact.logEvidence(), replicates);
        assertWithin(exact.posteriorQuantile(0.025), replicates.quantile(0, ParameterSummary::q2_5), "2.5 % quantile");
        assertWithin(exact.posteriorQuantile(0.5), replicates.quantile(0, ParameterSummary::q50), "median");
        assertWithin(exact.posteriorQuantile(0.975), replicates.quantile(0, ParameterSummary::q97_5), "97.5 % quantile");
    }

    @Test
    @DisplayName("bimodal mixture likelihood: log Z = −log(prior volume) and the mode weights (exact by construction)")
    void bimodalMixture() {
        GaussianMixtureLikelihoodModel model = GaussianMixtureLikelihoodModel.of(2, 0.3, -3.0, 3.0, 0.5, 8.0);
        GaussianMixtureExact exact = new GaussianMixtureExact(0.3, new double[] {-3, -3}, new double[] {3, 3}, 0.5, 8.0);
        Replicates replicates = Replicates.run(model, base().particles(2000).build(), SEEDS);
        assertEvidence(exact.logEvidence(), replicates);
        SummaryStatistics firstMode = new SummaryStatistics();
        for (SamplerResult result : replicates.results) {
            double share = 0;
            for (int i = 0; i < result.particles().size(); i++) {
                if (result.particles().value(i, 0) < 0) {
                    share += result.normalisedWeights()[i];
                }
            }
            firstMode.addValue(share);
        }
        assertWithin(exact.firstModeWeight(), firstMode, "weight of the first mode");
    }

    @Test
    @DisplayName("Gaussian shells, D = 2: log Z ≈ −1.75 (Feroz, Hobson & Bridges 2009, from memory) and the quadrature value")
    void gaussianShells() {
        GaussianShellsModel model = GaussianShellsModel.standard(2);
        Replicates replicates = Replicates.run(model, base().particles(2000).build(), SEEDS);
        SummaryStatistics logZ = replicates.logEvidence();
        double error = Z * Replicates.standardError(logZ);
        double quadrature = GaussianShellsExact.logEvidence(2, 2.0, 0.1, 6.0);
        assertEquals(quadrature, replicates.correctedLogEvidence(), error, "against the quadrature value");
        // The published value carries two decimals: allow its rounding (0.005) on top.
        assertEquals(GaussianShellsExact.publishedLogEvidence(2), replicates.correctedLogEvidence(), error + 0.005,
                "against the published value");
    }

    @Test
    @DisplayName("fixed schedule: Ẑ is unbiased, mean of Ẑ/Z is 1 (Del Moral 2004; Del Moral, Doucet & Jasra 2006)")
    void unbiasedWithFixedSchedule() {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        double exact = new NormalMeanExact(NORMAL_DATA_1D, 2.0, 0.0, 3.0).logEvidence();
        Replicates replicates = Replicates.run(model,
                base().particles(500).temperatureRule(FixedSchedule.power(8, 4.0)).build(), 40);
        SummaryStatistics ratio = new SummaryStatistics();
        replicates.results.forEach(r -> ratio.addValue(Math.exp(r.evidence().logEvidence() - exact)));
        assertWithin(1.0, ratio, "mean of Z-hat / Z");
    }

    @Test
    @DisplayName("start from a user proposal q: importance weights prior/q, evidence and mean still exact")
    void startFromProposal() {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        NormalMeanExact exact = new NormalMeanExact(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        IndependentPrior proposal = IndependentPrior.of(Normal.of(1.0, 4.0));
        Replicates replicates = Replicates.run(model, base().startProposal(proposal).build(), SEEDS);
        assertEvidence(exact.logEvidence(), replicates);
        assertWithin(exact.posteriorMean(0), replicates.mean(0), "posterior mean");
    }

    @Test
    @DisplayName("single-run evidence error (Lee & Whiteley 2018) matches the spread of log Z over seeds")
    void singleRunErrorMatchesSpread() {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA_1D, 2.0, 0.0, 3.0);
        int seeds = 40;
        Replicates replicates = Replicates.run(model, base().particles(400).build(), seeds);
        double spread = replicates.logEvidence().getVariance();
        SummaryStatistics estimated = new SummaryStatistics();
        replicates.results.forEach(r -> estimated.addValue(r.evidence().standardError() * r.evidence().standardError()));
        // The sample variance over k seeds is σ²·χ²(k−1)/(k−1); its central 99.9 % range bounds the ratio.
        org.apache.commons.math3.distribution.ChiSquaredDistribution chi =
                new org.apache.commons.math3.distribution.ChiSquaredDistribution(seeds - 1);
        double low = chi.inverseCumulativeProbability(0.0005) / (seeds - 1);
        double high = chi.inverseCumulativeProbability(0.9995) / (seeds - 1);
        double ratio = spread / estimated.getMean();
        assertTrue(ratio > low && ratio < high, "Var over seeds / mean single-run estimate = " + ratio
                + ", expected in [" + low + ", " + high + "] (99.9 % chi-square range, " + seeds + " seeds)");
        replicates.results.forEach(r -> assertTrue(r.evidence().reliable(), "enough distinct Eves at N=400"));
    }
}
