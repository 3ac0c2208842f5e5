package org.skerry.engine.abc;

/**
 * How adaptive ABC-SMC chooses its next tolerance: so that the ESS of the reweighted particles
 * falls by a set factor (Del Moral, Doucet &amp; Jasra 2012, Statistics and Computing 22, §3.2), or
 * so that a set share of the living particles' simulations stays within it, the next tolerance a
 * quantile of their distances (Drovandi &amp; Pettitt 2011, Biometrics 67(1)).
 */
public enum ToleranceRule {
    /** The ESS falls to a set fraction of the last. */
    ESS,
    /** A set share of the simulations within the last tolerance stays within the next. */
    SHARE
}
