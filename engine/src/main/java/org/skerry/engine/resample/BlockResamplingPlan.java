package org.skerry.engine.resample;

import java.io.Serializable;
import java.util.Objects;

/**
 * Everything one block needs to compute its particles' offspring counts without seeing any other
 * block: where its cumulative weight starts, which resampling point is the first at or after that
 * start, and the scheme's global numbers. Made on the driver by {@link ResamplingPlanner} and
 * used on the block by {@link OffspringCounter}; an immutable value of primitives.
 *
 * <p>Points are numbered {@code 0..pointCount-1} in increasing position. For
 * {@link ResamplingScheme#RESIDUAL} the points are the multinomial points on the residual
 * weights and the counts are added to the certain copies.
 */
public final class BlockResamplingPlan implements Serializable {

    private static final long serialVersionUID = 1L;

    private final ResamplingScheme scheme;
    private final long seed;
    private final int iteration;
    private final int particleCount;
    private final int pointCount;
    private final long weightTotal;
    private final long weightBefore;
    private final long blockWeight;
    private final int firstPoint;
    private final long systematicOffset;
    private final double sumBefore;
    private final double sumAll;
    private final long firstNewIndex;
    private final int offspringCount;

    BlockResamplingPlan(ResamplingScheme scheme, long seed, int iteration, int particleCount, int pointCount,
            long weightTotal, long weightBefore, long blockWeight, int firstPoint, long systematicOffset,
            double sumBefore, double sumAll, long firstNewIndex, int offspringCount) {
        this.scheme = scheme;
        this.seed = seed;
        this.iteration = iteration;
        this.particleCount = particleCount;
        this.pointCount = pointCount;
        this.weightTotal = weightTotal;
        this.weightBefore = weightBefore;
        this.blockWeight = blockWeight;
        this.firstPoint = firstPoint;
        this.systematicOffset = systematicOffset;
        this.sumBefore = sumBefore;
        this.sumAll = sumAll;
        this.firstNewIndex = firstNewIndex;
        this.offspringCount = offspringCount;
    }

    public ResamplingScheme scheme() {
        return scheme;
    }

    public long seed() {
        return seed;
    }

    public int iteration() {
        return iteration;
    }

    /** Number of particles the block holds. */
    public int particleCount() {
        return particleCount;
    }

    /** Number of random points over the whole population ({@code N}, or {@code N - sum of floors}). */
    public int pointCount() {
        return pointCount;
    }

    /** Total fixed-point weight the points fall on. */
    public long weightTotal() {
        return weightTotal;
    }

    /** Fixed-point weight of all blocks before this one in canonical order. */
    public long weightBefore() {
        return weightBefore;
    }

    /** Fixed-point weight of this block. */
    public long blockWeight() {
        return blockWeight;
    }

    /** Index of the first point at or after {@link #weightBefore()}. */
    public int firstPoint() {
        return firstPoint;
    }

    /** The shared offset {@code V} of systematic resampling, in {@code [0, weightTotal)}; 0 otherwise. */
    public long systematicOffset() {
        return systematicOffset;
    }

    /** Multinomial: the sum of spacings {@code E_0 + ... + E_{firstPoint-1}} (0 when firstPoint is 0). */
    public double sumBefore() {
        return sumBefore;
    }

    /** Multinomial: the sum of all {@code pointCount + 1} spacings. */
    public double sumAll() {
        return sumAll;
    }

    /** Global index of the block's first offspring. */
    public long firstNewIndex() {
        return firstNewIndex;
    }

    /** Number of offspring the block's particles have in total. */
    public int offspringCount() {
        return offspringCount;
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof BlockResamplingPlan)) {
            return false;
        }
        BlockResamplingPlan p = (BlockResamplingPlan) o;
        return scheme == p.scheme && seed == p.seed && iteration == p.iteration && particleCount == p.particleCount
                && pointCount == p.pointCount && weightTotal == p.weightTotal && weightBefore == p.weightBefore
                && blockWeight == p.blockWeight && firstPoint == p.firstPoint
                && systematicOffset == p.systematicOffset
                && Double.doubleToLongBits(sumBefore) == Double.doubleToLongBits(p.sumBefore)
                && Double.doubleToLongBits(sumAll) == Double.doubleToLongBits(p.sumAll)
                && firstNewIndex == p.firstNewIndex && offspringCount == p.offspringCount;
    }

    @Override
    public int hashCode() {
        return Objects.hash(scheme, seed, iteration, particleCount, pointCount, weightTotal, weightBefore,
                blockWeight, firstPoint, systematicOffset, sumBefore, sumAll, firstNewIndex, offspringCount);
    }

    @Override
    public String toString() {
        return "BlockResamplingPlan[" + scheme + ", particles=" + particleCount + ", points=" + pointCount
                + ", weightBefore=" + weightBefore + "/" + weightTotal + ", firstPoint=" + firstPoint
                + ", firstNewIndex=" + firstNewIndex + ", offspring=" + offspringCount + "]";
    }
}
