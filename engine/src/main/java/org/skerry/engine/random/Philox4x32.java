package org.skerry.engine.random;

/**
 * The Philox4x32-10 counter-based block function: a keyed bijection from a 128-bit counter to
 * 128 random bits, so any block of a stream can be computed without computing the ones before.
 *
 * <p>Salmon, Moraes, Dror &amp; Shaw (2011), "Parallel random numbers: as easy as 1, 2, 3",
 * Proceedings of SC'11. Ten rounds of the 4x32 multiply–xor network with the published
 * multipliers and Weyl key increments. Pure integer arithmetic, so every JVM on every processor
 * gives the same bits.
 */
public final class Philox4x32 {

    private static final long MULTIPLIER_0 = 0xD2511F53L;
    private static final long MULTIPLIER_1 = 0xCD9E8D57L;
    private static final int WEYL_0 = 0x9E3779B9;
    private static final int WEYL_1 = 0xBB67AE85;
    private static final int ROUNDS = 10;

    private Philox4x32() {
    }

    /**
     * Computes one block: {@code out[0..3]} receives the four output words for the counter
     * {@code (c0, c1, c2, c3)} (c0 the least significant word) under the key {@code (k0, k1)}.
     */
    public static void block(int c0, int c1, int c2, int c3, int k0, int k1, int[] out) {
        int x0 = c0;
        int x1 = c1;
        int x2 = c2;
        int x3 = c3;
        int key0 = k0;
        int key1 = k1;
        for (int round = 0; round < ROUNDS; round++) {
            long product0 = MULTIPLIER_0 * (x0 & 0xFFFFFFFFL);
            long product1 = MULTIPLIER_1 * (x2 & 0xFFFFFFFFL);
            int y0 = (int) (product1 >>> 32) ^ x1 ^ key0;
            int y1 = (int) product1;
            int y2 = (int) (product0 >>> 32) ^ x3 ^ key1;
            int y3 = (int) product0;
            x0 = y0;
            x1 = y1;
            x2 = y2;
            x3 = y3;
            key0 += WEYL_0;
            key1 += WEYL_1;
        }
        out[0] = x0;
        out[1] = x1;
        out[2] = x2;
        out[3] = x3;
    }
}
