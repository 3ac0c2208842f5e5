package org.skerry.engine.model;

import org.skerry.engine.random.RandomStream;

/**
 * What the sampler tells a model about the evaluation in progress. Handed to
 * {@link Model#logLikelihood}; valid only for the duration of that call.
 */
public interface LikelihoodContext {

    /**
     * A random stream for a stochastic simulator, keyed by (seed, iteration, particle index,
     * step): the same evaluation always receives the same numbers, on any thread or executor.
     */
    RandomStream random();

    /** Global index of the particle being evaluated. */
    long particleIndex();

    /** The sampler iteration (0 for the initial draw). */
    int iteration();
}
