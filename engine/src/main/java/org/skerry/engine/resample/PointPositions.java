package org.skerry.engine.resample;

import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Where the resampling points fall, as integer positions on the fixed-point weight axis
 * {@code [0, W)}: a point at position {@code y} is a copy of the particle whose cumulative weight
 * interval {@code [C_i, C_i + q_i)} contains {@code y}. Both sides call these functions, so the
 * driver's and the blocks' positions agree bit for bit.
 *
 * <p>Systematic and stratified point {@code k} sits at {@code floor((k*W + V_k) / n)} with
 * {@code V_k} uniform on {@code [0, W)}: the real point {@code (k + V_k/W) / n} of the textbook
 * schemes, scaled by {@code W} and floored. Because the weight bounds are integers, "position
 * below {@code C}" is exactly "{@code k*W + V_k < n*C}", so every count is exact integer
 * arithmetic; and as each integer in {@code [0, n*W)} is hit by exactly one {@code (k, V)} pair,
 * the expected count of particle {@code i} is exactly {@code n*q_i/W}.
 */
final class PointPositions {

    private PointPositions() {
    }

    /** {@code floor((k*total + offset) / n)} without overflow, for {@code k <= n < 2^31}, offset below total. */
    static long evenlySpaced(long k, long n, long total, long offset) {
        // k*total may need 93 bits; split total and offset by n so every product stays below 2^62.
        return k * (total / n) + offset / n + (k * (total % n) + offset % n) / n;
    }

    /** The systematic offset: one uniform integer below {@code total} from stream 0. */
    static long systematicOffset(RandomStream stream, long seed, int iteration, long total) {
        stream.reset(seed, StreamPurpose.RESAMPLING, iteration, 0, 0);
        return ExactArithmetic.uniformBelow(stream, total);
    }

    /** The position of stratified point {@code k}, its offset drawn from stream {@code k}. */
    static long stratified(RandomStream stream, long seed, int iteration, long k, long n, long total) {
        stream.reset(seed, StreamPurpose.RESAMPLING, iteration, k, 0);
        return evenlySpaced(k, n, total, ExactArithmetic.uniformBelow(stream, total));
    }

    /** The exponential spacing {@code E_j} from stream {@code j}. */
    static double spacing(RandomStream stream, long seed, int iteration, long j) {
        return stream.reset(seed, StreamPurpose.RESAMPLING, iteration, j, 0).nextExponential();
    }

    /**
     * The position of a multinomial point whose running sum of spacings is {@code sum}:
     * {@code floor(sum / sumAll * total)}, clamped below {@code total}. Monotone in {@code sum},
     * so sorted sums give sorted positions. Rounding the double product moves a point by at most a
     * few units of 2<sup>-52</sup> of the total, far below any Monte Carlo error.
     */
    static long multinomial(double sum, double sumAll, long total) {
        return Math.min((long) (sum / sumAll * (double) total), total - 1);
    }
}
