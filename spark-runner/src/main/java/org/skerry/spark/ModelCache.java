package org.skerry.spark;

import java.util.concurrent.ConcurrentHashMap;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;

/**
 * Executor side: one model per model source and JVM, built on first use, so a costly model set-up
 * (reading data, precomputing) happens once per executor, not once per task.
 */
final class ModelCache {

    private static final ConcurrentHashMap<String, Model> MODELS = new ConcurrentHashMap<>();

    private ModelCache() {
    }

    static Model get(ModelSource source) {
        return MODELS.computeIfAbsent(source.id(), id -> {
            try {
                return source.create();
            } catch (RuntimeException | LinkageError e) {
                throw failure(e, org.apache.spark.SparkEnv.get().executorId());
            }
        });
    }

    /**
     * What a task reports when the model cannot be built on executor {@code executorId}: a class
     * missing there (its jar not shipped) as a {@link ModelClassMissingException}, which carries
     * no stack trace, since Spark logs every failed task's trace and the trace says nothing the
     * message does not; anything else with its cause.
     */
    static RuntimeException failure(Throwable e, String executorId) {
        String missing = missingClass(e);
        if (missing != null) {
            return new ModelClassMissingException("cannot build the model on executor " + executorId + ": class "
                    + missing + " is not on its class path; list the jar that holds it (your model's jar) in the run "
                    + "file's backend.jars = [\"/path/model.jar\"], as well as on SKERRY_CLASSPATH for the driver");
        }
        return new IllegalStateException("cannot build the model on executor " + executorId + ": " + e.getMessage(), e);
    }

    /** The name of the class whose absence caused {@code e}, or null. */
    private static String missingClass(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof ClassNotFoundException || t instanceof NoClassDefFoundError) {
                String name = String.valueOf(t.getMessage()).replace('/', '.');
                return "'" + name + "'";
            }
        }
        return null;
    }
}
