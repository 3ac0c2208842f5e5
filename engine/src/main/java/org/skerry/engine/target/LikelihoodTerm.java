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
}
