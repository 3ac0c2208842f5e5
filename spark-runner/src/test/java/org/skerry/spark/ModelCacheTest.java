package org.skerry.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.cli.SparkFailures;

/**
 * What a model that cannot be built on an executor turns into: a class missing there becomes a
 * trace-less {@link ModelClassMissingException} that the driver recognises in Spark's job-failure
 * text (the command-level test in SlippedInputTest runs the whole path in local mode; a real
 * executor JVM, local-cluster or standalone, costs 10 to 60 s on our shared machine, so that path
 * is covered here by its two ends).
 */
class ModelCacheTest {

    @Test
    @DisplayName("a class missing on an executor: a short message naming it and backend.jars, no stack trace")
    void missingClass() {
        RuntimeException notFound = new IllegalArgumentException("model: model.class = \"com.example.Mine\": not found",
                new ClassNotFoundException("com.example.Mine"));
        RuntimeException failure = ModelCache.failure(notFound, "3");
        assertInstanceOf(ModelClassMissingException.class, failure);
        assertEquals(0, failure.getStackTrace().length);
        assertNull(failure.getCause());
        String message = failure.getMessage();
        assertTrue(message.startsWith("cannot build the model on executor 3: class 'com.example.Mine' is not on its "
                + "class path"), message);
        assertTrue(message.contains("backend.jars") && message.contains("SKERRY_CLASSPATH"), message);

        RuntimeException dependency = ModelCache.failure(new RuntimeException(new NoClassDefFoundError("org/lib/Solver")), "1");
        assertTrue(dependency.getMessage().contains("class 'org.lib.Solver'"), dependency.getMessage());
    }

    @Test
    @DisplayName("any other failure keeps its cause")
    void otherFailure() {
        RuntimeException cause = new IllegalStateException("no data here");
        RuntimeException failure = ModelCache.failure(cause, "2");
        assertInstanceOf(IllegalStateException.class, failure);
        assertEquals(cause, failure.getCause());
        assertNull(SparkFailures.missingModelClass(failure));
    }

    @Test
    @DisplayName("the driver finds the message in Spark's job-abort text")
    void recognisedOnTheDriver() {
        String message = ModelCache.failure(new RuntimeException(new ClassNotFoundException("com.example.Mine")), "0")
                .getMessage();
        RuntimeException sparkLike = new RuntimeException("Job aborted due to stage failure: Task 0 in stage 1.0 failed "
                + "4 times, most recent failure: Lost task 0.3 in stage 1.0 (TID 7) (10.0.0.5 executor 0): "
                + ModelClassMissingException.class.getName() + ": " + message + "\n\nDriver stacktrace:");
        assertEquals(message, SparkFailures.missingModelClass(new IllegalStateException("wrapped", sparkLike)));
    }
}
