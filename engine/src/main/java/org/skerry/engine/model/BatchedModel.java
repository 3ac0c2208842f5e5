package org.skerry.engine.model;

/**
 * A model that can evaluate many parameter vectors in one call (a vectorised solver, one call
 * into native code per batch, a batch sent to a worker program). The sampler calls it once per
 * block instead of once per particle; values must equal {@link Model#logLikelihood} for each
 * vector, whatever other vectors share the batch. A model that is deterministic given its
 * parameters implements {@link #logLikelihoods(double[], int, double[])}; one that also reads
 * each particle's random stream (a seeded simulator) overrides
 * {@link #logLikelihoods(double[], int, BatchContext, double[])}, which the sampler calls. If the batch
 * call throws, the sampler falls back to single calls to find the failing particles; if it returns
 * NaN or {@code +Infinity} for some vectors, only those are called again singly. Those single
 * calls are what the retry setting repeats and what is reported.
 */
public interface BatchedModel extends Model {

    /**
     * Writes the log-likelihoods of {@code count} parameter vectors into {@code out[0..count)}.
     * {@code parameters} holds them back to back: vector {@code i} is
     * {@code parameters[i*d .. i*d+d)} with {@code d = dimension()}.
     */
    void logLikelihoods(double[] parameters, int count, double[] out);

    /**
     * As {@link #logLikelihoods(double[], int, double[])}, with each vector's particle and random
     * stream in {@code context}; this is the form the sampler calls. The default ignores the
     * context, which is right for a model deterministic given its parameters.
     */
    default void logLikelihoods(double[] parameters, int count, BatchContext context, double[] out) {
        logLikelihoods(parameters, count, out);
    }
}
