package org.skerry.engine.population;

/**
 * What a resampling step did: how many distinct ancestors survived, and how many particles had to
 * change block to rebalance the population. Immutable.
 */
public final class ResamplingReport {

    private final long distinctAncestors;
    private final long particlesMoved;

    public ResamplingReport(long distinctAncestors, long particlesMoved) {
        this.distinctAncestors = distinctAncestors;
        this.particlesMoved = particlesMoved;
    }

    public long distinctAncestors() {
        return distinctAncestors;
    }

    public long particlesMoved() {
        return particlesMoved;
    }
}
