package org.skerry.engine.model;

/**
 * A deterministic model that can evaluate many parameter vectors in one call (a vectorised
 * solver, one call into native code per batch). The sampler calls it once per block instead of
 * once per particle; values must equal {@link Model#logLikelihood} for each vector. If the batch
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
}
