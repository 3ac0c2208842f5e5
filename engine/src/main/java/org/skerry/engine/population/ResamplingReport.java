package org.skerry.engine.population;

/**
 * What a resampling step did: how many distinct ancestors survived, and how many particles had to
 * change block to rebalance the population, and how long that rebalancing took (wall time, the
 * only part not fixed by the seed). Immutable.
 */
public final class ResamplingReport {

    private final long distinctAncestors;
    private final long particlesMoved;
    private final double redistributeSeconds;

    public ResamplingReport(long distinctAncestors, long particlesMoved) {
        this(distinctAncestors, particlesMoved, 0.0);
    }

    public ResamplingReport(long distinctAncestors, long particlesMoved, double redistributeSeconds) {
        this.distinctAncestors = distinctAncestors;
        this.particlesMoved = particlesMoved;
        this.redistributeSeconds = redistributeSeconds;
    }

    /**
     * Wall-clock seconds spent rebalancing the blocks (part of the resampling call); a backend that
     * fuses expansion, rebalancing and moment sums into one step reports that whole step.
     */
    public double redistributeSeconds() {
        return redistributeSeconds;
    }

    public long distinctAncestors() {
        return distinctAncestors;
    }

    public long particlesMoved() {
        return particlesMoved;
    }
}
