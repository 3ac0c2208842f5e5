package org.skerry.engine.sampler;

/**
 * A run that stopped on request between iterations, after its state was checkpointed: it can be
 * resumed and will then give the same answer as an undisturbed run.
 */
public final class RunStoppedException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final int iteration;

    public RunStoppedException(int iteration, String reason) {
        super("stopped after iteration " + iteration + ": " + reason);
        this.iteration = iteration;
    }

    /** The last completed (and checkpointed) iteration. */
    public int iteration() {
        return iteration;
    }
}
