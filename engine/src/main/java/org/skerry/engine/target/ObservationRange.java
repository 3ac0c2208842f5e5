package org.skerry.engine.target;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ObservationLikelihood;

/**
 * The log-likelihood of the observations {@code [from, to)} of a model that factorises over its
 * observations: what a particle's log-likelihood gains when data tempering adds a batch, and,
 * from observation 0, what its targets use. The whole range is the model's whole likelihood.
 */
public final class ObservationRange implements LikelihoodTerm {

    private static final long serialVersionUID = 1L;

    private final int from;
    private final int to;
    private final int count;

    /** Observations {@code [from, to)} of {@code count}. */
    public ObservationRange(int from, int to, int count) {
        ObservationLikelihood.checkRange(from, to, count);
        this.from = from;
        this.to = to;
        this.count = count;
    }

    public int from() {
        return from;
    }

    public int to() {
        return to;
    }

    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        return ObservationLikelihood.of(model).logLikelihood(parameters, from, to, context);
    }

    @Override
    public boolean wholeLikelihood() {
        return from == 0 && to == count;
    }

    @Override
    public String toString() {
        return "observations [" + from + ", " + to + ") of " + count;
    }
}
