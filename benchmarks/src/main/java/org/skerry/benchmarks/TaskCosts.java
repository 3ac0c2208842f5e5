package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.spark.executor.TaskMetrics;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerJobStart;
import org.apache.spark.scheduler.SparkListenerTaskEnd;
import org.apache.spark.scheduler.TaskInfo;

/**
 * Spark's own per-task metrics, grouped by the sampler iteration whose jobs ran the tasks: executor
 * deserialise time, executor run time, result serialisation time and scheduler delay (the task's
 * duration less what the executor spent on it and the result fetch, as Spark's web UI computes it).
 * The iteration is whatever {@link #iteration} says when a job starts; the driver sets it from
 * the sampler's iteration listener.
 */
final class TaskCosts extends SparkListener {

    /** The iteration the next jobs belong to (−1: the initial draw). */
    volatile int iteration = -1;
    private final Map<Integer, Integer> stageIteration = new ConcurrentHashMap<>();
    private final Map<Integer, Totals> byIteration = new ConcurrentHashMap<>();
    private final Map<Integer, Integer> jobsByIteration = new ConcurrentHashMap<>();
    /** The most RDDs a stage of the iteration's jobs held: how far its tasks' lineage reaches. */
    private final Map<Integer, Integer> rddsByIteration = new ConcurrentHashMap<>();

    /** Sums over the tasks of one iteration, in milliseconds. */
    static final class Totals {
        long tasks;
        double deserialise;
        double run;
        double resultSerialise;
        double schedulerDelay;
        double duration;

        synchronized void add(TaskInfo info, TaskMetrics metrics) {
            tasks++;
            deserialise += metrics.executorDeserializeTime();
            run += metrics.executorRunTime();
            resultSerialise += metrics.resultSerializationTime();
            double total = info.duration();
            duration += total;
            schedulerDelay += Math.max(0, total - metrics.executorRunTime() - metrics.executorDeserializeTime()
                    - metrics.resultSerializationTime() - info.gettingResultTime());
        }
    }

    @Override
    public void onJobStart(SparkListenerJobStart job) {
        int it = iteration;
        jobsByIteration.merge(it, 1, Integer::sum);
        for (Object stage : scala.jdk.javaapi.CollectionConverters.asJava(job.stageIds())) {
            stageIteration.put((Integer) stage, it);
        }
    }

    @Override
    public void onStageSubmitted(org.apache.spark.scheduler.SparkListenerStageSubmitted stage) {
        int it = stageIteration.getOrDefault(stage.stageInfo().stageId(), -2);
        rddsByIteration.merge(it, stage.stageInfo().rddInfos().size(), Math::max);
    }

    @Override
    public void onTaskEnd(SparkListenerTaskEnd task) {
        if (task.taskMetrics() == null) {
            return;
        }
        int it = stageIteration.getOrDefault(task.stageId(), -2);
        byIteration.computeIfAbsent(it, k -> new Totals()).add(task.taskInfo(), task.taskMetrics());
    }

    void reset() {
        iteration = -1;
        stageIteration.clear();
        byIteration.clear();
        jobsByIteration.clear();
        rddsByIteration.clear();
    }

    /** One line per iteration: tasks, jobs, and mean milliseconds per task of each part. */
    List<String> lines() {
        List<String> lines = new ArrayList<>();
        for (Map.Entry<Integer, Totals> entry : new TreeMap<>(byIteration).entrySet()) {
            Totals t = entry.getValue();
            double n = Math.max(1, t.tasks);
            lines.add(String.format(Locale.ROOT, "    after record %3d: %2d jobs %5d tasks, %3d RDDs in a stage; per task ms: deserialise %.3f, "
                    + "run %.3f, result serialise %.3f, scheduler delay %.3f, duration %.3f", entry.getKey(),
                    jobsByIteration.getOrDefault(entry.getKey(), 0), t.tasks,
                    rddsByIteration.getOrDefault(entry.getKey(), 0), t.deserialise / n, t.run / n,
                    t.resultSerialise / n, t.schedulerDelay / n, t.duration / n));
        }
        return lines;
    }

    /** Mean per task over every iteration after the initial draw: deserialise, run, scheduler delay, duration. */
    double[] loopMeans() {
        double tasks = 0;
        double[] sums = new double[4];
        for (Map.Entry<Integer, Totals> entry : byIteration.entrySet()) {
            if (entry.getKey() < 0) {
                continue;
            }
            Totals t = entry.getValue();
            tasks += t.tasks;
            sums[0] += t.deserialise;
            sums[1] += t.run;
            sums[2] += t.schedulerDelay;
            sums[3] += t.duration;
        }
        for (int i = 0; i < sums.length; i++) {
            sums[i] /= Math.max(1, tasks);
        }
        return sums;
    }
}
