package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.threads.ThreadPoolBackend;

/**
 * A run that streams its final population to a sink gives the run that keeps it whole, bit for
 * bit: the same rows in canonical order (parameters, weights as exp(log-weight − log Σ), log
 * likelihood, log prior), the same summaries and evidence error; whatever the block layout, and
 * with no run handed twice or out of order.
 */
class StreamedExportTest {

    @Test
    @DisplayName("streamed rows, summaries and evidence error equal the whole population's, for several layouts")
    void streamedEqualsWhole() {
        SamplerSettings settings = SamplerSettings.builder().particles(1000).seed(5).build();
        SamplerResult whole;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            whole = new SmcSampler(settings).run(SameSeedSameAnswerTest.model(), backend);
        }
        FinalParticles p = whole.particles();
        int n = p.size();
        int d = p.dimension();
        for (int[] layout : new int[][] {{1, 0}, {2, 7}, {3, 1000}}) {
            double[] values = new double[n * d];
            double[] weights = new double[n];
            double[] logLikelihood = new double[n];
            double[] logPrior = new double[n];
            int[] runs = {0};
            long[] next = {0};
            SamplerResult streamed;
            try (ThreadPoolBackend backend = new ThreadPoolBackend(layout[0], layout[1])) {
                streamed = new SmcSampler(settings).streamingTo(rows -> {
                    assertEquals(next[0], rows.firstIndex(), "runs in canonical order");
                    int at = (int) rows.firstIndex();
                    System.arraycopy(rows.values(), 0, values, at * d, rows.count() * d);
                    System.arraycopy(rows.weights(), 0, weights, at, rows.count());
                    System.arraycopy(rows.logLikelihood(), 0, logLikelihood, at, rows.count());
                    System.arraycopy(rows.logPrior(), 0, logPrior, at, rows.count());
                    next[0] += rows.count();
                    runs[0]++;
                }).run(SameSeedSameAnswerTest.model(), backend);
            }
            String where = Arrays.toString(layout);
            assertNull(streamed.particles(), where);
            assertEquals(n, next[0], where);
            assertTrue(layout[1] == 7 ? runs[0] > 1 : runs[0] >= 1, where);
            assertArrayEquals(p.values(), values, where);
            assertArrayEquals(whole.normalisedWeights(), weights, where);
            assertArrayEquals(p.logLikelihood(), logLikelihood, where);
            assertArrayEquals(p.logPrior(), logPrior, where);
            assertEquals(SameSeedSameAnswerTest.fingerprint(whole), SameSeedSameAnswerTest.fingerprint(streamed), where);
            assertEquals(whole.evidence(), streamed.evidence(), where);
        }
    }
}
