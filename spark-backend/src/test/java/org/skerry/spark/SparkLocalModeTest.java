package org.skerry.spark;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.apache.spark.api.java.JavaSparkContext;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.Slow;
import org.skerry.engine.abc.AbcKernel;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.target.SequenceSettings;

/** The Spark backend in local mode against the thread backend, bit for bit, and against closed forms. */
@Slow
class SparkLocalModeTest {

    private static final double[][] DATA = SyntheticData.normalRows(41, 15, new double[] {0.8, -0.3}, 1.5);
    private static final ModelSource SOURCE = new NormalMeanSource(DATA, 1.5, 0.0, 2.0);
    private static JavaSparkContext context;

    @BeforeAll
    static void start() {
        context = SparkBackend.start("local[2]", "skerry-test", 0, Map.of("spark.driver.host", "127.0.0.1",
                "spark.driver.bindAddress", "127.0.0.1")).context();
    }

    @AfterAll
    static void stop() {
        context.stop();
    }

    private static List<String> fingerprint(SamplerResult result) {
        List<String> lines = new ArrayList<>();
        lines.add(Double.toHexString(result.evidence().logEvidence()));
        for (ParameterSummary p : result.parameters()) {
            lines.add(p.toString());
        }
        for (IterationRecord r : result.iterations()) {
            lines.add(r.iteration() + " " + Double.toHexString(r.temperature()) + " " + Double.toHexString(r.ess()) + " "
                    + r.resampled() + " " + r.distinctAncestors() + " " + Double.toHexString(r.acceptanceRate()) + " "
                    + r.mhSteps() + " " + r.evaluations());
        }
        return lines;
    }

    private static SamplerResult onThreads(SamplerSettings settings) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            return new SmcSampler(settings).run(SOURCE, backend, IterationListener.NONE);
        }
    }

    private static SamplerResult onSpark(SamplerSettings settings, int partitions) {
        SparkBackend backend = SparkBackend.on(context, partitions);
        return new SmcSampler(settings).run(SOURCE, backend, IterationListener.NONE);
    }

    @ParameterizedTest
    @EnumSource(ResamplingScheme.class)
    @DisplayName("global mode: bit-identical to the thread backend for 1, 3 and 8 partitions")
    void bitIdentical(ResamplingScheme scheme) {
        SamplerSettings settings = SamplerSettings.builder().particles(240).seed(17).resamplingScheme(scheme).build();
        SamplerResult reference = onThreads(settings);
        for (int partitions : new int[] {1, 3, 8}) {
            SamplerResult spark = onSpark(settings, partitions);
            assertEquals(fingerprint(reference), fingerprint(spark), scheme + ", " + partitions + " partitions");
            assertArrayEquals(reference.particles().values(), spark.particles().values());
            assertArrayEquals(reference.normalisedWeights(), spark.normalisedWeights());
        }
    }

    @Test
    @DisplayName("data tempering: bit-identical to the thread backend for 1, 3 and 8 partitions")
    void dataTemperingBitIdentical() {
        SamplerSettings settings = SamplerSettings.builder().particles(240).seed(19)
                .targets(SequenceSettings.adaptiveBatches(5, 0.5)).build();
        SamplerResult reference = onThreads(settings);
        assertTrue(reference.iterations().size() > 2, "several batches: " + reference.iterations().size());
        for (int partitions : new int[] {1, 3, 8}) {
            SamplerResult spark = onSpark(settings, partitions);
            assertEquals(fingerprint(reference), fingerprint(spark), partitions + " partitions");
            assertArrayEquals(reference.particles().values(), spark.particles().values());
            assertArrayEquals(reference.normalisedWeights(), spark.normalisedWeights());
        }
    }

    @Test
    @DisplayName("ABC (MAD-scaled distance, M = 2; uniform and Gaussian kernels): bit-identical to the thread backend "
            + "for 1, 3 and 8 partitions, tolerances and simulations included")
    void abcBitIdentical() {
        ModelSource source = new SimulatorSource(new double[] {0.4, 1.9, 1.1, 0.7, 1.6});
        for (AbcKernel kernel : AbcKernel.values()) {
            SamplerSettings settings = SamplerSettings.builder().particles(240).seed(23)
                    .targets(SequenceSettings.abc(AbcSettings.of(0.05).withSimulations(2).withKernel(kernel))).build();
            SamplerResult reference;
            try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
                reference = new SmcSampler(settings).run(source, backend, IterationListener.NONE);
            }
            assertTrue(reference.iterations().size() > 3, "several tolerances: " + reference.iterations().size());
            for (int partitions : new int[] {1, 3, 8}) {
                SamplerResult spark = new SmcSampler(settings).run(source, SparkBackend.on(context, partitions),
                        IterationListener.NONE);
                String where = kernel + ", " + partitions + " partitions";
                assertEquals(fingerprint(reference), fingerprint(spark), where);
                assertEquals(reference.iterations().stream().map(r -> String.valueOf(r.abc())).toList(),
                        spark.iterations().stream().map(r -> String.valueOf(r.abc())).toList(), where);
                assertArrayEquals(reference.particles().values(), spark.particles().values(), where);
                assertArrayEquals(reference.normalisedWeights(), spark.normalisedWeights(), where);
            }
        }
    }

    @Test
    @DisplayName("a model is dropped from the workers when its population closes")
    void modelDroppedAtEnd() {
        ModelSource source = new NormalMeanSource(DATA, 1.25, 0.0, 2.0);
        int before = ModelCache.size();
        SamplerResult result = new SmcSampler(SamplerSettings.builder().particles(120).seed(5).build())
                .run(source, SparkBackend.on(context, 3), IterationListener.NONE);
        assertTrue(result.iterations().size() > 1);
        assertEquals(before, ModelCache.size(), "the run's model is no longer cached");
    }

    @Test
    @DisplayName("rebalancing moves the minimum: recorded per iteration, and zero with one partition")
    void particlesMoved() {
        SamplerSettings settings = SamplerSettings.builder().particles(300).seed(3).build();
        SamplerResult one = onSpark(settings, 1);
        SamplerResult eight = onSpark(settings, 8);
        one.iterations().forEach(r -> assertEquals(0, r.particlesMoved()));
        assertTrue(eight.iterations().stream().anyMatch(r -> r.particlesMoved() > 0), "eight partitions move some");
        assertTrue(eight.iterations().stream().allMatch(r -> r.particlesMoved() <= 300));
    }

    @Test
    @DisplayName("conjugate model on Spark: evidence against the closed form (Bishop PRML eq. 2.115), 10 seeds, 4 SE")
    void closedFormEvidence() {
        double exact = new NormalMeanExact(DATA, 1.5, 0.0, 2.0).logEvidence();
        SummaryStatistics logZ = new SummaryStatistics();
        for (int s = 0; s < 10; s++) {
            logZ.addValue(onSpark(SamplerSettings.builder().particles(500).seed(500 + s).build(), 4).evidence().logEvidence());
        }
        double corrected = logZ.getMean() + 0.5 * logZ.getVariance();
        double error = 4 * logZ.getStandardDeviation() / Math.sqrt(logZ.getN());
        assertEquals(exact, corrected, error);
    }

    @Test
    @DisplayName("a model that cannot be rebuilt on executors is refused with a message saying how to fix it")
    void localModelRefused() {
        SparkBackend backend = SparkBackend.on(context, 2);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new SmcSampler(
                SamplerSettings.builder().particles(20).build()).run(NormalMeanModel.of(DATA, 1.5, 0, 2), backend));
        assertTrue(e.getMessage().contains("model.name or model.class"), e.getMessage());
    }

    @Test
    @DisplayName("island mode: identical on threads and on Spark, whatever the placement of the islands")
    void islandsIdentical() {
        SamplerSettings settings = SamplerSettings.builder().particles(200).seed(23).islands(4).build();
        SamplerResult reference = onThreads(settings);
        SamplerResult spark = onSpark(settings, 0);
        assertEquals(fingerprint(reference), fingerprint(spark));
        assertEquals(reference.evidence(), spark.evidence());
        assertArrayEquals(reference.particles().values(), spark.particles().values());
        assertTrue(spark.evidence().islandStandardError() > 0);
    }
}
