package org.skerry.engine.target;


/**
 * One target of a sequence of targets, as the block side sees it: the density the moves leave
 * invariant and, as a {@link LikelihoodTerm}, the log-likelihood a particle carries under it. Likelihood tempering's targets
 * are {@code prior × likelihood^φ}; data tempering's are {@code prior × likelihood of the first
 * k observations}. Immutable and serialisable: targets travel to executors with the moves.
 */
public interface Target extends LikelihoodTerm {

    /** Progress along the sequence in [0, 1]: 0 at the first target, 1 at the posterior. */
    double progress();

    /** The unnormalised log target density of a particle with these log prior and log-likelihood. */
    double logDensity(double logPrior, double logLikelihood);

    /** Whether the target uses the likelihood at all (not before the first observation is added). */
    boolean usesLikelihood();
}
