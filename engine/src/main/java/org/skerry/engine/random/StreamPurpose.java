package org.skerry.engine.random;

/**
 * What a random stream is used for. The purpose is part of every stream's key, so two uses of
 * randomness for the same particle and iteration never share bits. Codes are fixed forever: a
 * changed code changes every answer.
 */
public enum StreamPurpose {
    /** Drawing a particle from the prior or from a user proposal at the start. */
    INITIAL_DRAW(1),
    /** The shared uniforms of a resampling step (indexed by stratum or order statistic). */
    RESAMPLING(2),
    /** The Gaussian increment of a Metropolis–Hastings proposal. */
    MOVE_PROPOSAL(3),
    /** The uniform of a Metropolis–Hastings accept/reject decision. */
    MOVE_ACCEPT(4),
    /** Handed to a stochastic simulator when it evaluates a likelihood. */
    SIMULATOR(5),
    /** Generating synthetic data sets (the demo's generator); never used by the sampler. */
    DATA_GENERATION(6),
    /**
     * Posterior predictive checks after a run: choosing posterior draws and simulating replicate
     * data sets from them; never used by the sampler, so it cannot change a run's answer.
     */
    PREDICTIVE(7),
    /**
     * Checking a model before a run (a simulator's first call, to see how many summaries it
     * writes); never used by the sampler, so it cannot change a run's answer.
     */
    MODEL_CHECK(8),
    /** Free for tests and benchmarks; never used by the sampler. */
    TESTING(255);

    private final int code;

    StreamPurpose(int code) {
        this.code = code;
    }

    /** The eight-bit code written into the counter. */
    public int code() {
        return code;
    }
}
