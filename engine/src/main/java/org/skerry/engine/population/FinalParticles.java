package org.skerry.engine.population;

/**
 * The population at the end of a run, in canonical order (by global particle index): parameter
 * vectors on the model's scale, log-weights, each particle's log prior density and
 * (untempered) log-likelihood as the blocks hold them, and Eve indices. Only exported once, at
 * the end.
 */
public final class FinalParticles {

    private final int dimension;
    private final int size;
    private final double[] values;
    private final double[] logWeight;
    private final double[] logPrior;
    private final double[] logLikelihood;
    private final long[] index;
    private final long[] eve;

    public FinalParticles(int dimension, int size, double[] values, double[] logWeight, double[] logPrior,
            double[] logLikelihood, long[] index, long[] eve) {
        this.dimension = dimension;
        this.size = size;
        this.values = values;
        this.logWeight = logWeight;
        this.logPrior = logPrior;
        this.logLikelihood = logLikelihood;
        this.index = index;
        this.eve = eve;
    }

    public int dimension() {
        return dimension;
    }

    public int size() {
        return size;
    }

    /** Parameter vectors back to back, particle {@code i} at {@code [i*d, i*d+d)}. */
    public double[] values() {
        return values;
    }

    public double value(int particle, int parameter) {
        return values[particle * dimension + parameter];
    }

    public double[] logWeight() {
        return logWeight;
    }

    /** The prior's log-density at each particle, as computed when the particle was drawn or moved. */
    public double[] logPrior() {
        return logPrior;
    }

    /** Each particle's untempered log-likelihood, as evaluated when it was drawn or moved. */
    public double[] logLikelihood() {
        return logLikelihood;
    }

    public long[] index() {
        return index;
    }

    public long[] eve() {
        return eve;
    }
}
