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
                throw new IllegalStateException("cannot build the model on executor "
                        + org.apache.spark.SparkEnv.get().executorId() + ": " + e.getMessage()
                        + " — if a model class is missing there, ship its jar with backend.jars = [\"/path/model.jar\"]"
                        + " in the run file (or spark-submit --jars)", e);
            }
        });
    }
}
