package org.skerry.spark;

/**
 * A model class (or a class it needs) is missing on an executor: its jar was not shipped with
 * {@code backend.jars}. It crosses to the driver as text in Spark's job failure, where
 * {@code org.skerry.cli.SparkFailures} recognises it by this class's name and reports bad input.
 * It carries no stack trace: Spark logs each failed task's trace, which would add some thirty
 * lines per task attempt and say nothing the message does not.
 */
public final class ModelClassMissingException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public ModelClassMissingException(String message) {
        super(message, null, false, false);
    }
}
