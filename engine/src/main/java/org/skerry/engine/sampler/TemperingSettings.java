package org.skerry.engine.sampler;

import org.skerry.engine.temper.AdaptiveTemperature;
import org.skerry.engine.temper.TemperatureRule;

/**
 * How the temperature climbs from 0 to 1, and how many iterations it may take.
 *
 * @param rule          chooses each next temperature
 * @param maxIterations the run stops with an error if the temperature has not reached 1 after
 *                      this many iterations (at least 1)
 */
public record TemperingSettings(TemperatureRule rule, int maxIterations) {

    /** Adaptive tempering at its default target, at most 1000 iterations. */
    public static final TemperingSettings DEFAULTS =
            new TemperingSettings(new AdaptiveTemperature(AdaptiveTemperature.DEFAULT_TARGET), 1000);

    public TemperingSettings {
        if (rule == null) {
            throw new IllegalArgumentException("temperatureRule must not be null");
        }
        if (maxIterations < 1) {
            throw new IllegalArgumentException("maxIterations must be >= 1, was " + maxIterations);
        }
    }
}
