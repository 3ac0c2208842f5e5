package org.skerry.engine.resample;

/**
 * Offspring counts for a population held in one array, running the driver and block sides
 * back to back. For tests and the thread backend; gives the same counts as any split of the same
 * population into blocks with the same log-normaliser. Schemes as in {@link ResamplingScheme}.
 */
public final class Resampling {

    private Resampling() {
    }

    /**
     * The offspring counts of particles {@code 0..n-1}, summing to {@code n}.
     *
     * @param logWeights unnormalised log-weights; {@code -infinity} means weight 0
     * @throws IllegalArgumentException if {@code n < 1} or beyond the array, a log-weight is NaN
     *     or +infinity, or every weight is 0
     */
    public static int[] offspring(ResamplingScheme scheme, double[] logWeights, int n, long seed, int iteration) {
        if (n < 1 || n > logWeights.length) {
            throw new IllegalArgumentException("n must be in [1, " + logWeights.length + "], was " + n);
        }
        double max = maxLogWeight(logWeights, n);
        long[] q = new long[n];
        long total = WeightQuantiser.quantise(logWeights, n, max, logSumRelative(logWeights, n, max), q);
        BlockLayout layout = BlockLayout.of(new long[] {0}, new int[] {n});
        int[] offspring = new int[n];
        BlockResamplingPlan plan;
        if (scheme == ResamplingScheme.RESIDUAL) {
            ResidualSplit split = ResamplingPlanner.residualSplit(layout, new long[] {total});
            ResidualTotals totals = OffspringCounter.splitResidual(split, q, n, offspring);
            plan = ResamplingPlanner.planResidual(seed, iteration, layout, split, new ResidualTotals[] {totals})[0];
        } else {
            plan = ResamplingPlanner.plan(scheme, seed, iteration, layout, new long[] {total})[0];
        }
        OffspringCounter.count(plan, q, n, offspring);
        return offspring;
    }

    /**
     * {@code log(sum exp(logWeights[0..n)))} with {@link StrictMath}, summed in index order, so it
     * is the same on every JVM. For huge log-weights prefer the unsummed pair
     * {@link #maxLogWeight} and {@link #logSumRelative} (see {@link WeightQuantiser}).
     *
     * @throws IllegalArgumentException if every weight is 0, or a log-weight is NaN or +infinity
     */
    public static double logSumExp(double[] logWeights, int n) {
        double max = maxLogWeight(logWeights, n);
        return max + logSumRelative(logWeights, n, max);
    }

    /**
     * The largest of {@code logWeights[0..n)}.
     *
     * @throws IllegalArgumentException if every weight is 0, or a log-weight is NaN or +infinity
     */
    public static double maxLogWeight(double[] logWeights, int n) {
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            double w = logWeights[i];
            if (Double.isNaN(w) || w == Double.POSITIVE_INFINITY) {
                throw new IllegalArgumentException("logWeights[" + i + "] must be < +infinity and not NaN, was " + w);
            }
            max = Math.max(max, w);
        }
        if (max == Double.NEGATIVE_INFINITY) {
            throw new IllegalArgumentException("all " + n + " weights are zero (log-weight -infinity)");
        }
        return max;
    }

    /** {@code log(sum exp(logWeights[i] - max))} over {@code [0, n)}, in index order with {@link StrictMath}. */
    public static double logSumRelative(double[] logWeights, int n, double max) {
        double sum = 0;
        for (int i = 0; i < n; i++) {
            sum += StrictMath.exp(logWeights[i] - max);
        }
        return StrictMath.log(sum);
    }
}
