package org.skerry.cli.scaling;

import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;
import org.apache.spark.SparkConf;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerStageSubmitted;
import org.apache.spark.scheduler.SparkListenerTaskEnd;
import org.apache.spark.scheduler.StageInfo;

/**
 * Counts the bytes the driver receives from tasks during a run: the sum over finished tasks of
 * Spark's {@code TaskMetrics.resultSize} (the serialised size of each task's result, whether sent
 * directly or fetched from an executor's block manager). It counts the results of collected jobs
 * — per-particle scalars for tempering, per-block reports, sums and tallies — and not shuffle
 * data (surplus particles go executor to executor), broadcasts or Spark's own heartbeats.
 * Stages started from {@code SparkBlocks.forEachBlock} (the final particles, N × d values once per
 * run) are counted apart, so the per-iteration figure shows what the sampler loop costs.
 *
 * <p>Spark creates it from {@code spark.extraListeners}; the study, which runs one point at a time
 * in this JVM, takes the newest instance after each run, when the stopped context has delivered
 * every event.
 */
public final class DriverTraffic extends SparkListener {

    private static final AtomicReference<DriverTraffic> NEWEST = new AtomicReference<>();

    private final Map<Integer, Boolean> exportStages = new ConcurrentHashMap<>();
    private final AtomicLong loopBytes = new AtomicLong();
    private final AtomicLong exportBytes = new AtomicLong();
    private final AtomicLong tasks = new AtomicLong();
    private final AtomicLong maxTasksPerStage = new AtomicLong();

    /** Called by Spark, which passes its configuration to listeners that take one. */
    public DriverTraffic(SparkConf conf) {
        NEWEST.set(this);
    }

    /** The listener of the newest Spark context in this JVM, or null; clears it. */
    static DriverTraffic takeNewest() {
        return NEWEST.getAndSet(null);
    }

    @Override
    public void onStageSubmitted(SparkListenerStageSubmitted event) {
        StageInfo stage = event.stageInfo();
        boolean export = stage.details() != null && stage.details().contains("SparkBlocks.forEachBlock");
        exportStages.put(stage.stageId(), export);
        maxTasksPerStage.accumulateAndGet(stage.numTasks(), Math::max);
    }

    @Override
    public void onTaskEnd(SparkListenerTaskEnd event) {
        if (event.taskMetrics() == null) {
            return;
        }
        long bytes = event.taskMetrics().resultSize();
        tasks.incrementAndGet();
        if (exportStages.getOrDefault(event.stageId(), false)) {
            exportBytes.addAndGet(bytes);
        } else {
            loopBytes.addAndGet(bytes);
        }
    }

    /** Bytes of task results during the sampler run, the final export excepted. */
    long loopBytes() {
        return loopBytes.get();
    }

    /** Bytes of task results of the final export of the particles. */
    long exportBytes() {
        return exportBytes.get();
    }

    /** The most tasks of one stage: the population's partition count. */
    long partitions() {
        return maxTasksPerStage.get();
    }
}
