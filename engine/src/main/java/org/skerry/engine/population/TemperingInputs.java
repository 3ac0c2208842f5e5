package org.skerry.engine.population;

/**
 * The two scalars per particle the driver needs to choose the next temperature and the evidence
 * increment: the current log-weight and the log-likelihood, in matching (but otherwise arbitrary)
 * order. This is the largest thing that crosses to the driver during a run: 16 bytes a particle.
 */
public final class TemperingInputs {

    private final double[] logWeight;
    private final double[] logLikelihood;
    private final int size;

    public TemperingInputs(double[] logWeight, double[] logLikelihood, int size) {
        if (logWeight.length < size || logLikelihood.length < size) {
            throw new IllegalArgumentException("arrays shorter than size " + size);
        }
        this.logWeight = logWeight;
        this.logLikelihood = logLikelihood;
        this.size = size;
    }

    /** Log-weights; do not modify. */
    public double[] logWeight() {
        return logWeight;
    }

    /** Log-likelihoods; do not modify. */
    public double[] logLikelihood() {
        return logLikelihood;
    }

    public int size() {
        return size;
    }
}
