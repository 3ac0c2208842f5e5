package org.skerry.engine.random;

/**
 * A stream of random numbers addressed by (seed, purpose, iteration, particle index, step), built
 * on {@link Philox4x32}. Because every draw is a pure function of that address and a draw
 * counter, the numbers a particle receives do not depend on which thread, block, partition or
 * executor handles it, nor on what ran before — the basis of skerry's same-seed, same-answer
 * promise.
 *
 * <p>Mapping onto Philox's key and counter (fixed; changing it changes every answer):
 * <pre>
 *   key     k0 = low 32 bits of seed            k1 = high 32 bits of seed
 *   counter c0 = block number within the stream (4 words a block)
 *           c1 = low 32 bits of the particle index
 *           c2 = iteration
 *           c3 = purpose code (bits 24–31) | step (bits 8–23) | particle index bits 32–39 (bits 0–7)
 * </pre>
 * Particle indices are below 2<sup>40</sup>, steps below 2<sup>16</sup>, iterations
 * non-negative {@code int}s. A stream holds at most 2<sup>32</sup> blocks.
 *
 * <p>Instances are mutable and not thread-safe: a worker keeps one and {@link #reset re-keys} it
 * per particle, so the hot path allocates nothing.
 */
public final class RandomStream {

    /** Exclusive upper bound on particle indices. */
    public static final long MAX_PARTICLE_INDEX = 1L << 40;
    /** Exclusive upper bound on step numbers. */
    public static final int MAX_STEP = 1 << 16;

    private static final double TWO_POW_MINUS_53 = 0x1.0p-53;
    private static final double TWO_POW_MINUS_52 = 0x1.0p-52;

    private final int[] words = new int[4];
    private int key0;
    private int key1;
    private int counter1;
    private int counter2;
    private int counter3;
    private int blockNumber;
    private int position = 4;
    private boolean hasSpareNormal;
    private double spareNormal;

    /** Creates a stream at the given address. */
    public RandomStream(long seed, StreamPurpose purpose, int iteration, long particleIndex, int step) {
        reset(seed, purpose, iteration, particleIndex, step);
    }

    /** Creates a stream for step 0 at the given address. */
    public RandomStream(long seed, StreamPurpose purpose, int iteration, long particleIndex) {
        this(seed, purpose, iteration, particleIndex, 0);
    }

    /**
     * Moves this stream to a new address and rewinds it to its first draw.
     *
     * @throws IllegalArgumentException if an address component is out of range
     */
    public RandomStream reset(long seed, StreamPurpose purpose, int iteration, long particleIndex, int step) {
        if (purpose == null) {
            throw new IllegalArgumentException("purpose must not be null");
        }
        if (iteration < 0) {
            throw new IllegalArgumentException("iteration must be >= 0, was " + iteration);
        }
        if (particleIndex < 0 || particleIndex >= MAX_PARTICLE_INDEX) {
            throw new IllegalArgumentException("particleIndex must be in [0, 2^40), was " + particleIndex);
        }
        if (step < 0 || step >= MAX_STEP) {
            throw new IllegalArgumentException("step must be in [0, 65536), was " + step);
        }
        key0 = (int) seed;
        key1 = (int) (seed >>> 32);
        counter1 = (int) particleIndex;
        counter2 = iteration;
        counter3 = (purpose.code() << 24) | (step << 8) | (int) ((particleIndex >>> 32) & 0xFF);
        blockNumber = 0;
        position = 4;
        hasSpareNormal = false;
        return this;
    }

    /** The next 32 random bits. */
    public int nextInt() {
        if (position == 4) {
            if (blockNumber == -1) {
                throw new IllegalStateException("random stream exhausted after 2^32 blocks");
            }
            Philox4x32.block(blockNumber, counter1, counter2, counter3, key0, key1, words);
            blockNumber++;
            position = 0;
        }
        return words[position++];
    }

    /** The next 64 random bits. */
    public long nextLong() {
        long high = nextInt();
        return (high << 32) | (nextInt() & 0xFFFFFFFFL);
    }

    /** A uniform double in [0, 1) with 53 random bits. */
    public double nextDouble() {
        return (nextLong() >>> 11) * TWO_POW_MINUS_53;
    }

    /**
     * A uniform double in the open interval (0, 1), safe to take the logarithm of: 52 random bits
     * and a half-step offset, so that neither end can be reached by rounding.
     */
    public double nextOpenDouble() {
        return ((nextLong() >>> 12) + 0.5) * TWO_POW_MINUS_52;
    }

    /** A standard exponential deviate, by inversion with {@link StrictMath#log}. */
    public double nextExponential() {
        return -StrictMath.log(nextOpenDouble());
    }

    /**
     * A standard normal deviate by Marsaglia's polar method (Marsaglia &amp; Bray 1964,
     * SIAM Review 6(3)), using only {@link StrictMath#log} and the correctly rounded square root,
     * so the value is the same on every JVM.
     */
    public double nextNormal() {
        if (hasSpareNormal) {
            hasSpareNormal = false;
            return spareNormal;
        }
        double u;
        double v;
        double s;
        do {
            u = 2.0 * nextDouble() - 1.0;
            v = 2.0 * nextDouble() - 1.0;
            s = u * u + v * v;
        } while (s >= 1.0 || s == 0.0);
        double factor = StrictMath.sqrt(-2.0 * StrictMath.log(s) / s);
        spareNormal = v * factor;
        hasSpareNormal = true;
        return u * factor;
    }

    /** A uniform integer in [0, bound), without modulo bias (Lemire's method). */
    public int nextInt(int bound) {
        if (bound <= 0) {
            throw new IllegalArgumentException("bound must be > 0, was " + bound);
        }
        long product = (nextInt() & 0xFFFFFFFFL) * bound;
        int low = (int) product;
        if (Integer.compareUnsigned(low, bound) < 0) {
            int threshold = Integer.remainderUnsigned(-bound, bound);
            while (Integer.compareUnsigned(low, threshold) < 0) {
                product = (nextInt() & 0xFFFFFFFFL) * bound;
                low = (int) product;
            }
        }
        return (int) (product >>> 32);
    }
}
