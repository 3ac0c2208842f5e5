package org.skerry.engine.weight;

import org.skerry.engine.math.ExactSum;

/**
 * Statistics of a population's log-weights, computed on the driver from arrays of scalars: the
 * log of the weight total (log-sum-exp), the effective sample size and normalised weights.
 *
 * <p>Sums are exact ({@link ExactSum}) and exponentials come from {@link StrictMath}, so the
 * results do not depend on the order of the particles in the arrays — the driver may receive them
 * block by block in any order. A log-weight of {@code -Infinity} is a zero weight; NaN and
 * {@code +Infinity} never occur (invalid evaluations are mapped to {@code -Infinity} upstream).
 */
public final class LogWeights {

    private LogWeights() {
    }

    /** The largest entry of {@code logWeights[0..count)}, or {@code -Infinity} if all are. */
    public static double max(double[] logWeights, int count) {
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < count; i++) {
            max = Math.max(max, logWeights[i]);
        }
        return max;
    }

    /** {@code log Σ exp(logWeights[i])}, or {@code -Infinity} when every weight is zero. */
    public static double logSum(double[] logWeights, int count) {
        double max = max(logWeights, count);
        if (max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        ExactSum sum = new ExactSum();
        for (int i = 0; i < count; i++) {
            sum.add(StrictMath.exp(logWeights[i] - max));
        }
        return max + StrictMath.log(sum.doubleValue());
    }

    /**
     * The effective sample size {@code (Σw)² / Σw²} (Kong, Liu &amp; Wong 1994, JASA 89), between
     * 1 and {@code count}; 0 when every weight is zero.
     */
    public static double effectiveSampleSize(double[] logWeights, int count) {
        double max = max(logWeights, count);
        if (max == Double.NEGATIVE_INFINITY) {
            return 0.0;
        }
        ExactSum sum = new ExactSum();
        ExactSum sumOfSquares = new ExactSum();
        for (int i = 0; i < count; i++) {
            double w = StrictMath.exp(logWeights[i] - max);
            sum.add(w);
            sumOfSquares.add(w * w);
        }
        double total = sum.doubleValue();
        return total * total / sumOfSquares.doubleValue();
    }

    /** Number of entries with positive weight. */
    public static int countAlive(double[] logWeights, int count) {
        int alive = 0;
        for (int i = 0; i < count; i++) {
            if (logWeights[i] != Double.NEGATIVE_INFINITY) {
                alive++;
            }
        }
        return alive;
    }

    /** Writes normalised weights {@code exp(logWeights[i] - logTotal)} into {@code out}. */
    public static void normalise(double[] logWeights, int count, double logTotal, double[] out) {
        for (int i = 0; i < count; i++) {
            out[i] = StrictMath.exp(logWeights[i] - logTotal);
        }
    }
}
