/**
 * Approximate Bayesian computation on the sampler's loop: adaptive ABC-SMC (Del Moral, Doucet
 * &amp; Jasra 2012, Statistics and Computing 22) as a sequence of targets indexed by a tolerance.
 * Block side: the simulation term, the initial draw and the ABC Metropolis–Hastings mover, which
 * keep every particle's simulated summaries with the particle. Driver side: the sequence, its
 * tolerance choice and the distance scales.
 */
package org.skerry.engine.abc;
