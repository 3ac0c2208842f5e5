package org.skerry.engine.resample;

import org.skerry.engine.random.RandomStream;

/**
 * Integer helpers shared by the driver and block sides, so both compute the same numbers:
 * {@code floor(a*b/c)} without overflow, and unbiased uniform integers below a bound.
 */
final class ExactArithmetic {

    private ExactArithmetic() {
    }

    /**
     * {@code floor(a * b / c)} for {@code a, b >= 0}, {@code c > 0}, when the answer is below
     * 2<sup>51</sup>. A double estimate is off by at most one at that size; it is corrected
     * against the exact 128-bit products.
     */
    static long floorMulDiv(long a, long b, long c) {
        long d = (long) ((double) a * (double) b / (double) c);
        while (d > 0 && compareProducts(a, b, d, c) < 0) {
            d--;
        }
        while (compareProducts(a, b, d + 1, c) >= 0) {
            d++;
        }
        return d;
    }

    /** Compares {@code a*b} with {@code d*c} exactly, all four non-negative. */
    static int compareProducts(long a, long b, long d, long c) {
        long high1 = Math.multiplyHigh(a, b);
        long high2 = Math.multiplyHigh(d, c);
        if (high1 != high2) {
            return Long.compare(high1, high2);
        }
        return Long.compareUnsigned(a * b, d * c);
    }

    /** A uniform integer in {@code [0, bound)} by masked rejection (fewer than two tries on average). */
    static long uniformBelow(RandomStream stream, long bound) {
        if (bound == 1) {
            return 0;
        }
        long mask = -1L >>> Long.numberOfLeadingZeros(bound - 1);
        long r;
        do {
            r = stream.nextLong() & mask;
        } while (r >= bound);
        return r;
    }
}
