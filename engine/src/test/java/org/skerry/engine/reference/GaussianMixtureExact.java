package org.skerry.engine.reference;

import org.apache.commons.math3.distribution.NormalDistribution;

/**
 * Exact evidence and posterior mode weights of the normalised two-component normal likelihood
 * under a uniform prior on {@code [−bound, bound]^D}: with {@code Pⱼ = Πₖ [Φ((bound − mⱼₖ)/s) −
 * Φ((−bound − mⱼₖ)/s)]} the mass of component j inside the box, the evidence is
 * {@code (w·P₁ + (1 − w)·P₂)/(2·bound)^D} (a product of one-dimensional normal integrals;
 * Φ from Commons Math), and the posterior puts mass {@code w·P₁/(w·P₁ + (1 − w)·P₂)} on the
 * first component.
 */
public final class GaussianMixtureExact {

    private final double weight;
    private final double mass1;
    private final double mass2;
    private final double logVolume;

    public GaussianMixtureExact(double weight, double[] mean1, double[] mean2, double sd, double bound) {
        this.weight = weight;
        this.mass1 = boxMass(mean1, sd, bound);
        this.mass2 = boxMass(mean2, sd, bound);
        this.logVolume = mean1.length * Math.log(2.0 * bound);
    }

    private static double boxMass(double[] mean, double sd, double bound) {
        double mass = 1.0;
        for (double m : mean) {
            NormalDistribution normal = new NormalDistribution(m, sd);
            mass *= normal.probability(-bound, bound);
        }
        return mass;
    }

    public double logEvidence() {
        return Math.log(weight * mass1 + (1.0 - weight) * mass2) - logVolume;
    }

    /** Posterior probability of the first component's mode. */
    public double firstModeWeight() {
        return weight * mass1 / (weight * mass1 + (1.0 - weight) * mass2);
    }
}
