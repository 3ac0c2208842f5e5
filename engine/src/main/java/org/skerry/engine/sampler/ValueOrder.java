package org.skerry.engine.sampler;

/**
 * The positions of the particles of positive weight, in the order of their values as
 * {@link Double#compare} orders them (−0.0 before 0.0, NaN last), ties by position: a stable
 * least-significant-digit radix sort (Knuth, The Art of Computer Programming, vol. 3, §5.2.5) of
 * each value's bits made order-preserving as a signed integer, on primitive arrays, in O(N) time
 * and 24 bytes a particle, where a comparison sort of boxed positions took ~20 bytes and
 * O(N log N) comparisons through a comparator.
 */
final class ValueOrder {

    private static final int DIGIT_BITS = 16;
    private static final int BUCKETS = 1 << DIGIT_BITS;

    private ValueOrder() {
    }

    /** Positions {@code i < n} with {@code weights[i] > 0}, sorted by {@code values[i]}, ties by {@code i}. */
    static int[] positiveByValue(double[] values, double[] weights, int n) {
        int m = 0;
        for (int i = 0; i < n; i++) {
            if (weights[i] > 0) {
                m++;
            }
        }
        long[] keys = new long[m];
        int[] order = new int[m];
        int at = 0;
        for (int i = 0; i < n; i++) {
            if (weights[i] > 0) {
                keys[at] = key(values[i]);
                order[at++] = i;
            }
        }
        long[] keysOut = new long[m];
        int[] orderOut = new int[m];
        int[] counts = new int[BUCKETS];
        for (int shift = 0; shift < Long.SIZE; shift += DIGIT_BITS) {
            java.util.Arrays.fill(counts, 0);
            for (int k = 0; k < m; k++) {
                counts[(int) (keys[k] >>> shift) & (BUCKETS - 1)]++;
            }
            // A digit every key shares leaves the order as it is: skip the pass.
            if (m == 0 || counts[(int) (keys[0] >>> shift) & (BUCKETS - 1)] == m) {
                continue;
            }
            int running = 0;
            for (int b = 0; b < BUCKETS; b++) {
                int c = counts[b];
                counts[b] = running;
                running += c;
            }
            for (int k = 0; k < m; k++) {
                int slot = counts[(int) (keys[k] >>> shift) & (BUCKETS - 1)]++;
                keysOut[slot] = keys[k];
                orderOut[slot] = order[k];
            }
            long[] swapKeys = keys;
            keys = keysOut;
            keysOut = swapKeys;
            int[] swapOrder = order;
            order = orderOut;
            orderOut = swapOrder;
        }
        return order;
    }

    /**
     * A key whose unsigned order is {@link Double#compare}'s order: negative values have all bits
     * but the sign flipped, so a larger magnitude sorts lower; then the sign bit is flipped so
     * negatives sort below positives. NaNs are first made the one canonical NaN.
     */
    static long key(double value) {
        long bits = Double.doubleToLongBits(value);
        return (bits ^ ((bits >> 63) & Long.MAX_VALUE)) ^ Long.MIN_VALUE;
    }
}
