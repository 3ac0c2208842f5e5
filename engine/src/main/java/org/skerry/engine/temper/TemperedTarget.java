package org.skerry.engine.temper;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.target.Target;

/**
 * The tempered target {@code prior × likelihood^φ} in log form, with the convention
 * {@code likelihood^0 = 1} even where the likelihood is zero, so the target at φ = 0 is the prior.
 * Particles carry the whole (untempered) log-likelihood at every temperature.
 */
public final class TemperedTarget implements Target {

    private static final long serialVersionUID = 1L;

    private final double temperature;

    /** The target at temperature {@code temperature} in [0, 1]. */
    public TemperedTarget(double temperature) {
        if (!(temperature >= 0.0 && temperature <= 1.0)) {
            throw new IllegalArgumentException("temperature must be in [0, 1], was " + temperature);
        }
        this.temperature = temperature;
    }

    public double temperature() {
        return temperature;
    }

    @Override
    public double progress() {
        return temperature;
    }

    @Override
    public double logDensity(double logPrior, double logLikelihood) {
        return logDensity(logPrior, logLikelihood, temperature);
    }

    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        return model.logLikelihood(parameters, context);
    }

    @Override
    public boolean wholeLikelihood() {
        return true;
    }

    @Override
    public boolean usesLikelihood() {
        return true;
    }

    /** {@code logPrior + φ·logLikelihood}, taking {@code 0·(−∞) = 0}. */
    public static double logDensity(double logPrior, double logLikelihood, double temperature) {
        return temperature == 0.0 ? logPrior : logPrior + temperature * logLikelihood;
    }

    /** The log incremental weight {@code (φ' − φ)·logLikelihood}, taking {@code 0·(−∞) = 0}. */
    public static double logIncrement(double logLikelihood, double delta) {
        return delta == 0.0 ? 0.0 : delta * logLikelihood;
    }

    @Override
    public String toString() {
        return "tempered target at φ = " + temperature;
    }
}
