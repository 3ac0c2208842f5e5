package org.skerry.engine.move;

/** The Metropolis–Hastings proposal family a run moves its particles with. */
public enum MoveKernel {
    /**
     * Gaussian random walk on the unconstrained scale with covariance {@code λ²·(2.38²/d)·Σ̂},
     * Σ̂ the weighted population covariance (Roberts, Gelman &amp; Gilks 1997, Ann. Appl. Probab. 7)
     * and λ adapted from the observed acceptance rate.
     */
    RANDOM_WALK,
    /**
     * Independence proposal from a Gaussian fitted to the weighted population (mean μ̂, covariance
     * Σ̂ inflated so its tails cover the target's); efficient when the target is close to Gaussian.
     */
    INDEPENDENCE
}
