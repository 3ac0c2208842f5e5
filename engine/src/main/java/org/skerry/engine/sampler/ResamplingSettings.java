package org.skerry.engine.sampler;

import org.skerry.engine.resample.ResamplingScheme;

/**
 * When and how the population is resampled.
 *
 * @param scheme         the resampling scheme
 * @param threshold      resample when ESS &lt; threshold·N; in (0, 1], default 0.5 (common practice)
 * @param everyIteration resample at every iteration regardless of the ESS
 */
public record ResamplingSettings(ResamplingScheme scheme, double threshold, boolean everyIteration) {

    /**
     * Multinomial (the only scheme the single-run evidence error is calibrated for, see
     * {@link EvidenceError}) when the ESS falls below N/2.
     */
    public static final ResamplingSettings DEFAULTS = new ResamplingSettings(ResamplingScheme.MULTINOMIAL, 0.5, false);

    public ResamplingSettings {
        if (scheme == null) {
            throw new IllegalArgumentException("resamplingScheme must not be null");
        }
        if (!(threshold > 0 && threshold <= 1)) {
            throw new IllegalArgumentException("resampleThreshold must be in (0, 1], was " + threshold);
        }
    }
}
