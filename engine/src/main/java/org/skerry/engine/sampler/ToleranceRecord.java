package org.skerry.engine.sampler;

/**
 * What an iteration of an ABC run did besides what every iteration records: the tolerance reached,
 * the share of the particles' kept simulations within it when it was chosen, and the simulations
 * made (M per evaluation). Immutable.
 *
 * @param tolerance   ε reached (+∞ for the initial draw)
 * @param shareWithin share of the kept simulations within ε, before the moves (1 at the initial draw)
 * @param simulations simulations made in the iteration
 */
public record ToleranceRecord(double tolerance, double shareWithin, long simulations) {
}
