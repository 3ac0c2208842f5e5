package org.skerry.engine.sampler;

/**
 * A run that cannot continue: every particle's weight is zero, tempering cannot reach 1
 * within the iteration limit, or too many likelihood evaluations were invalid
 * ({@link InvalidEvaluationsException}). The message names the iteration and the counts that explain it.
 */
public class SamplingFailedException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final int iteration;

    public SamplingFailedException(int iteration, String message) {
        super("iteration " + iteration + ": " + message);
        this.iteration = iteration;
    }

    /** The iteration at which the run failed. */
    public int iteration() {
        return iteration;
    }
}
