package org.skerry.engine.resample;

import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.weight.LogWeights;

/**
 * Executor side: resamples one island (block) on its own, driver and block passes run back to
 * back inside the block. The island keeps its size and its run of global indices; each survivor
 * gets the island's mean weight, {@code log Σw − log n}, so the island weight is carried on
 * (Vergé, Dubarry, Del Moral &amp; Moulines 2015, Statistics and Computing 25).
 *
 * <p>The island's uniforms come from a seed derived from the run seed and the island's first
 * global index, so islands never share random numbers and the result depends only on the
 * island's own particles — not on where the island runs.
 */
public final class IslandResampling {

    private IslandResampling() {
    }

    /** The island after resampling, and how many distinct ancestors survived. */
    public record Result(ParticleBlock block, long distinctAncestors) {
    }

    /** The seed of the island whose first global index is {@code firstIndex} (SplitMix64 finaliser). */
    public static long islandSeed(long seed, long firstIndex) {
        long z = seed + 0x9E3779B97F4A7C15L * (firstIndex + 1);
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    public static Result resample(ParticleBlock island, ResamplingScheme scheme, long seed, int iteration) {
        int n = island.size();
        if (n == 0) {
            return new Result(island.copy(), 0);
        }
        double logSum = LogWeights.logSum(island.logWeight(), n);
        if (logSum == Double.NEGATIVE_INFINITY) {
            // A dead island stays dead: its weight is zero and resampling cannot revive it.
            return new Result(island.copy(), 0);
        }
        long first = island.index()[0];
        int[] offspring = Resampling.offspring(scheme, island.logWeight(), n, islandSeed(seed, first), iteration);
        long distinct = ParticleExpansion.distinctAncestors(offspring, n);
        ParticleBlock children = ParticleExpansion.expand(island, offspring, first);
        double islandMean = logSum - StrictMath.log(n);
        for (int i = 0; i < n; i++) {
            children.logWeight()[i] = islandMean;
        }
        return new Result(children, distinct);
    }
}
