package org.skerry.engine.model;

import org.skerry.engine.random.RandomStream;

/**
 * What the sampler tells a {@link BatchedModel} about each vector of a batch: the particle it
 * belongs to and the random stream its single {@link Model#logLikelihood} call would get, so a
 * stochastic model (a simulator program handed a seed per particle) answers a batch exactly as it
 * answers one vector at a time. Valid only for the duration of the batch call.
 */
public interface BatchContext {

    /** The sampler iteration (0 for the initial draw). */
    int iteration();

    /** Global index of the particle of vector {@code i} of the batch. */
    long particleIndex(int i);

    /**
     * The random stream of vector {@code i}, from its start: the stream {@link LikelihoodContext#random()}
     * gives that particle's single call. The returned object may be reused by the next call of
     * this method, so read what you need from it before asking for another vector's stream.
     */
    RandomStream random(int i);
}
