package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The offspring counts must be bit-identical however the population is split into blocks and
 * however the blocks are numbered: the property that lets the thread backend and Spark agree.
 * Checked against the single-block run of the same pipeline for every scheme.
 */
class GroupingIndependenceTest {

    private static final int N = 1000;

    @Test
    @DisplayName("same counts for 1, 2, 3, 7 and 8 blocks, uneven and empty blocks, shuffled block numbers")
    void countsDoNotDependOnGrouping() {
        Random random = new Random(20240501);
        double[] logWeights = new double[N];
        for (int i = 0; i < N; i++) {
            // Wide dynamic range, a few dominant particles and some zero weights.
            logWeights[i] = random.nextGaussian() * 8;
        }
        logWeights[17] = 60;
        logWeights[500] = 59.5;
        for (int i = 0; i < N; i += 37) {
            logWeights[i] = Double.NEGATIVE_INFINITY;
        }
        // The same two-part normaliser as the convenience method, so their quantised weights agree.
        double max = Resampling.maxLogWeight(logWeights, N);
        double relative = Resampling.logSumRelative(logWeights, N, max);
        int[][] groupings = {
            {500, 500},
            {1, 998, 1},
            {333, 334, 333},
            {10, 200, 3, 400, 87, 299, 1},
            {0, 125, 125, 0, 250, 250, 250, 0},
            {999, 1},
        };
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            for (long seed : new long[] {1, 0xDEADBEEFCAFEL, -7}) {
                int iteration = (int) (seed & 15);
                int[] reference = BlockPipeline.offspring(scheme, logWeights, max, relative, new int[] {N},
                        new int[] {0}, seed, iteration);
                assertEquals(N, sum(reference), scheme + " sum");
                assertArrayEquals(reference, Resampling.offspring(scheme, logWeights, N, seed, iteration),
                        scheme + " convenience method");
                for (int[] sizes : groupings) {
                    int[] ids = shuffledIds(sizes.length, random);
                    assertArrayEquals(reference,
                            BlockPipeline.offspring(scheme, logWeights, max, relative, sizes, ids, seed, iteration),
                            scheme + " seed " + seed + " grouping " + java.util.Arrays.toString(sizes));
                }
            }
        }
    }

    @Test
    @DisplayName("all population sizes 1..40 split into random blocks agree with one block")
    void smallPopulationsAllGroupings() {
        Random random = new Random(99);
        for (int n = 1; n <= 40; n++) {
            double[] logWeights = new double[n];
            for (int i = 0; i < n; i++) {
                logWeights[i] = random.nextInt(4) == 0 ? Double.NEGATIVE_INFINITY : random.nextGaussian() * 3;
            }
            logWeights[random.nextInt(n)] = 0;
            double logNormaliser = Resampling.logSumExp(logWeights, n);
            for (ResamplingScheme scheme : ResamplingScheme.values()) {
                int[] reference = BlockPipeline.offspring(scheme, logWeights, logNormaliser, n, 2);
                int blocks = 1 + random.nextInt(Math.min(n, 6) + 2);
                int[] sizes = new int[blocks];
                for (int i = 0; i < n; i++) {
                    sizes[random.nextInt(blocks)]++;
                }
                int[] got = BlockPipeline.offspring(scheme, logWeights, logNormaliser, sizes,
                        shuffledIds(blocks, random), n, 2);
                assertArrayEquals(reference, got, scheme + " n=" + n);
            }
        }
    }

    static int[] shuffledIds(int blocks, Random random) {
        int[] ids = new int[blocks];
        for (int i = 0; i < blocks; i++) {
            ids[i] = i;
        }
        for (int i = blocks - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            int t = ids[i];
            ids[i] = ids[j];
            ids[j] = t;
        }
        return ids;
    }

    static long sum(int[] counts) {
        long s = 0;
        for (int c : counts) {
            s += c;
        }
        return s;
    }
}
