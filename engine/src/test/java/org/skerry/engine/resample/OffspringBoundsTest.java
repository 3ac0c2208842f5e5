package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Deterministic bounds each scheme guarantees in every replication, checked exactly against
 * {@code N W_i = N q_i / T} computed with BigInteger from independently quantised weights.
 */
class OffspringBoundsTest {

    private static final int REPLICATIONS = 300;

    @Test
    @DisplayName("systematic: floor(N W_i) <= o_i <= ceil(N W_i) (Kitagawa 1996; Douc, Cappé & Moulines 2005)")
    void systematicWithinFloorAndCeiling() {
        check(ResamplingScheme.SYSTEMATIC, 0, 0);
    }

    @Test
    @DisplayName("residual: o_i >= floor(N W_i) (Liu & Chen 1998)")
    void residualAtLeastFloor() {
        check(ResamplingScheme.RESIDUAL, 0, Integer.MAX_VALUE);
    }

    @Test
    @DisplayName("stratified: floor(N W_i) - 1 <= o_i <= ceil(N W_i) + 1")
    void stratifiedWithinOneOfFloorAndCeiling() {
        // Particle i's weight interval, in stratum units, has length l = N W_i. It contains at
        // least floor(l) - 1 whole strata (each gives exactly one point) and meets at most
        // ceil(l) + 1 strata (each gives at most one point): derived here, not quoted.
        check(ResamplingScheme.STRATIFIED, 1, 1);
    }

    /** Checks floor - below <= o_i <= ceil + above over random weight vectors and seeds. */
    private static void check(ResamplingScheme scheme, int below, int above) {
        Random random = new Random(scheme.ordinal() + 12345);
        for (int r = 0; r < REPLICATIONS; r++) {
            int n = 2 + random.nextInt(200);
            double[] logWeights = new double[n];
            double spread = r % 3 == 0 ? 40 : 2;
            for (int i = 0; i < n; i++) {
                logWeights[i] = random.nextInt(10) == 0 ? Double.NEGATIVE_INFINITY : random.nextGaussian() * spread;
            }
            logWeights[0] = 1;
            // Any normaliser shared by all blocks is valid; the test picks its own.
            double logNormaliser = logSumExpPlain(logWeights);
            ExactWeights exact = new ExactWeights(logWeights, logNormaliser);
            int blocks = 1 + random.nextInt(4);
            int[] sizes = new int[blocks];
            for (int i = 0; i < n; i++) {
                sizes[random.nextInt(blocks)]++;
            }
            int[] o = BlockPipeline.offspring(scheme, logWeights, logNormaliser, sizes,
                    GroupingIndependenceTest.shuffledIds(blocks, random), random.nextLong(), r);
            assertEquals(n, GroupingIndependenceTest.sum(o), "sum of offspring");
            for (int i = 0; i < n; i++) {
                long floor = exact.floor(n, i);
                long ceil = exact.ceil(n, i);
                assertTrue(o[i] >= floor - below, scheme + " rep " + r + " particle " + i + ": " + o[i] + " < "
                        + floor + " - " + below);
                assertTrue(o[i] <= ceil + (long) above, scheme + " rep " + r + " particle " + i + ": " + o[i]
                        + " > " + ceil + " + " + above);
                if (exact.q[i].signum() == 0) {
                    assertEquals(0, o[i], "zero weight gets no copies");
                }
            }
        }
    }

    private static double logSumExpPlain(double[] logWeights) {
        double max = Double.NEGATIVE_INFINITY;
        for (double w : logWeights) {
            max = Math.max(max, w);
        }
        double s = 0;
        for (double w : logWeights) {
            s += Math.exp(w - max);
        }
        return max + Math.log(s);
    }
}
