package org.skerry.engine.resample;

import org.skerry.engine.math.TableExp;

/**
 * Turns log-weights into non-negative fixed-point integers, so that sums of weights are exact
 * and associative and every grouping of particles into blocks sees the same prefix sums. Runs on
 * the block side.
 *
 * <p>Particle {@code i} gets {@code q_i = floor(exp(logWeight_i - L) * 2^62)}, clamped to
 * {@code [0, 2^62]}, where {@code L} is a log-normaliser shared by all blocks (normally the
 * log of the sum of the weights, so the total is close to {@code 2^62}). Any {@code L} works
 * provided every block uses the same one and the total fits in a {@code long}. The exponential is
 * {@link TableExp#exp} (pure Java, bit-identical everywhere), and multiplying by a power of two is exact, so the integers are the
 * same on every JVM.
 *
 * <p>When log-weights are huge in magnitude (beyond about 2<sup>50</sup>) a single double
 * {@code L} cannot carry the log of the sum: {@code max + log(sum exp(logw - max))} rounds to
 * {@code max}, and three equal top weights would then sum to {@code 3 * 2^62}, overflowing. The
 * two-part form takes {@code L = reference + logSumRelative} unsummed, normally the global maximum
 * log-weight (exact and the same in any grouping) and the log of the sum relative to it
 * (between 0 and {@code log N}), and computes {@code (logw - reference) - logSumRelative}.
 */
public final class WeightQuantiser {

    /** The fixed-point value of a weight equal to the normaliser: {@code 2^62}. */
    public static final long ONE = 1L << 62;

    private static final double SCALE = 0x1.0p62;
    /**
     * Below this, {@code exp(x) * 2^62 < 0.4} even allowing exp an error of several ulps, so the
     * floor is 0 and exp need not be called: the answer is the same, and degenerate weights are
     * cheap.
     */
    private static final double NEGLIGIBLE = -44.0;

    private WeightQuantiser() {
    }

    /**
     * The fixed-point weight of one particle.
     *
     * @throws IllegalArgumentException if {@code logNormaliser} is not finite, or
     *     {@code logWeight} is NaN or +infinity
     */
    public static long quantise(double logWeight, double logNormaliser) {
        return quantise(logWeight, logNormaliser, 0);
    }

    /**
     * The fixed-point weight of one particle, {@code floor(exp((logWeight - reference) -
     * logSumRelative) * 2^62)} clamped to {@code [0, 2^62]}.
     *
     * @throws IllegalArgumentException if {@code reference} or {@code logSumRelative} is not
     *     finite, or {@code logWeight} is NaN or +infinity
     */
    public static long quantise(double logWeight, double reference, double logSumRelative) {
        checkNormaliser(reference, logSumRelative);
        checkLogWeight(logWeight, 0);
        return quantiseChecked(logWeight, reference, logSumRelative);
    }

    /**
     * Quantises {@code logWeights[0..size)} into {@code out[0..size)} and returns their sum.
     *
     * @throws IllegalArgumentException if {@code logNormaliser} is not finite, a log-weight is
     *     NaN or +infinity, an array is shorter than {@code size}, or the sum exceeds
     *     {@link Long#MAX_VALUE} (then {@code logNormaliser} is below the log of the sum by more
     *     than about log 2)
     */
    public static long quantise(double[] logWeights, int size, double logNormaliser, long[] out) {
        return quantise(logWeights, size, logNormaliser, 0, out);
    }

    /**
     * Two-part form of {@link #quantise(double[], int, double, long[])}: quantises with the
     * normaliser {@code reference + logSumRelative}, never adding the two.
     *
     * @throws IllegalArgumentException as the one-part form
     */
    public static long quantise(double[] logWeights, int size, double reference, double logSumRelative, long[] out) {
        checkNormaliser(reference, logSumRelative);
        if (size < 0 || logWeights.length < size || out.length < size) {
            throw new IllegalArgumentException("size must be in [0, array length], was " + size);
        }
        long total = 0;
        try {
            for (int i = 0; i < size; i++) {
                double logWeight = logWeights[i];
                if (!(logWeight < Double.POSITIVE_INFINITY)) {
                    checkLogWeight(logWeight, i);
                }
                long q = quantiseChecked(logWeight, reference, logSumRelative);
                out[i] = q;
                total = Math.addExact(total, q);
            }
        } catch (ArithmeticException e) {
            throw new IllegalArgumentException("quantised weights overflow a long: normaliser "
                    + reference + " + " + logSumRelative + " is far below the log of the sum of the weights", e);
        }
        return total;
    }

    private static long quantiseChecked(double logWeight, double reference, double logSumRelative) {
        double x = (logWeight - reference) - logSumRelative;
        // x >= 0 only when the weight reaches the normaliser (possible for L a little low from
        // rounding); -infinity gives exp = 0, the wanted zero weight.
        if (x < 0) {
            return x < NEGLIGIBLE ? 0 : (long) (TableExp.exp(x) * SCALE);
        }
        return ONE;
    }

    private static void checkNormaliser(double reference, double logSumRelative) {
        if (!Double.isFinite(reference)) {
            throw new IllegalArgumentException("log-normaliser must be finite, was " + reference);
        }
        if (!Double.isFinite(logSumRelative)) {
            throw new IllegalArgumentException("logSumRelative must be finite, was " + logSumRelative);
        }
    }

    private static void checkLogWeight(double logWeight, int i) {
        if (Double.isNaN(logWeight) || logWeight == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("logWeight[" + i + "] must be < +infinity and not NaN, was "
                    + logWeight);
        }
    }
}
