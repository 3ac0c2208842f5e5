package org.skerry.cli;

/**
 * Turns Spark's failure reports into one sentence a user can act on: a model that cannot be
 * built on the executors, executors that ran out of memory, a population too large for a
 * message. Spark wraps the cause in job-abort text, so the chain and the texts are searched.
 */
public final class SparkFailures {

    private SparkFailures() {
    }

    private static final String MISSING_CLASS = org.skerry.spark.ModelClassMissingException.class.getName() + ": ";

    /**
     * The message of a model class missing on an executor (its jar not listed in
     * {@code backend.jars}), which is bad input, or null when {@code failure} is something else.
     */
    public static String missingModelClass(Throwable failure) {
        String all = chain(failure);
        int at = all.indexOf(MISSING_CLASS);
        if (at < 0) {
            return null;
        }
        int start = at + MISSING_CLASS.length();
        int end = all.indexOf('\n', start);
        return all.substring(start, end < 0 ? all.length() : end);
    }

    private static String chain(Throwable failure) {
        StringBuilder text = new StringBuilder();
        for (Throwable t = failure; t != null; t = t.getCause()) {
            text.append(t.getClass().getName()).append(": ").append(t.getMessage()).append('\n');
        }
        return text.toString();
    }

    /** A plain explanation, or null when the failure is not one of the known kinds. */
    public static String explain(Throwable failure) {
        String missing = missingModelClass(failure);
        if (missing != null) {
            return missing;
        }
        String all = chain(failure);
        int model = all.indexOf("cannot build the model on executor");
        if (model >= 0) {
            int end = all.indexOf('\n', model);
            return all.substring(model, end < 0 ? all.length() : end);
        }
        if (all.contains("OutOfMemoryError") || all.contains("Java heap space")
                || all.contains("GC overhead limit exceeded")) {
            return "an executor ran out of memory holding its particle blocks; give executors more memory with "
                    + "backend.spark { \"spark.executor.memory\" = \"4g\" } (or spark-submit --executor-memory), "
                    + "or use more partitions (backend.partitions)";
        }
        if (all.contains("Expected SaslMessage") || all.contains("does not have SASL enabled")) {
            // The cluster's daemons authenticate (spark.authenticate) and this driver has no secret.
            return "the cluster requires authentication and this driver has no secret: set " + SparkSecret.ENVIRONMENT
                    + " to the file holding the cluster's secret (deploy/loopback-cluster: DIR/secret), or give "
                    + "spark-submit --properties-file DIR/auth.properties";
        }
        if (all.contains("spark.rpc.message.maxSize")) {
            return "a message to or from the driver exceeded spark.rpc.message.maxSize; raise it with "
                    + "backend.spark { \"spark.rpc.message.maxSize\" = \"512\" } or use more partitions";
        }
        return null;
    }
}
