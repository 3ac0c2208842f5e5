package org.skerry.engine.model;

/**
 * A {@link SummarySimulator} that can simulate for many parameter vectors in one call (a batch
 * sent to a worker program, a vectorised simulator). The sampler calls it once per block for the
 * initial draw and once per block and MH step for the moves, instead of once per particle. Its
 * summaries must equal those of the single calls: vector {@code i}'s M simulations are what M
 * calls of {@link #simulate}, one after the other on the stream {@link BatchContext#random(int)}
 * gives for {@code i}, would write, whatever other vectors share the batch. A vector it cannot
 * simulate gets a reason in {@code errors}; the sampler simulates that vector again alone, with
 * the retries the run allows, and reports the single call's outcome, so the counts and the answer
 * do not depend on how particles are grouped.
 */
public interface BatchedSummarySimulator extends SummarySimulator {

    /**
     * Simulates {@code simulations} data sets for each of {@code count} parameter vectors.
     *
     * @param parameters  the vectors back to back: vector {@code i} is {@code parameters[i*d .. i*d+d)}
     * @param context     each vector's particle and random stream
     * @param summaries   where vector {@code i}'s simulation {@code m} writes its s summaries:
     *                    {@code summaries[(i*simulations + m)*s ..)}
     * @param errors      per vector, null when its simulations succeeded, else why not
     */
    void simulateAll(double[] parameters, int count, int simulations, BatchContext context, double[] summaries,
            String[] errors);
}
