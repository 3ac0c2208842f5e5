package org.skerry.engine.resample;

/**
 * When a population is resampled: when its ESS is at or below the threshold fraction τ of N, with
 * a relative margin of 10⁻⁹. The margin exists because adaptive tempering aims the conditional ESS
 * at a fraction that is often the same τ (both default to ½): after such a step the ESS lands on
 * τ·N up to rounding, and a plain {@code ess < τ·N} would decide by the last bit of a sum
 * (999.9999999999998 resampled, 1000.0 did not). With the margin every ESS within rounding of the
 * threshold counts as reaching it, so those steps always resample. The margin is far below any
 * Monte Carlo difference (the ESS itself varies by O(√N) between seeds).
 */
public final class ResamplingThreshold {

    /** Relative margin below which an ESS counts as at the threshold. */
    public static final double RELATIVE_MARGIN = 1e-9;

    private ResamplingThreshold() {
    }

    /**
     * Whether an ESS of {@code ess} out of {@code size} particles calls for resampling at threshold
     * fraction {@code threshold}.
     *
     * @throws IllegalArgumentException if {@code threshold} is not in (0, 1] or {@code size} is not positive
     */
    public static boolean reached(double ess, double size, double threshold) {
        if (!(threshold > 0 && threshold <= 1)) {
            throw new IllegalArgumentException("threshold must be in (0, 1], was " + threshold);
        }
        if (!(size > 0)) {
            throw new IllegalArgumentException("size must be positive, was " + size);
        }
        return ess <= threshold * size * (1 + RELATIVE_MARGIN);
    }
}
