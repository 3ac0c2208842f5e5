package org.skerry.engine.model;

/**
 * A statistical model to calibrate: named parameters with their supports, a prior, and a
 * log-likelihood of one parameter vector against the model's data.
 *
 * <p>The log-likelihood is the costly part (an ODE solve, a simulator run) and is called from
 * many threads at once, so implementations must be thread-safe and must not keep the array they
 * are handed. Return {@code Double.NEGATIVE_INFINITY} for a parameter vector the physics rules
 * out: that is a valid zero likelihood. A NaN, {@code +Infinity} or a thrown exception counts as
 * an invalid evaluation: the sampler gives the particle zero weight, counts it and reports it,
 * after repeating the call as often as {@code SamplerSettings.evaluation().retries()} allows (with the
 * same array, which the model must not change, and the same random stream).
 *
 * <p>A stochastic simulator must draw all its randomness from {@link LikelihoodContext#random()}:
 * that stream is keyed like every other stream of the run, so a repeated or retried call returns
 * the same value.
 */
public interface Model {

    /** The parameters: names and supports, in the order of the parameter vector. */
    ParameterSpace parameters();

    /** The prior distribution over the parameter vector, on the model's own scale. */
    Prior prior();

    /**
     * The log-likelihood of the data at {@code parameters} (length {@code parameters().dimension()},
     * on the model's own scale, inside the support).
     */
    double logLikelihood(double[] parameters, LikelihoodContext context);

    /** Number of parameters. */
    default int dimension() {
        return parameters().dimension();
    }
}
