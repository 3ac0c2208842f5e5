package org.skerry.engine.temper;

import org.skerry.engine.population.TemperingInputs;

/**
 * Chooses the next temperature φ of the tempered sequence {@code prior × likelihood^φ}, running
 * on the driver from the scalars each particle sends. Implementations are immutable.
 */
public interface TemperatureRule {

    /**
     * The next temperature, strictly greater than {@code current} and at most 1.
     *
     * @param current  the temperature the population's weights are for
     * @param inputs   log-weights and log-likelihoods of every particle
     * @param logTotal log of the total of the current weights
     */
    double next(double current, TemperingInputs inputs, double logTotal);
}
