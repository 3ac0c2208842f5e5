package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.target.SequenceSettings;

/**
 * Simulation-based calibration of ABC on the demo's zooplankton simulator (Cook, Gelman &amp;
 * Rubin 2006, J. Comput. Graph. Stat. 15(3); Talts et al. 2018, arXiv:1804.06788), as
 * PlanktonCalibrationTest does for the likelihood runs: draw the parameters from the prior,
 * simulate a season of tows, calibrate by ABC, and count how often the 95 % intervals hold the
 * drawn truth. For a correct posterior each count is Binomial(24, 0.95); the bound is that
 * binomial's exact 0.001 quantile (Commons Math), so each of the three checks fails by chance with
 * probability at most 0.001. An ABC posterior at a positive tolerance is wider than the exact
 * posterior, so it may cover more often, never (beyond chance) less.
 */
@Slow
class ZooplanktonAbcCalibrationTest {

    private static final int DATASETS = 24;
    private static final int WEEKS = 40;
    private static final long SEED = 20261202L;

    @Test
    @DisplayName("the demo's committed tow counts are the generator's output from the stated truth and seed")
    void demoDataRegenerate() throws java.io.IOException {
        String committed = java.nio.file.Files.readString(java.nio.file.Path.of("..", "conf", "demo", "data",
                ZooplanktonRicker.DEMO_FILE));
        org.junit.jupiter.api.Assertions.assertEquals(ZooplanktonRicker.demoCsv(20261201L), committed);
        org.junit.jupiter.api.Assertions.assertTrue(committed.startsWith("# Synthetic data"), "says it is synthetic");
    }

    @Test
    @DisplayName("95 % ABC posterior intervals cover prior-drawn truths as often as Binomial(24, 0.95) allows")
    void coverage() {
        ZooplanktonRicker generator = ZooplanktonRicker.withoutData(WEEKS);
        int d = ZooplanktonRicker.PARAMETER_NAMES.size();
        int[] covered = new int[d];
        long simulations = 0;
        long start = System.nanoTime();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int k = 0; k < DATASETS; k++) {
                double[] truth = new double[d];
                generator.prior().sample(new RandomStream(SEED, StreamPurpose.TESTING, 0, k), truth);
                double[] counts = ZooplanktonRicker.counts(truth, WEEKS, new RandomStream(SEED, StreamPurpose.TESTING, 1, k));
                ZooplanktonRicker model = ZooplanktonRicker.of(counts);
                SamplerSettings settings = SamplerSettings.builder().particles(400).seed(SEED + k)
                        .targets(SequenceSettings.abc(AbcSettings.of(1.0).withStops(0.03, 400_000))).build();
                SamplerResult result = new SmcSampler(settings).run(model, backend);
                simulations += result.simulations();
                for (int i = 0; i < d; i++) {
                    ParameterSummary s = result.parameters().get(i);
                    if (s.q2_5() <= truth[i] && truth[i] <= s.q97_5()) {
                        covered[i]++;
                    }
                }
            }
        }
        int low = new BinomialDistribution(DATASETS, 0.95).inverseCumulativeProbability(0.001);
        StringBuilder counts = new StringBuilder();
        for (int i = 0; i < d; i++) {
            counts.append(ZooplanktonRicker.PARAMETER_NAMES.get(i)).append(": ").append(covered[i]).append("; ");
        }
        String report = counts + "bound: >= " + low + " of " + DATASETS;
        for (int i = 0; i < d; i++) {
            assertTrue(covered[i] >= low, report);
        }
        System.out.println("zooplankton ABC calibration: " + DATASETS + " datasets, " + simulations + " simulations, "
                + (System.nanoTime() - start) / 1e9 + " s; " + report);
    }
}
