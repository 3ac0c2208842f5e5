package org.skerry.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerJobStart;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.Population;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.Redistribution;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.Checkpointer;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SamplerState;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.sampler.StopCondition;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.checkpoint.CheckpointFileSystem;
import org.skerry.checkpoint.CheckpointFolder;
import org.skerry.checkpoint.FileCheckpointer;

/**
 * How many Spark jobs one iteration starts, counted by a {@link SparkListener}: each small job
 * costs a fixed latency that dominates short iterations, so the fused data flow of
 * {@link SparkBlocks} must not silently fall back to more. Jobs are attributed to iterations
 * by a local property the test sets at the end of each iteration (it travels with the job's
 * submission, so the count does not depend on when the listener bus delivers the event).
 */
@Slow
class SparkJobCountTest {

    private static final String LABEL = "skerry.test.iteration";
    private static final double[][] DATA = SyntheticData.normalRows(41, 15, new double[] {0.8, -0.3}, 1.5);
    private static final ModelSource SOURCE = new NormalMeanSource(DATA, 1.5, 0.0, 2.0);
    private static JavaSparkContext context;
    private static final JobCounter COUNTER = new JobCounter();

    @TempDir
    Path dir;

    /** Job starts per label; a latch for the end marker, after which every earlier event has arrived. */
    static final class JobCounter extends SparkListener {
        final Map<String, Integer> jobs = new ConcurrentHashMap<>();
        volatile CountDownLatch end = new CountDownLatch(1);
        volatile String endLabel = "";

        @Override
        public void onJobStart(SparkListenerJobStart start) {
            String label = start.properties() == null ? null : start.properties().getProperty(LABEL);
            if (label == null) {
                return;
            }
            if (label.equals(endLabel)) {
                end.countDown();
            } else {
                jobs.merge(label, 1, Integer::sum);
            }
        }
    }

    @BeforeAll
    static void start() {
        context = SparkBackend.start("local[2]", "skerry-job-count-test", 0, Map.of("spark.driver.host", "127.0.0.1",
                "spark.driver.bindAddress", "127.0.0.1")).context();
        context.sc().addSparkListener(COUNTER);
    }

    @AfterAll
    static void stop() {
        context.stop();
    }

    /** Runs the sampler and returns its records with the jobs each iteration started (index = iteration). */
    private List<Integer> jobsPerIteration(SamplerSettings settings, int partitions, Checkpointer checkpointer,
            List<IterationRecord> records) throws InterruptedException {
        return jobsPerIteration(SOURCE, settings, partitions, checkpointer, records);
    }

    private List<Integer> jobsPerIteration(ModelSource source, SamplerSettings settings, int partitions,
            Checkpointer checkpointer, List<IterationRecord> records) throws InterruptedException {
        return jobsPerIteration(source, settings, partitions, TaskGrouping.perBlock(), checkpointer, records);
    }

    private List<Integer> jobsPerIteration(ModelSource source, SamplerSettings settings, int partitions,
            TaskGrouping grouping, Checkpointer checkpointer, List<IterationRecord> records)
            throws InterruptedException {
        String run = "run-" + System.nanoTime() + "-";
        COUNTER.jobs.clear();
        context.setLocalProperty(LABEL, run + 0);
        SamplerResult result = new SmcSampler(settings).run(source, SparkBackend.on(context, partitions, grouping),
                record -> context.setLocalProperty(LABEL, run + (record.iteration() + 1)), checkpointer,
                StopCondition.NEVER);
        COUNTER.endLabel = run + "end";
        COUNTER.end = new CountDownLatch(1);
        context.setLocalProperty(LABEL, COUNTER.endLabel);
        context.parallelize(List.of(1), 1).count();
        context.setLocalProperty(LABEL, null);
        assertTrue(COUNTER.end.await(60, TimeUnit.SECONDS), "the listener bus delivered the end marker");
        records.addAll(result.iterations());
        List<Integer> counts = new ArrayList<>();
        for (IterationRecord record : result.iterations()) {
            counts.add(COUNTER.jobs.getOrDefault(run + record.iteration(), 0));
        }
        System.out.println("jobs per iteration (" + settings.resampling().scheme() + ", " + partitions + " partitions, "
                + (checkpointer.enabled() ? "checkpoints" : "no checkpoints") + "): " + counts + "; resampled "
                + records.stream().map(r -> r.resampled() ? "y" : "n").toList() + "; MH steps "
                + records.stream().map(IterationRecord::mhSteps).toList());
        return counts;
    }

    /**
     * The figure the fusion reaches: a global resampling costs the weight totals and one job that
     * expands, redistributes and sums moments (one more for the residual scheme's split); an island
     * resampling one job, which also sums the moments; without resampling one job sums moments; moves take one job, two with the adaptive pilot; a
     * checkpoint one more (the write; the read-back is computed by the next job). The tempering
     * inputs come with the last move's report, unless the pilot was the only move (one job then).
     */
    private static int allowed(List<IterationRecord> records, int k, boolean fixedSteps, ResamplingScheme scheme,
            boolean checkpoints) {
        return allowed(records, k, fixedSteps, scheme, checkpoints, false);
    }

    private static int allowed(List<IterationRecord> records, int k, boolean fixedSteps, ResamplingScheme scheme,
            boolean checkpoints, boolean islands) {
        IterationRecord record = records.get(k);
        int jobs = record.resampled() && !islands ? (scheme == ResamplingScheme.RESIDUAL ? 3 : 2) : 1;
        jobs += fixedSteps || record.mhSteps() == 1 ? 1 : 2;
        jobs += checkpoints ? 1 : 0;
        boolean inputsDelivered = k == 1 || fixedSteps || records.get(k - 1).mhSteps() > 1;
        return jobs + (inputsDelivered ? 0 : 1);
    }

    @Test
    @DisplayName("an exchange's result is not cached: one cached copy of the population when the next step starts")
    void exchangeNotCached() {
        long[] first = {0, 20, 25};
        int[] sizes = {20, 5, 5};
        int before = context.getPersistentRDDs().size();
        try (BlockExecutor blocks = SparkBackend.on(context, 3).open(SOURCE, 30, 3)) {
            blocks.create(first, sizes, cursor -> null);
            assertEquals(before + 1, context.getPersistentRDDs().size(), "cached after the draw");
            blocks.exchange(Redistribution.plan(BlockLayout.of(first, sizes)));
            // Before this change the exchange's result was cached too: two copies, three during the step.
            assertEquals(before + 1, context.getPersistentRDDs().size(), "cached after the exchange");
            List<Long> firstAfter = blocks.update(cursor -> cursor.block().index()[0]);
            assertEquals(List.of(0L, 10L, 20L), firstAfter, "the step ran on the exchanged blocks");
            assertEquals(before + 1, context.getPersistentRDDs().size(), "cached after the step");
        }
        assertEquals(before, context.getPersistentRDDs().size(), "nothing cached once closed");
    }

    @Test
    @DisplayName("fixed schedule and steps, resampling every iteration: at most 3 jobs an iteration")
    void fixedScheduleAndSteps() throws InterruptedException {
        SamplerSettings settings = SamplerSettings.builder().particles(240).seed(5)
                .temperatureRule(FixedSchedule.power(4, 3.0)).fixedSteps(2).resampleEveryIteration(true)
                .resamplingScheme(ResamplingScheme.SYSTEMATIC).build();
        List<IterationRecord> records = new ArrayList<>();
        List<Integer> counts = jobsPerIteration(settings, 3, Checkpointer.NONE, records);
        assertEquals(5, counts.size());
        assertTrue(counts.get(0) <= 1, "the initial draw delivers the tempering inputs: " + counts);
        for (int k = 1; k < counts.size(); k++) {
            assertTrue(counts.get(k) <= 3, "iteration " + k + " started " + counts.get(k) + " jobs: " + counts);
        }
    }

    @Test
    @DisplayName("adaptive tempering and steps, every scheme, 8 partitions: within the fused figure")
    void adaptive() throws InterruptedException {
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            SamplerSettings settings = SamplerSettings.builder().particles(240).seed(17).resamplingScheme(scheme)
                    .build();
            List<IterationRecord> records = new ArrayList<>();
            List<Integer> counts = jobsPerIteration(settings, 8, Checkpointer.NONE, records);
            assertTrue(records.stream().anyMatch(IterationRecord::resampled), "the run resamples at least once");
            for (int k = 1; k < counts.size(); k++) {
                int allowed = allowed(records, k, false, scheme, false);
                assertTrue(counts.get(k) <= allowed, scheme + ", iteration " + k + " started " + counts.get(k)
                        + " jobs, more than " + allowed + ": " + counts);
            }
        }
    }

    @Test
    @DisplayName("blocks grouped into tasks (8 blocks in 3 groups, every scheme): the same figure as a task per block")
    void grouped() throws InterruptedException {
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            SamplerSettings settings = SamplerSettings.builder().particles(240).seed(17).resamplingScheme(scheme)
                    .build();
            List<IterationRecord> records = new ArrayList<>();
            List<Integer> counts = jobsPerIteration(SOURCE, settings, 8, TaskGrouping.perExecutor(3), Checkpointer.NONE,
                    records);
            assertTrue(records.stream().anyMatch(IterationRecord::resampled), "the run resamples at least once");
            for (int k = 1; k < counts.size(); k++) {
                int allowed = allowed(records, k, false, scheme, false);
                assertTrue(counts.get(k) <= allowed, scheme + ", iteration " + k + " started " + counts.get(k)
                        + " jobs, more than " + allowed + ": " + counts);
            }
        }
    }

    @Test
    @DisplayName("island mode: one job reweights, resamples the islands and sums the moments")
    void islands() throws InterruptedException {
        SamplerSettings settings = SamplerSettings.builder().particles(240).seed(23).islands(4).build();
        List<IterationRecord> records = new ArrayList<>();
        List<Integer> counts = jobsPerIteration(settings, 0, Checkpointer.NONE, records);
        assertTrue(records.stream().anyMatch(IterationRecord::resampled), "the run resamples at least once");
        for (int k = 1; k < counts.size(); k++) {
            int allowed = allowed(records, k, false, settings.resampling().scheme(), false, true);
            assertTrue(counts.get(k) <= allowed, "iteration " + k + " started " + counts.get(k) + " jobs, more than "
                    + allowed + ": " + counts);
        }
    }

    @Test
    @DisplayName("with a checkpoint every iteration: one job more (the write), and the lineage starts at the files")
    void checkpoints() throws Exception {
        SamplerSettings settings = SamplerSettings.builder().particles(240).seed(29).build();
        CheckpointFolder folder = new CheckpointFolder(new CheckpointFileSystem(dir.toUri().toString(), Map.of()), 2);
        FileCheckpointer files = new FileCheckpointer(folder, 1, 0, Map.of(), s -> { });
        List<String> lineages = new ArrayList<>();
        Checkpointer watched = new Checkpointer() {
            @Override
            public boolean due(int iteration) {
                return files.due(iteration);
            }

            @Override
            public void write(SamplerState state, Population population) {
                files.write(state, population);
                lineages.add(((SparkBlocks) population.executor()).lineage());
            }
        };
        List<IterationRecord> records = new ArrayList<>();
        List<Integer> counts = jobsPerIteration(settings, 3, watched, records);
        for (int k = 1; k < counts.size(); k++) {
            int allowed = allowed(records, k, false, settings.resampling().scheme(), true);
            assertTrue(counts.get(k) <= allowed, "iteration " + k + " started " + counts.get(k) + " jobs, more than "
                    + allowed + ": " + counts);
        }
        // After every checkpoint the population is the files read back: the block list, its read
        // and the check that it read — never the draws, moves or shuffles that made the blocks.
        assertEquals(records.size(), lineages.size());
        for (String lineage : lineages) {
            assertEquals(3, lineage.split("RDD\\[", -1).length - 1, lineage);
            assertTrue(lineage.contains("ParallelCollectionRDD") && !lineage.contains("Shuffle"), lineage);
        }
    }

    @Test
    @DisplayName("ABC, M = 2, adaptive tolerances, adaptive or fixed steps: the step's gathering of the kept "
            + "summaries is the one job more than a likelihood iteration")
    void abc() throws InterruptedException {
        ModelSource source = new SimulatorSource(new double[] {0.4, 1.9, 1.1, 0.7, 1.6});
        for (boolean fixedSteps : new boolean[] {false, true}) {
            AbcSettings abc = AbcSettings.of(0.05).withSimulations(2);
            SamplerSettings settings = SamplerSettings.builder().particles(240).seed(31)
                    .targets(SequenceSettings.abc(fixedSteps ? abc.withSteps(2) : abc)).build();
            List<IterationRecord> records = new ArrayList<>();
            List<Integer> counts = jobsPerIteration(source, settings, 3, Checkpointer.NONE, records);
            assertTrue(counts.size() > 3, "several tolerances: " + counts);
            assertTrue(records.stream().anyMatch(IterationRecord::resampled), "the run resamples at least once");
            for (int k = 1; k < counts.size(); k++) {
                int allowed = abcAllowed(records, k, fixedSteps);
                assertTrue(counts.get(k) <= allowed, (fixedSteps ? "fixed" : "adaptive") + " steps, iteration " + k
                        + " started " + counts.get(k) + " jobs, more than " + allowed + ": " + counts);
            }
        }
    }

    /**
     * An ABC iteration: one job gathers every particle's kept summaries (the ABC step needs M·s
     * numbers a particle, not the two scalars the tempering inputs are); the reweighting from them
     * is deferred into the next job; then resampling and moves as in a likelihood iteration. The
     * move report's tempering inputs are not used, so no job is saved or added by them.
     */
    private static int abcAllowed(List<IterationRecord> records, int k, boolean fixedSteps) {
        IterationRecord record = records.get(k);
        int jobs = 1;
        jobs += record.resampled() ? 2 : 1;
        jobs += fixedSteps || record.mhSteps() == 1 ? 1 : 2;
        return jobs;
    }
}
