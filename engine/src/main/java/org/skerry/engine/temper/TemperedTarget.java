package org.skerry.engine.temper;

/**
 * The tempered target {@code prior × likelihood^φ} in log form, with the convention
 * {@code likelihood^0 = 1} even where the likelihood is zero, so the target at φ = 0 is the prior.
 */
public final class TemperedTarget {

    private TemperedTarget() {
    }

    /** {@code logPrior + φ·logLikelihood}, taking {@code 0·(−∞) = 0}. */
    public static double logDensity(double logPrior, double logLikelihood, double temperature) {
        return temperature == 0.0 ? logPrior : logPrior + temperature * logLikelihood;
    }

    /** The log incremental weight {@code (φ' − φ)·logLikelihood}, taking {@code 0·(−∞) = 0}. */
    public static double logIncrement(double logLikelihood, double delta) {
        return delta == 0.0 ? 0.0 : delta * logLikelihood;
    }
}
