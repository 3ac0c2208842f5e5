package org.skerry.engine.resample;

import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * The driver side of resampling: from one or two numbers per block it makes each block's
 * {@link BlockResamplingPlan}, so blocks compute offspring counts that do not depend on how the
 * particles are grouped. Never sees per-particle weights; for {@link ResamplingScheme#MULTINOMIAL}
 * and {@link ResamplingScheme#RESIDUAL} it makes one O(N) pass over the spacings (two scalars per
 * point, none per particle).
 *
 * <p>Passes, block side then driver side:
 * <ol>
 * <li>every block quantises its weights ({@link WeightQuantiser}) and reports the total;
 * <li>{@code MULTINOMIAL}, {@code STRATIFIED}, {@code SYSTEMATIC}: {@link #plan}, then
 *     {@link OffspringCounter#count} in each block;
 * <li>{@code RESIDUAL}: {@link #residualSplit}; each block runs
 *     {@link OffspringCounter#splitResidual} and reports its {@link ResidualTotals};
 *     {@link #planResidual}; then {@link OffspringCounter#count} adds the random copies.
 * </ol>
 * The stream convention: all draws use purpose {@code RESAMPLING} at the given iteration; the
 * systematic offset is drawn from particle index 0, stratum {@code k}'s offset and spacing
 * {@code E_k} from particle index {@code k}.
 *
 * <p>Multinomial points are sorted uniforms built from exponential spacings: with
 * {@code E_0..E_M} independent standard exponentials and {@code S_k = E_0 + ... + E_k},
 * {@code (S_0/S_M, ..., S_{M-1}/S_M)} are distributed as the order statistics of {@code M}
 * uniforms (Devroye 1986, <i>Non-Uniform Random Variate Generation</i>, ch. V, sec. 2). The sums
 * are formed in index order here and continued in the same order by each block from
 * {@code S_{k-1}}, so both get the same doubles.
 */
public final class ResamplingPlanner {

    private ResamplingPlanner() {
    }

    /**
     * Plans a {@code MULTINOMIAL}, {@code STRATIFIED} or {@code SYSTEMATIC} step.
     *
     * @param weightTotal each block's sum of fixed-point weights, by block number
     * @return one plan per block, by block number
     * @throws IllegalArgumentException for {@code RESIDUAL}, a negative iteration, totals that do
     *     not match the layout, or a zero total weight
     */
    public static BlockResamplingPlan[] plan(ResamplingScheme scheme, long seed, int iteration, BlockLayout layout,
            long[] weightTotal) {
        if (scheme == ResamplingScheme.RESIDUAL) {
            throw new IllegalArgumentException("RESIDUAL needs two passes: use residualSplit and planResidual");
        }
        checkIteration(iteration);
        long total = checkWeights(layout, weightTotal, "weightTotal");
        if (total == 0) {
            throw new IllegalArgumentException("total weight is zero: every particle has weight 0 after quantisation");
        }
        return planPoints(scheme, scheme, seed, iteration, layout, weightTotal, total, layout.populationSize(),
                new long[layout.blockCount()]);
    }

    /**
     * The global numbers for the first residual pass.
     *
     * @throws IllegalArgumentException if the totals do not match the layout or sum to zero
     */
    public static ResidualSplit residualSplit(BlockLayout layout, long[] weightTotal) {
        long total = checkWeights(layout, weightTotal, "weightTotal");
        if (total == 0) {
            throw new IllegalArgumentException("total weight is zero: every particle has weight 0 after quantisation");
        }
        int n = layout.populationSize();
        // Exact remainders sum to (N - sum of floors) * T < N * T < 2^(bits(N) + bits(T)).
        int bits = (64 - Long.numberOfLeadingZeros(n)) + (64 - Long.numberOfLeadingZeros(total));
        return new ResidualSplit(n, total, Math.max(0, bits - 63));
    }

    /**
     * Plans the random part of a residual step from what the blocks reported after
     * {@link OffspringCounter#splitResidual}.
     *
     * @param totals each block's report, by block number
     * @throws IllegalArgumentException if the reports do not match the layout, or the floors add
     *     up to more than {@code N}
     */
    public static BlockResamplingPlan[] planResidual(long seed, int iteration, BlockLayout layout, ResidualSplit split,
            ResidualTotals[] totals) {
        checkIteration(iteration);
        if (split.populationSize() != layout.populationSize()) {
            throw new IllegalArgumentException("split is for " + split.populationSize()
                    + " particles, layout holds " + layout.populationSize());
        }
        int blocks = layout.blockCount();
        if (totals.length != blocks) {
            throw new IllegalArgumentException("need one ResidualTotals per block (" + blocks + "), got " + totals.length);
        }
        long[] floors = new long[blocks];
        long[] remainders = new long[blocks];
        long floorSum = 0;
        for (int b = 0; b < blocks; b++) {
            floors[b] = totals[b].floorTotal();
            remainders[b] = totals[b].remainderTotal();
            if (floors[b] > layout.populationSize() || (layout.size(b) == 0 && floors[b] != 0)) {
                throw new IllegalArgumentException("block " + b + " reports " + floors[b] + " certain copies");
            }
            floorSum += floors[b];
        }
        if (floorSum > layout.populationSize()) {
            throw new IllegalArgumentException("certain copies add up to " + floorSum + " > N = "
                    + layout.populationSize());
        }
        long remainderTotal = checkWeights(layout, remainders, "remainderTotal");
        int points = layout.populationSize() - (int) floorSum;
        if (points > 0 && remainderTotal == 0) {
            throw new IllegalStateException(points + " random copies to place but all residual weights are 0");
        }
        return planPoints(ResamplingScheme.RESIDUAL, ResamplingScheme.MULTINOMIAL, seed, iteration, layout,
                remainders, remainderTotal, points, floors);
    }

    /** The layout after every block has expanded its offspring, for {@link Redistribution#plan}. */
    public static BlockLayout expandedLayout(BlockResamplingPlan[] plans) {
        long[] first = new long[plans.length];
        int[] size = new int[plans.length];
        for (int b = 0; b < plans.length; b++) {
            first[b] = plans[b].firstNewIndex();
            size[b] = plans[b].offspringCount();
        }
        return BlockLayout.of(first, size);
    }

    private static BlockResamplingPlan[] planPoints(ResamplingScheme scheme, ResamplingScheme points, long seed,
            int iteration, BlockLayout layout, long[] weight, long total, int pointCount, long[] certain) {
        int blocks = layout.blockCount();
        long[] before = new long[blocks];
        long running = 0;
        for (int j = 0; j < blocks; j++) {
            int b = layout.blockAt(j);
            before[b] = running;
            running += weight[b];
        }
        int[] firstPoint = new int[blocks];
        double[] sumBefore = new double[blocks];
        double sumAll = 0;
        long offset = 0;
        RandomStream stream = new RandomStream(seed, StreamPurpose.RESAMPLING, iteration, 0);
        if (pointCount > 0) {
            switch (points) {
                case SYSTEMATIC:
                    offset = PointPositions.systematicOffset(stream, seed, iteration, total);
                    for (int b = 0; b < blocks; b++) {
                        firstPoint[b] = firstSystematicAtOrAfter(before[b], pointCount, total, offset);
                    }
                    break;
                case STRATIFIED:
                    for (int b = 0; b < blocks; b++) {
                        firstPoint[b] = firstStratifiedAtOrAfter(stream, seed, iteration, before[b], pointCount, total);
                    }
                    break;
                default:
                    sumAll = multinomialStarts(stream, seed, iteration, layout, before, pointCount, total,
                            firstPoint, sumBefore);
                    break;
            }
        }
        BlockResamplingPlan[] plans = new BlockResamplingPlan[blocks];
        long newIndex = 0;
        for (int j = 0; j < blocks; j++) {
            int b = layout.blockAt(j);
            int nextPoint = j + 1 < blocks ? firstPoint[layout.blockAt(j + 1)] : pointCount;
            int offspring = (int) certain[b] + nextPoint - firstPoint[b];
            plans[b] = new BlockResamplingPlan(scheme, seed, iteration, layout.size(b), pointCount, total, before[b],
                    weight[b], firstPoint[b], offset, sumBefore[b], sumAll, newIndex, offspring);
            newIndex += offspring;
        }
        return plans;
    }

    /** Number of systematic points below {@code start}, by bisection on the monotone positions. */
    private static int firstSystematicAtOrAfter(long start, int n, long total, long offset) {
        int low = 0;
        int high = n;
        while (low < high) {
            int mid = (low + high) >>> 1;
            if (PointPositions.evenlySpaced(mid, n, total, offset) < start) {
                low = mid + 1;
            } else {
                high = mid;
            }
        }
        return low;
    }

    /** Number of stratified points below {@code start}; positions increase strictly with the stratum. */
    private static int firstStratifiedAtOrAfter(RandomStream stream, long seed, int iteration, long start, int n,
            long total) {
        int low = 0;
        int high = n;
        while (low < high) {
            int mid = (low + high) >>> 1;
            if (PointPositions.stratified(stream, seed, iteration, mid, n, total) < start) {
                low = mid + 1;
            } else {
                high = mid;
            }
        }
        return low;
    }

    /**
     * One pass over the spacings keeps their running sums; the total and each block's first point
     * and running sum come from those. The running sum to point {@code k} is the same chain of
     * additions the total starts with, so both are the doubles the blocks compute.
     */
    private static double multinomialStarts(RandomStream stream, long seed, int iteration, BlockLayout layout,
            long[] before, int m, long total, int[] firstPoint, double[] sumBefore) {
        double[] running = new double[m + 1];
        double sumAll = 0;
        for (int j = 0; j <= m; j++) {
            sumAll += PointPositions.spacing(stream, seed, iteration, j);
            running[j] = sumAll;
        }
        int blocks = layout.blockCount();
        int position = 0;
        for (int k = 0; k < m && position < blocks; k++) {
            long y = PointPositions.multinomial(running[k], sumAll, total);
            while (position < blocks && before[layout.blockAt(position)] <= y) {
                int b = layout.blockAt(position++);
                firstPoint[b] = k;
                sumBefore[b] = k == 0 ? 0.0 : running[k - 1];
            }
        }
        while (position < blocks) {
            int b = layout.blockAt(position++);
            firstPoint[b] = m;
            sumBefore[b] = m == 0 ? 0.0 : running[m - 1];
        }
        return sumAll;
    }

    private static long checkWeights(BlockLayout layout, long[] weight, String name) {
        if (weight.length != layout.blockCount()) {
            throw new IllegalArgumentException("need one " + name + " per block (" + layout.blockCount() + "), got "
                    + weight.length);
        }
        long total = 0;
        for (int b = 0; b < weight.length; b++) {
            if (weight[b] < 0 || (layout.size(b) == 0 && weight[b] != 0)) {
                throw new IllegalArgumentException(name + "[" + b + "] must be >= 0 (0 for an empty block), was "
                        + weight[b]);
            }
            try {
                total = Math.addExact(total, weight[b]);
            } catch (ArithmeticException e) {
                throw new IllegalArgumentException(name + " overflows a long: the log-normaliser is far too low", e);
            }
        }
        return total;
    }

    private static void checkIteration(int iteration) {
        if (iteration < 0) {
            throw new IllegalArgumentException("iteration must be >= 0, was " + iteration);
        }
    }
}
