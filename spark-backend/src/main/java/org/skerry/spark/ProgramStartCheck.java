package org.skerry.spark;

import java.net.InetAddress;
import java.net.UnknownHostException;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.spark.SparkEnv;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.program.ProgramModel;
import org.skerry.engine.program.ProgramStartException;

/**
 * Checks before a run that every executor can start the model program and complete its
 * handshake: on a cluster the program, its interpreter and its files must exist on every node
 * (a shared path), and one node without them would otherwise only show up as invalid evaluations
 * there. Tasks spread over the executors as {@link CheckpointVisibility}'s do; the first task in
 * each executor JVM starts one worker and ends it, the others wait for its answer, so every slot
 * is kept busy while the check runs and the scheduler must use every executor.
 */
public final class ProgramStartCheck {

    /** Each executor JVM's answer per model source: empty when the program started, else the failure. */
    private static final ConcurrentHashMap<String, String> ANSWERS = new ConcurrentHashMap<>();

    private ProgramStartCheck() {
    }

    /**
     * Does nothing for a model that is not a program.
     *
     * @throws IllegalArgumentException naming each executor (and host) where the program cannot
     *     start, with the program's own error
     */
    public static void check(JavaSparkContext context, ModelSource source) {
        int tasks = Math.max(2, 2 * context.defaultParallelism());
        List<Integer> slots = new ArrayList<>();
        for (int i = 0; i < tasks; i++) {
            slots.add(i);
        }
        List<String> answers = context.parallelize(slots, tasks).map(slot -> answer(source)).collect();
        TreeSet<String> failures = new TreeSet<>(answers);
        failures.remove("");
        if (!failures.isEmpty()) {
            throw new IllegalArgumentException("the model program cannot start on every executor: "
                    + String.join("; ", failures) + ". On a cluster the program, its interpreter and its files must be "
                    + "at the same path on every node (a shared file system), and on the executors' PATH when named "
                    + "without a folder");
        }
    }

    private static String answer(ModelSource source) {
        return ANSWERS.computeIfAbsent(source.id(), id -> {
            String where = "executor " + SparkEnv.get().executorId() + " on " + host();
            Model model;
            try {
                model = source.create();
            } catch (RuntimeException | LinkageError e) {
                return where + ": the model cannot be built there: " + e.getMessage();
            }
            if (!(model instanceof ProgramModel)) {
                return "";
            }
            try {
                ((ProgramModel) model).probe();
                return "";
            } catch (ProgramStartException e) {
                return where + ": " + e.getMessage().replace('\n', ' ');
            }
        });
    }

    /** The executor's address as Spark knows it (several executors may share one machine name). */
    private static String host() {
        try {
            return SparkEnv.get().blockManager().blockManagerId().host();
        } catch (RuntimeException e) {
            try {
                return InetAddress.getLocalHost().getHostName();
            } catch (UnknownHostException unknown) {
                return "an unknown host";
            }
        }
    }
}
