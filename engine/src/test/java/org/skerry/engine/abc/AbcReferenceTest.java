package org.skerry.engine.abc;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.ToDoubleFunction;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.builtin.MixtureToySimulator;
import org.skerry.engine.model.builtin.NormalMeanSimulator;
import org.skerry.engine.model.builtin.PoissonSumSimulator;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.AbcExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.target.SequenceSettings;

/**
 * ABC-SMC against exact ABC posteriors. Every run fixes the final tolerance and the distance
 * weights, so every seed targets the same ABC posterior, in known units; the expected values come
 * from 1-D quadrature (AbcExact). Each tolerance is four standard errors of the estimate
 * replicated over the seeds of the same test (false-alarm rate about 6·10⁻⁵ per check under a
 * normal approximation), as in SamplerAccuracyTest.
 */
@Slow
class AbcReferenceTest {

    private static final int SEEDS = 16;
    private static final double Z = 4.0;

    static List<SamplerResult> replicate(Model model, AbcSettings abc, int particles, int seeds) {
        List<SamplerResult> results = new ArrayList<>();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < seeds; s++) {
                SamplerSettings settings = SamplerSettings.builder().particles(particles).seed(4000 + 7919L * s)
                        .targets(SequenceSettings.abc(abc)).build();
                results.add(new SmcSampler(settings).run(model, backend));
            }
        }
        return results;
    }

    static void assertWithin(double expected, List<SamplerResult> results, ToDoubleFunction<ParameterSummary> which,
            String what) {
        SummaryStatistics stats = new SummaryStatistics();
        results.forEach(r -> stats.addValue(which.applyAsDouble(r.parameters().get(0))));
        double error = Z * stats.getStandardDeviation() / Math.sqrt(stats.getN());
        assertEquals(expected, stats.getMean(), error, what + ": mean over " + stats.getN() + " seeds "
                + stats.getMean() + " against exact " + expected + " (4 standard errors = " + error + ")");
    }

    static void assertPosterior(AbcExact exact, List<SamplerResult> results) {
        assertWithin(exact.mean(), results, ParameterSummary::mean, "posterior mean");
        assertWithin(exact.sd(), results, ParameterSummary::sd, "posterior sd");
        assertWithin(exact.quantile(0.05), results, ParameterSummary::q5, "5 % quantile");
        assertWithin(exact.quantile(0.5), results, ParameterSummary::q50, "median");
        assertWithin(exact.quantile(0.95), results, ParameterSummary::q95, "95 % quantile");
    }

    private static final double[] NORMAL_DATA = SyntheticData.column(
            SyntheticData.normalRows(31, 10, new double[] {1.2}, 1.0), 0);

    @Test
    @DisplayName("Normal mean, sample-mean summary, uniform kernel: the exact ABC posterior at ε = 0.1 "
            + "(1-D quadrature of prior × P(|x̄sim − x̄| ≤ ε | θ); Pritchard et al. 1999)")
    void normalMeanAtFixedTolerance() {
        NormalMeanSimulator model = NormalMeanSimulator.of(NORMAL_DATA, 1.0, 0.0, 3.0);
        double observed = model.observedSummaries()[0];
        AbcSettings abc = AbcSettings.of(0.1).withWeights(Map.of("mean", 1.0));
        List<SamplerResult> results = replicate(model, abc, 1000, SEEDS);
        assertPosterior(AbcExact.normalMean(observed, 1.0, 10, 0.0, 3.0, 0.1), results);
        for (SamplerResult r : results) {
            assertEquals(0.1, r.lastTolerance().tolerance(), "every run ends at the final tolerance");
            assertTrue(r.simulations() > 1000, "simulations are counted");
        }
    }

    @Test
    @DisplayName("Normal mean: as ε shrinks the ABC posterior approaches the conjugate one (BDA3 §2.5)")
    void normalMeanApproachesConjugate() {
        NormalMeanSimulator model = NormalMeanSimulator.of(NORMAL_DATA, 1.0, 0.0, 3.0);
        double[][] rows = new double[NORMAL_DATA.length][];
        for (int j = 0; j < rows.length; j++) {
            rows[j] = new double[] {NORMAL_DATA[j]};
        }
        NormalMeanExact conjugate = new NormalMeanExact(rows, 1.0, 0.0, 3.0);
        double observed = model.observedSummaries()[0];
        // At ε = 0.02 (s = 0.32) the ABC posterior's sd exceeds the conjugate one by under 0.2 %
        // (quadrature), so the runs must match the conjugate moments within their own error.
        AbcExact exact = AbcExact.normalMean(observed, 1.0, 10, 0.0, 3.0, 0.02);
        assertEquals(conjugate.posteriorMean(0), exact.mean(), 1e-3, "quadrature agrees with BDA3 §2.5 at small ε");
        assertEquals(Math.sqrt(conjugate.posteriorVariance()), exact.sd(), 2e-3 * exact.sd(), "sd at small ε");
        List<SamplerResult> results = replicate(model, AbcSettings.of(0.02).withWeights(Map.of("mean", 1.0)), 1000,
                SEEDS);
        assertWithin(conjugate.posteriorMean(0), results, ParameterSummary::mean, "posterior mean against BDA3 §2.5");
        assertWithin(Math.sqrt(conjugate.posteriorVariance()), results, ParameterSummary::sd,
                "posterior sd against BDA3 §2.5");
    }

    @Test
    @DisplayName("Toy mixture of Sisson, Fan & Tanaka (2007, PNAS 104(6); from memory) at ε = 0.025: the exact ABC "
            + "posterior by quadrature")
    void mixtureToy() {
        MixtureToySimulator model = MixtureToySimulator.of(0.0);
        List<SamplerResult> results = replicate(model, AbcSettings.of(0.025).withWeights(Map.of("x", 1.0)), 1000,
                SEEDS);
        assertPosterior(AbcExact.mixtureToy(0.0, 0.025), results);
    }

    private static final long[] COUNTS = {3, 7, 4, 6, 2, 5};

    @Test
    @DisplayName("Poisson counts, Gamma(2, 0.5) prior, total as summary, ε = 0.5 < 1: exactly the conjugate "
            + "Gamma(a + Σy, b + n) posterior (BDA3 §2.6)")
    void poissonBelowOne() {
        PoissonSumSimulator model = PoissonSumSimulator.of(COUNTS, 2.0, 0.5);
        AbcExact exact = AbcExact.poissonSum(model.total(), COUNTS.length, 2.0, 0.5, 0.5);
        assertEquals((2.0 + model.total()) / (0.5 + COUNTS.length), exact.mean(), 1e-9,
                "the quadrature is the conjugate mean (BDA3 §2.6)");
        List<SamplerResult> results = replicate(model, AbcSettings.of(0.5).withWeights(Map.of("total", 1.0)), 1000,
                SEEDS);
        assertPosterior(exact, results);
    }

    @Test
    @DisplayName("Poisson counts, total as summary, ε = 3.5: the finite mixture of Gamma posteriors over the "
            + "accepted totals (BDA3 §2.6 per component)")
    void poissonAboveOne() {
        PoissonSumSimulator model = PoissonSumSimulator.of(COUNTS, 2.0, 0.5);
        List<SamplerResult> results = replicate(model, AbcSettings.of(3.5).withWeights(Map.of("total", 1.0)), 1000,
                SEEDS);
        assertPosterior(AbcExact.poissonSum(model.total(), COUNTS.length, 2.0, 0.5, 3.5), results);
    }
}
