package org.skerry.spark;

import java.lang.ref.Reference;
import java.lang.ref.ReferenceQueue;
import java.lang.ref.WeakReference;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;

/**
 * Executor side: one model per model source and JVM, built on first use, so a costly model set-up
 * (reading data, precomputing) happens once per executor, not once per task. A model is dropped
 * when its analysis ends: at once in the driver's JVM ({@link #release}), and on executors when
 * the source's broadcast is destroyed and collected, so a long batch does not keep every model
 * and its data in every executor.
 */
final class ModelCache {

    private static final ConcurrentHashMap<String, Model> MODELS = new ConcurrentHashMap<>();
    /** The broadcast sources the models were built from, weakly: a collected one ends its model. */
    private static final ReferenceQueue<ModelSource> COLLECTED = new ReferenceQueue<>();
    private static final Set<Owner> OWNERS = ConcurrentHashMap.newKeySet();

    private ModelCache() {
    }

    static Model get(ModelSource source) {
        dropCollected();
        return MODELS.computeIfAbsent(source.id(), id -> {
            try {
                Model model = source.create();
                OWNERS.add(new Owner(source, COLLECTED));
                return model;
            } catch (RuntimeException | LinkageError e) {
                throw failure(e, org.apache.spark.SparkEnv.get().executorId());
            }
        });
    }

    /** Drops the model of the source with this id from this JVM. */
    static void release(String id) {
        closeModel(MODELS.remove(id));
        OWNERS.removeIf(owner -> owner.id.equals(id));
        dropCollected();
    }

    /** Number of models held in this JVM (for tests). */
    static int size() {
        dropCollected();
        return MODELS.size();
    }

    private static void dropCollected() {
        for (Reference<? extends ModelSource> gone = COLLECTED.poll(); gone != null; gone = COLLECTED.poll()) {
            Owner owner = (Owner) gone;
            OWNERS.remove(owner);
            closeModel(MODELS.remove(owner.id));
        }
    }

    /** Ends a model that holds processes or connections (a program model's workers). */
    private static void closeModel(Model model) {
        if (model instanceof AutoCloseable) {
            try {
                ((AutoCloseable) model).close();
            } catch (Exception e) {
                // the model is dropped either way; what it held ends with the JVM at the latest
            }
        }
    }

    /** A weak reference to the source a model was built from, which remembers the model's key. */
    private static final class Owner extends WeakReference<ModelSource> {
        final String id;

        Owner(ModelSource source, ReferenceQueue<ModelSource> queue) {
            super(source, queue);
            this.id = source.id();
        }
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
