package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.particle.ParticleBlock;

/**
 * Rebalancing plans against an independent brute force: every choice of which blocks get the
 * larger size, each scored by checking particle by particle whether its block changes.
 */
class RedistributionTest {

    @Test
    @DisplayName("sizes floor/ceil(N/P), runs contiguous, moved count equals brute-force minimum")
    void matchesBruteForceOnRandomSmallCases() {
        Random random = new Random(31337);
        for (int trial = 0; trial < 3000; trial++) {
            int blocks = 1 + random.nextInt(7);
            int n = 1 + random.nextInt(25);
            int[] sizes = new int[blocks];
            for (int i = 0; i < n; i++) {
                // Skewed: offspring tend to pile up in a few blocks, as after resampling.
                int b = random.nextBoolean() ? random.nextInt(blocks) : random.nextInt(1 + random.nextInt(blocks));
                sizes[b]++;
            }
            int[] ids = GroupingIndependenceTest.shuffledIds(blocks, random);
            BlockLayout layout = layout(sizes, ids);
            Redistribution plan = Redistribution.plan(layout);

            int small = n / blocks;
            long total = 0;
            for (int b = 0; b < blocks; b++) {
                int s = plan.targetSize(b);
                assertTrue(s == small || s == small + 1, "size " + s);
                total += s;
            }
            assertEquals(n, total);
            plan.targetLayout(); // validates that the final runs tile [0, N)
            long expectedFirst = 0;
            for (int j = 0; j < blocks; j++) {
                int b = layout.blockAt(j);
                assertEquals(expectedFirst, plan.targetFirstIndex(b), "blocks keep their canonical order");
                expectedFirst += plan.targetSize(b);
            }
            assertEquals(bruteForceMinimum(sizes), plan.movedCount(), "sizes " + java.util.Arrays.toString(sizes));
            long sent = 0;
            for (int t = 0; t < plan.transferCount(); t++) {
                assertTrue(plan.fromBlock(t) != plan.toBlock(t));
                sent += plan.runCount(t);
            }
            assertEquals(plan.movedCount(), sent);
            checkApply(layout, plan);
        }
    }

    @Test
    @DisplayName("the documented example: sizes 0, 2, 4 move 4 particles when order is kept")
    void documentedExample() {
        BlockLayout layout = layout(new int[] {0, 2, 4}, new int[] {0, 1, 2});
        assertEquals(4, Redistribution.plan(layout).movedCount());
        assertEquals(bruteForceMinimum(new int[] {0, 2, 4}), 4);
    }

    @Test
    @DisplayName("already balanced: nothing moves")
    void balancedStays() {
        BlockLayout layout = layout(new int[] {3, 4, 3, 4}, new int[] {2, 0, 3, 1});
        Redistribution plan = Redistribution.plan(layout);
        assertEquals(0, plan.movedCount());
        assertEquals(0, plan.transferCount());
    }

    /** Applies the plan to real blocks and checks every particle ends where the plan says, in order. */
    private static void checkApply(BlockLayout layout, Redistribution plan) {
        int blocks = layout.blockCount();
        ParticleBlock[] in = new ParticleBlock[blocks];
        for (int b = 0; b < blocks; b++) {
            in[b] = new ParticleBlock(2, layout.size(b));
            in[b].resize(layout.size(b));
            for (int i = 0; i < layout.size(b); i++) {
                long index = layout.firstIndex(b) + i;
                in[b].index()[i] = index;
                in[b].values()[2 * i] = index;
                in[b].values()[2 * i + 1] = -index;
                in[b].eve()[i] = 1000 + index;
            }
        }
        ParticleBlock[] out = plan.apply(in);
        for (int b = 0; b < blocks; b++) {
            assertEquals(plan.targetSize(b), out[b].size());
            for (int i = 0; i < out[b].size(); i++) {
                long index = plan.targetFirstIndex(b) + i;
                assertEquals(index, out[b].index()[i], "contiguous and increasing");
                assertEquals((double) index, out[b].values()[2 * i]);
                assertEquals((double) -index, out[b].values()[2 * i + 1]);
                assertEquals(1000 + index, out[b].eve()[i]);
            }
        }
        assertSame(in.getClass(), out.getClass());
    }

    /**
     * The fewest particles that change block over every order-keeping contiguous layout with
     * sizes floor/ceil(N/P): enumerates the subsets of blocks that get the larger size and counts
     * moved particles one by one.
     */
    private static long bruteForceMinimum(int[] sizes) {
        int blocks = sizes.length;
        int n = 0;
        for (int s : sizes) {
            n += s;
        }
        int small = n / blocks;
        int larger = n % blocks;
        int[] currentBlock = new int[n];
        for (int j = 0, x = 0; j < blocks; j++) {
            for (int i = 0; i < sizes[j]; i++) {
                currentBlock[x++] = j;
            }
        }
        long best = Long.MAX_VALUE;
        for (int mask = 0; mask < 1 << blocks; mask++) {
            if (Integer.bitCount(mask) != larger) {
                continue;
            }
            long moved = 0;
            for (int j = 0, x = 0; j < blocks; j++) {
                int size = small + ((mask >> j) & 1);
                for (int i = 0; i < size; i++, x++) {
                    if (currentBlock[x] != j) {
                        moved++;
                    }
                }
            }
            best = Math.min(best, moved);
        }
        return best;
    }

    /** Blocks in canonical order with the given sizes, numbered by {@code ids}. */
    private static BlockLayout layout(int[] sizes, int[] ids) {
        long[] first = new long[sizes.length];
        int[] size = new int[sizes.length];
        long running = 0;
        for (int j = 0; j < sizes.length; j++) {
            first[ids[j]] = running;
            size[ids[j]] = sizes[j];
            running += sizes[j];
        }
        return BlockLayout.of(first, size);
    }
}
