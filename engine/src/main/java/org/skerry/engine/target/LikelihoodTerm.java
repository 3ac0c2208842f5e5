package org.skerry.engine.target;

import java.io.Serializable;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;

/**
 * Which log-likelihood a block evaluates at a parameter vector: the model's whole likelihood, or
 * (for data tempering) that of a range of observations. Serialisable: it travels with the steps.
 */
public interface LikelihoodTerm extends Serializable {

    /** The log-likelihood at {@code parameters}. */
    double logLikelihood(Model model, double[] parameters, LikelihoodContext context);

    /**
     * Whether {@link #logLikelihood} is the model's whole likelihood, so that a batched model may
     * evaluate many parameter vectors in one call.
     */
    boolean wholeLikelihood();

    /**
     * For a term that is not the whole likelihood but has a batched form of its own (ABC's
     * simulations): evaluates {@code count} vectors at once into {@code out}, NaN where a vector
     * must be evaluated again alone. Returns false, writing nothing, when it has no batched form
     * (the default).
     */
    default boolean logLikelihoods(Model model, double[] parameters, int count,
            org.skerry.engine.model.BatchContext context, double[] out) {
        return false;
    }
}
