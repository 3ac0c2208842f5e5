package org.skerry.engine.resample;

import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * The block side of resampling: given a block's fixed-point weights (from
 * {@link WeightQuantiser}) in canonical order and the {@link BlockResamplingPlan} the driver made,
 * counts how many resampling points fall on each particle. The counts depend only on the
 * particle's place in the whole population, never on the block it sits in.
 *
 * <p>Particle {@code i} owns the cumulative weight interval {@code [C_i, C_i + q_i)}; the
 * points are walked in increasing position from the plan's first point, so a block costs
 * O(particles + points) and zero-weight particles never receive a copy. Schemes: Kitagawa
 * (1996), JCGS 5(1) (stratified, systematic); Carpenter, Clifford &amp; Fearnhead (1999)
 * (systematic); Liu &amp; Chen (1998), JASA 93(443) (residual).
 */
public final class OffspringCounter {

    private OffspringCounter() {
    }

    /**
     * Writes the offspring counts of the block's particles into {@code offspring[0..size)}. For a
     * {@code RESIDUAL} plan, {@code weights} must hold the residual weights and {@code offspring}
     * the certain copies, both left there by {@link #splitResidual}; the random copies are added.
     *
     * @throws IllegalArgumentException if {@code size} differs from the plan's or an array is too short
     * @throws IllegalStateException if the weights do not add up to the block weight the plan was
     *     made from, or the counts do not add up to the planned number of offspring
     */
    public static void count(BlockResamplingPlan plan, long[] weights, int size, int[] offspring) {
        if (size != plan.particleCount()) {
            throw new IllegalArgumentException("size must be the plan's " + plan.particleCount() + ", was " + size);
        }
        if (weights.length < size || offspring.length < size) {
            throw new IllegalArgumentException("arrays too short for " + size + " particles");
        }
        long lastPoint;
        switch (plan.scheme()) {
            case SYSTEMATIC:
                lastPoint = systematic(plan, weights, size, offspring);
                break;
            case STRATIFIED:
                lastPoint = stratified(plan, weights, size, offspring);
                break;
            case MULTINOMIAL:
                lastPoint = multinomial(plan, weights, size, offspring, false);
                break;
            default:
                lastPoint = multinomial(plan, weights, size, offspring, true);
                break;
        }
        long total = 0;
        if (plan.scheme() == ResamplingScheme.RESIDUAL) {
            for (int i = 0; i < size; i++) {
                total += offspring[i];
            }
        } else {
            // Each copy consumed one point, so the walk's point count is the offspring total.
            total = lastPoint - plan.firstPoint();
        }
        if (total != plan.offspringCount()) {
            throw new IllegalStateException("block has " + total + " offspring, the plan expects "
                    + plan.offspringCount());
        }
    }

    /**
     * First residual pass: writes the certain copies {@code floor(N q_i / T)} into
     * {@code offspring[0..size)} and replaces each weight by its residual weight
     * {@code (N q_i - T floor(N q_i / T)) >>> shift}, computed exactly in integers.
     *
     * @return the block's totals, to send to the driver
     * @throws IllegalArgumentException if an array is too short or a weight is negative or above {@code T}
     */
    public static ResidualTotals splitResidual(ResidualSplit split, long[] weights, int size, int[] offspring) {
        if (size < 0 || weights.length < size || offspring.length < size) {
            throw new IllegalArgumentException("size must be in [0, array length], was " + size);
        }
        long n = split.populationSize();
        long total = split.weightTotal();
        int shift = split.shift();
        long floors = 0;
        long remainders = 0;
        for (int i = 0; i < size; i++) {
            long q = weights[i];
            if (q < 0 || q > total) {
                throw new IllegalArgumentException("weights[" + i + "] must be in [0, " + total + "], was " + q);
            }
            long d = ExactArithmetic.floorMulDiv(q, n, total);
            // The exact remainder lies in [0, T), so the wrapped 64-bit difference is exact.
            long r = (q * n - d * total) >>> shift;
            offspring[i] = (int) d;
            weights[i] = r;
            floors += d;
            remainders += r;
        }
        return new ResidualTotals(floors, remainders);
    }

    private static long systematic(BlockResamplingPlan plan, long[] weights, int size, int[] offspring) {
        long n = plan.pointCount();
        long total = plan.weightTotal();
        long offset = plan.systematicOffset();
        long step = total / n;
        long stepRemainder = total % n;
        long k = plan.firstPoint();
        // Point k is at y = floor((k*T + V) / n) with remainder rho; moving to k+1 adds T = step*n + stepRemainder.
        long y = PointPositions.evenlySpaced(k, n, total, offset);
        long rho = (k * stepRemainder + offset % n) % n;
        long cumulative = plan.weightBefore();
        for (int i = 0; i < size; i++) {
            cumulative += weights[i];
            int copies = 0;
            while (k < n && y < cumulative) {
                copies++;
                k++;
                y += step;
                rho += stepRemainder;
                if (rho >= n) {
                    rho -= n;
                    y++;
                }
            }
            offspring[i] = copies;
        }
        checkWeight(plan, cumulative);
        return k;
    }

    private static long stratified(BlockResamplingPlan plan, long[] weights, int size, int[] offspring) {
        int n = plan.pointCount();
        long total = plan.weightTotal();
        long seed = plan.seed();
        int iteration = plan.iteration();
        RandomStream stream = new RandomStream(seed, StreamPurpose.RESAMPLING, iteration, 0);
        int k = plan.firstPoint();
        long y = k < n ? PointPositions.stratified(stream, seed, iteration, k, n, total) : Long.MAX_VALUE;
        long cumulative = plan.weightBefore();
        for (int i = 0; i < size; i++) {
            cumulative += weights[i];
            int copies = 0;
            while (y < cumulative) {
                copies++;
                k++;
                y = k < n ? PointPositions.stratified(stream, seed, iteration, k, n, total) : Long.MAX_VALUE;
            }
            offspring[i] = copies;
        }
        checkWeight(plan, cumulative);
        return k;
    }

    private static long multinomial(BlockResamplingPlan plan, long[] weights, int size, int[] offspring,
            boolean add) {
        int m = plan.pointCount();
        long total = plan.weightTotal();
        double sumAll = plan.sumAll();
        long seed = plan.seed();
        int iteration = plan.iteration();
        RandomStream stream = new RandomStream(seed, StreamPurpose.RESAMPLING, iteration, 0);
        int k = plan.firstPoint();
        // Continue the driver's running sum in the same order, so the doubles agree bit for bit.
        double sum = plan.sumBefore();
        long y = Long.MAX_VALUE;
        if (k < m) {
            sum += PointPositions.spacing(stream, seed, iteration, k);
            y = PointPositions.multinomial(sum, sumAll, total);
        }
        long cumulative = plan.weightBefore();
        for (int i = 0; i < size; i++) {
            cumulative += weights[i];
            int copies = 0;
            while (y < cumulative) {
                copies++;
                k++;
                if (k < m) {
                    sum += PointPositions.spacing(stream, seed, iteration, k);
                    y = PointPositions.multinomial(sum, sumAll, total);
                } else {
                    y = Long.MAX_VALUE;
                }
            }
            offspring[i] = add ? offspring[i] + copies : copies;
        }
        checkWeight(plan, cumulative);
        return k;
    }

    private static void checkWeight(BlockResamplingPlan plan, long end) {
        if (end != plan.weightBefore() + plan.blockWeight()) {
            throw new IllegalStateException("block weights sum to " + (end - plan.weightBefore())
                    + ", the plan was made for " + plan.blockWeight());
        }
    }
}
