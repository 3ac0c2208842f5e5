package org.skerry.spark;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.spark.api.java.JavaSparkContext;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.Redistribution;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * Blocks grouped into tasks ({@link TaskGrouping#perExecutor}) on a context whose tasks take both
 * cores ({@code spark.task.cpus = 2}): the same bytes as the thread backend and as a task per
 * block, for block counts the group count does not divide, and an exchange whose runs cross groups
 * and stay inside one.
 */
@Slow
class GroupedTasksTest {

    private static final double[][] DATA = SyntheticData.normalRows(41, 15, new double[] {0.8, -0.3}, 1.5);
    private static final ModelSource SOURCE = new NormalMeanSource(DATA, 1.5, 0.0, 2.0);
    private static JavaSparkContext context;

    @BeforeAll
    static void start() {
        context = SparkBackend.start("local[2]", "skerry-grouped-test", 0, TaskGrouping.perExecutor(0),
                Map.of("spark.driver.host", "127.0.0.1", "spark.driver.bindAddress", "127.0.0.1",
                        "spark.task.cpus", "2")).context();
    }

    @AfterAll
    static void stop() {
        context.stop();
    }

    private static List<String> fingerprint(SamplerResult result) {
        List<String> lines = new ArrayList<>();
        lines.add(Double.toHexString(result.evidence().logEvidence()));
        for (IterationRecord r : result.iterations()) {
            lines.add(r.iteration() + " " + Double.toHexString(r.temperature()) + " " + Double.toHexString(r.ess()) + " "
                    + r.resampled() + " " + r.distinctAncestors() + " " + Double.toHexString(r.acceptanceRate()) + " "
                    + r.mhSteps() + " " + r.evaluations());
        }
        return lines;
    }

    @Test
    @DisplayName("global mode, every scheme: bit-identical to threads and to a task per block for (blocks, groups) "
            + "(1, 1), (3, 2), (8, 3), (13, 5), (8, one per executor)")
    void bitIdentical() {
        int[][] layouts = {{1, 1}, {3, 2}, {8, 3}, {13, 5}, {8, 0}};
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            SamplerSettings settings = SamplerSettings.builder().particles(240).seed(17).resamplingScheme(scheme).build();
            SamplerResult reference;
            try (ThreadPoolBackend threads = new ThreadPoolBackend(2, 0)) {
                reference = new SmcSampler(settings).run(SOURCE, threads, IterationListener.NONE);
            }
            assertTrue(reference.iterations().stream().anyMatch(IterationRecord::resampled), "the run resamples");
            SamplerResult perBlock = new SmcSampler(settings).run(SOURCE, SparkBackend.on(context, 8),
                    IterationListener.NONE);
            assertEquals(fingerprint(reference), fingerprint(perBlock), scheme + ", a task per block");
            for (int[] layout : layouts) {
                String where = scheme + ", " + layout[0] + " blocks in " + layout[1] + " groups";
                SamplerResult grouped = new SmcSampler(settings).run(SOURCE,
                        SparkBackend.on(context, layout[0], TaskGrouping.perExecutor(layout[1])), IterationListener.NONE);
                assertEquals(fingerprint(reference), fingerprint(grouped), where);
                assertArrayEquals(reference.particles().values(), grouped.particles().values(), where);
                assertArrayEquals(reference.normalisedWeights(), grouped.normalisedWeights(), where);
                if (layout[0] > 1) {
                    assertTrue(grouped.iterations().stream().anyMatch(r -> r.particlesMoved() > 0), where + " moves runs");
                }
            }
        }
    }

    @Test
    @DisplayName("an exchange with runs inside a group and across groups: the thread backend's blocks, results in "
            + "block order, untouched blocks kept")
    void exchangeAcrossGroups() {
        // Five blocks in two groups ({0, 1}, {2, 3, 4}): block 0 is large, so runs leave it for its own
        // group's block 1 and for the other group; block 4 is empty and receives.
        long[] first = {0, 40, 45, 50, 60};
        int[] sizes = {40, 5, 5, 10, 0};
        Redistribution plan = Redistribution.plan(BlockLayout.of(first, sizes));
        ParticleBlock[] expected = new ParticleBlock[first.length];
        for (int b = 0; b < first.length; b++) {
            expected[b] = ParticleBlock.indexed(2, first[b], sizes[b]);
            for (int i = 0; i < sizes[b]; i++) {
                expected[b].values()[2 * i] = first[b] + i;
            }
        }
        expected = plan.apply(expected);
        try (BlockExecutor blocks = SparkBackend.on(context, 5, TaskGrouping.perExecutor(2)).open(SOURCE, 60, 5)) {
            assertEquals(2, ((SparkBlocks) blocks).groupCount());
            blocks.create(first, sizes, cursor -> {
                ParticleBlock block = cursor.block();
                for (int i = 0; i < block.size(); i++) {
                    block.values()[2 * i] = block.index()[i];
                }
                return cursor.number();
            });
            blocks.exchange(plan);
            List<long[]> indices = blocks.update(cursor -> cursor.current().index().clone());
            List<double[]> values = blocks.read(cursor -> java.util.Arrays.copyOf(cursor.current().values(),
                    2 * cursor.current().size()));
            assertEquals(List.of(0, 1, 2, 3, 4), blocks.read(cursor -> cursor.number()));
            for (int b = 0; b < first.length; b++) {
                assertArrayEquals(java.util.Arrays.copyOf(expected[b].index(), expected[b].size()), indices.get(b),
                        "block " + b);
                assertArrayEquals(java.util.Arrays.copyOf(expected[b].values(), 2 * expected[b].size()), values.get(b),
                        "block " + b);
            }
            assertTrue(plan.transferCount() >= 3, "several runs move: " + plan.transferCount());
        }
    }

    /** Threads seen working blocks (local mode: the executor is this JVM). */
    private static final Map<String, Boolean> SEEN = new ConcurrentHashMap<>();

    @Test
    @DisplayName("blocks of a group run on two threads at once, and a failing block fails the step with its message")
    void threadsAndFailures() {
        try (BlockExecutor blocks = SparkBackend.on(context, 6, TaskGrouping.perExecutor(1)).open(SOURCE, 60, 6)) {
            blocks.create(new long[] {0, 10, 20, 30, 40, 50}, new int[] {10, 10, 10, 10, 10, 10}, cursor -> null);
            SEEN.clear();
            List<String> names = blocks.read(cursor -> {
                SEEN.put(Thread.currentThread().getName(), true);
                // Hold each block until a second thread has taken one (or 30 s pass): a helper that
                // never started would leave the first thread to work every block alone.
                long end = System.nanoTime() + 30_000_000_000L;
                while (SEEN.size() < 2 && System.nanoTime() < end) {
                    Thread.onSpinWait();
                }
                return Thread.currentThread().getName();
            });
            assertEquals(2, new java.util.HashSet<>(names).size(), "two threads worked the group: " + names);
            Exception e = assertThrows(Exception.class, () -> blocks.read(cursor -> {
                if (cursor.number() == 4) {
                    throw new IllegalStateException("block four is broken");
                }
                return 0;
            }));
            assertTrue(String.valueOf(e.getMessage()).contains("block four is broken"), e.getMessage());
        }
    }
}
