package org.skerry.engine.population;

/**
 * A run of consecutive particles of the final population in canonical order, as primitive arrays:
 * the unit in which the final population streams from the blocks to the output writers, so that
 * no writer ever needs the whole population at once. Particle {@code i} of the run has global
 * index {@code firstIndex + i}, parameters at {@code values[i*d, i*d+d)}, and its normalised
 * weight (the weights of the whole population sum to 1), untempered log-likelihood and log prior.
 * The arrays are shared, not copied: a receiver must not keep them beyond the call it gets them in.
 */
public record ParticleRows(long firstIndex, int count, int dimension, double[] values, double[] weights,
        double[] logLikelihood, double[] logPrior) {

    public ParticleRows {
        if (count < 0 || dimension < 1) {
            throw new IllegalArgumentException("count must be >= 0 and dimension >= 1, got " + count + " and " + dimension);
        }
        if (values.length < (long) count * dimension || weights.length < count || logLikelihood.length < count
                || logPrior.length < count) {
            throw new IllegalArgumentException("arrays shorter than " + count + " particles of dimension " + dimension);
        }
    }

    /** Parameter {@code k} of particle {@code i} of this run. */
    public double value(int i, int k) {
        return values[i * dimension + k];
    }
}
