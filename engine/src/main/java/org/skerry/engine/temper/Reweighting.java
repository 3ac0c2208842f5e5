package org.skerry.engine.temper;

import org.skerry.engine.particle.ParticleBlock;

/**
 * Executor side: moves a block's weights from one tempered target to the next,
 * {@code log w += (φ' − φ)·log L}. The log-likelihoods are already known, so this costs no
 * likelihood calls.
 */
public final class Reweighting {

    private Reweighting() {
    }

    public static void reweight(ParticleBlock block, double fromTemperature, double toTemperature) {
        double delta = toTemperature - fromTemperature;
        double[] logWeight = block.logWeight();
        double[] logLikelihood = block.logLikelihood();
        for (int i = 0; i < block.size(); i++) {
            logWeight[i] += TemperedTarget.logIncrement(logLikelihood[i], delta);
        }
    }
}
