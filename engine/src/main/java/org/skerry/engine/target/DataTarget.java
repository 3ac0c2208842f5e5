package org.skerry.engine.target;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;

/**
 * A target of data tempering: {@code prior × likelihood of the first k of n observations}. At
 * k = 0 it is the prior (nothing to evaluate); at k = n the posterior, with the model's whole
 * likelihood.
 */
public final class DataTarget implements Target {

    private static final long serialVersionUID = 1L;

    private final ObservationRange observed;
    private final int count;

    /** The target with the first {@code observations} of {@code count} observations. */
    public DataTarget(int observations, int count) {
        this.observed = new ObservationRange(0, observations, count);
        this.count = count;
    }

    /** Observations included, k. */
    public int observations() {
        return observed.to();
    }

    /** Observations in all, n. */
    public int count() {
        return count;
    }

    @Override
    public double progress() {
        return observed.to() == count ? 1.0 : (double) observed.to() / count;
    }

    @Override
    public double logDensity(double logPrior, double logLikelihood) {
        return observed.to() == 0 ? logPrior : logPrior + logLikelihood;
    }

    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        return observed.logLikelihood(model, parameters, context);
    }

    @Override
    public boolean wholeLikelihood() {
        return observed.wholeLikelihood();
    }

    @Override
    public boolean usesLikelihood() {
        return observed.to() > 0;
    }

    @Override
    public String toString() {
        return observed.to() + " of " + count + " observations";
    }
}
