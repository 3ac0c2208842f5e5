package org.skerry.engine.sampler;

/**
 * What is done about invalid likelihood evaluations (NaN, {@code +Infinity}, an exception).
 *
 * @param retries            how many times an invalid call is repeated, with the same random
 *                           stream, before it counts as invalid; in [0, 100], default 0
 * @param maxInvalidFraction the run stops when more than this fraction of one iteration's
 *                           evaluations are invalid; in [0, 1], default 0.1 (1 never stops)
 */
public record EvaluationSettings(int retries, double maxInvalidFraction) {

    /** No retries; stop above 10% invalid evaluations in an iteration. */
    public static final EvaluationSettings DEFAULTS = new EvaluationSettings(0, 0.1);

    public EvaluationSettings {
        if (retries < 0 || retries > 100) {
            throw new IllegalArgumentException("evaluationRetries must be in [0, 100], was " + retries);
        }
        if (!(maxInvalidFraction >= 0 && maxInvalidFraction <= 1)) {
            throw new IllegalArgumentException("maxInvalidFraction must be in [0, 1], was " + maxInvalidFraction);
        }
    }
}
