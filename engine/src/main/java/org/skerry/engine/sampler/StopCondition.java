package org.skerry.engine.sampler;

/**
 * Asked between iterations whether the run should stop early and resumably — a termination
 * signal arrived, or the next iteration would not fit in the wall time left.
 */
@FunctionalInterface
public interface StopCondition {

    /** Never stops. */
    StopCondition NEVER = (state, predicted) -> null;

    /**
     * @param state            the driver's state after the last completed iteration
     * @param predictedSeconds the expected wall time of the next iteration, from the past ones
     * @return why to stop, or null to go on
     */
    String reasonToStop(SamplerState state, double predictedSeconds);

    /**
     * Whether the reason just given must be obeyed even before this invocation has completed an
     * iteration (a termination signal); a wall-time limit is not, so every invocation progresses.
     */
    default boolean urgent() {
        return true;
    }
}
