package org.skerry.engine.abc;

/**
 * Thrown by {@link AbcSequence#advance} when no living particle's simulation lies closer to the
 * observed summaries than the current tolerance, so the uniform kernel cannot step down without
 * losing every particle. The sampler ends the run there, keeping the population at the current
 * tolerance and stating why, as for the other early ends (acceptance floor, budget).
 */
public final class ToleranceStalledException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final String reason;

    public ToleranceStalledException(String reason) {
        super(reason);
        this.reason = reason;
    }

    /** Why the run ends, as summary.json's ended_early states it. */
    public String reason() {
        return reason;
    }
}
