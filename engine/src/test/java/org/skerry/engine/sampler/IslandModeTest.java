package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * Island mode (Vergé, Dubarry, Del Moral &amp; Moulines 2015): evidence and posterior against the
 * closed form, agreement with global mode, the islands' own error estimate, and grouping
 * independence. Tolerances: four standard errors over replicated seeds.
 */
class IslandModeTest {

    private static final double[][] DATA = SyntheticData.normalRows(51, 20, new double[] {1.2}, 2.0);
    private static final NormalMeanModel MODEL = NormalMeanModel.of(DATA, 2.0, 0.0, 3.0);
    private static final NormalMeanExact EXACT = new NormalMeanExact(DATA, 2.0, 0.0, 3.0);

    @Test
    @DisplayName("islands without interaction: evidence and posterior moments match the closed form (PRML eq. 2.115; BDA3 §2.5), as global mode does")
    void islandAndGlobalAgree() {
        SamplerSettings.Builder base = SamplerSettings.builder().particles(1000);
        Replicates islands = Replicates.run(MODEL, base.islands(10).build(), 16);
        Replicates global = Replicates.run(MODEL, base.islands(0).build(), 16);
        for (Replicates replicates : new Replicates[] {islands, global}) {
            SummaryStatistics logZ = replicates.logEvidence();
            assertEquals(EXACT.logEvidence(), replicates.correctedLogEvidence(), 4 * Replicates.standardError(logZ));
            SummaryStatistics mean = replicates.mean(0);
            assertEquals(EXACT.posteriorMean(0), mean.getMean(), 4 * Replicates.standardError(mean));
            SummaryStatistics sd = replicates.sd(0);
            assertEquals(Math.sqrt(EXACT.posteriorVariance()), sd.getMean(), 4 * Replicates.standardError(sd));
        }
        // The two modes agree with each other within their combined error.
        double difference = islands.correctedLogEvidence() - global.correctedLogEvidence();
        double combined = Math.hypot(Replicates.standardError(islands.logEvidence()),
                Replicates.standardError(global.logEvidence()));
        assertEquals(0.0, difference, 4 * combined);
        islands.results.forEach(r -> r.iterations().forEach(record -> assertEquals(0, record.particlesMoved())));
    }

    @Test
    @DisplayName("the islands' spread estimates the error of log Z: consistent with the spread over seeds (99.9 % chi-square range)")
    void islandErrorMatchesSpread() {
        int seeds = 30;
        Replicates replicates = Replicates.run(MODEL, SamplerSettings.builder().particles(800).islands(16).build(), seeds);
        SummaryStatistics estimated = new SummaryStatistics();
        replicates.results.forEach(r -> {
            assertEquals(16, r.evidence().islands());
            estimated.addValue(r.evidence().islandStandardError() * r.evidence().islandStandardError());
        });
        double ratio = replicates.logEvidence().getVariance() / estimated.getMean();
        ChiSquaredDistribution chi = new ChiSquaredDistribution(seeds - 1);
        double low = chi.inverseCumulativeProbability(0.0005) / (seeds - 1);
        double high = chi.inverseCumulativeProbability(0.9995) / (seeds - 1);
        assertTrue(ratio > low && ratio < high, "Var over seeds / mean island estimate = " + ratio + ", expected in ["
                + low + ", " + high + "]");
    }

    @Test
    @DisplayName("island mode: same seed, same answer for 1, 2 and 7 threads; interaction moves particles, then no island error")
    void groupingIndependent() {
        SamplerSettings settings = SamplerSettings.builder().particles(230).seed(8).islands(5)
                .islandInteractionEvery(2).build();
        SamplerResult reference;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(1, 0)) {
            reference = new SmcSampler(settings).run(MODEL, backend);
        }
        for (int threads : new int[] {2, 7}) {
            try (ThreadPoolBackend backend = new ThreadPoolBackend(threads, 3)) {
                SamplerResult other = new SmcSampler(settings).run(MODEL, backend);
                assertEquals(reference.evidence(), other.evidence());
                assertArrayEquals(reference.particles().values(), other.particles().values());
            }
        }
        assertTrue(Double.isNaN(reference.evidence().islandStandardError()), "islands interacted");
        assertTrue(reference.iterations().stream().anyMatch(r -> r.particlesMoved() > 0), "global steps move particles");
    }
}
