package org.skerry.engine.resample;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.BitSet;
import java.util.List;
import org.skerry.engine.particle.ParticleBlock;

/**
 * How to rebalance blocks after resampling, as an immutable value made by the pure function
 * {@link #plan}: every block ends with {@code floor(N/P)} or {@code ceil(N/P)} particles, still a
 * contiguous run of global indices, and as few particles as possible change block. Usable by
 * the thread backend ({@link #apply}) and by Spark (the transfers say what to send where).
 *
 * <p>Blocks keep their canonical order, so block {@code j} (in that order) ends with
 * {@code [O_j, O_{j+1})}, {@code O_j = j*floor(N/P) + (number of larger blocks before j)}.
 * A particle stays put exactly when its index lies in both its block's current run and its
 * block's final run, so once the final runs are fixed the number moved is forced:
 * {@code N - sum_j |current_j ∩ final_j|}. The only freedom is which {@code N mod P} blocks get
 * the larger size; {@link #plan} picks them by dynamic programming over
 * (position, larger blocks so far), which maximises the kept total exactly in
 * O(P * (N mod P)) time, so the moved count is the minimum over all order-keeping contiguous
 * layouts. (Letting blocks swap places in the order can sometimes move fewer; see the notes on
 * {@link #plan}.) Each move is a run sent straight from its current block to its final one.
 */
public final class Redistribution implements Serializable {

    private static final long serialVersionUID = 1L;

    private final long[] sourceFirstIndex;
    private final int[] sourceSize;
    private final long[] targetFirstIndex;
    private final int[] targetSize;
    private final int[] from;
    private final int[] to;
    private final long[] runFirstIndex;
    private final int[] runCount;
    private final long movedCount;

    private Redistribution(long[] sourceFirstIndex, int[] sourceSize, long[] targetFirstIndex, int[] targetSize,
            int[] from, int[] to, long[] runFirstIndex, int[] runCount, long movedCount) {
        this.sourceFirstIndex = sourceFirstIndex;
        this.sourceSize = sourceSize;
        this.targetFirstIndex = targetFirstIndex;
        this.targetSize = targetSize;
        this.from = from;
        this.to = to;
        this.runFirstIndex = runFirstIndex;
        this.runCount = runCount;
        this.movedCount = movedCount;
    }

    /**
     * Plans the rebalancing of {@code current} (normally {@link ResamplingPlanner#expandedLayout}).
     *
     * <p>Why keep the order: if empty blocks may be slotted anywhere, fewer moves are sometimes
     * possible (current sizes 0, 2, 4 with target 2 each: in order, 4 particles move; putting the
     * empty block last, 2 do). Finding that optimum needs a larger search over where the empty
     * blocks go; the order-keeping plan is what this method computes.
     */
    public static Redistribution plan(BlockLayout current) {
        int blocks = current.blockCount();
        int n = current.populationSize();
        int base = n / blocks;
        int larger = n % blocks;
        if ((long) blocks * (larger + 1) > Integer.MAX_VALUE) {
            throw new IllegalArgumentException("too many blocks for the exact plan: " + blocks);
        }
        long[] start = new long[blocks + 1];
        for (int j = 0; j < blocks; j++) {
            start[j + 1] = start[j] + current.size(current.blockAt(j));
        }
        // kept[m]: most particles kept by the blocks so far with m of them larger; choice bit
        // (j, m) records whether block j is larger on the best path reaching m after block j.
        long[] kept = new long[larger + 1];
        long[] next = new long[larger + 1];
        Arrays.fill(kept, Long.MIN_VALUE);
        kept[0] = 0;
        BitSet choice = new BitSet();
        for (int j = 0; j < blocks; j++) {
            Arrays.fill(next, Long.MIN_VALUE);
            int maxM = Math.min(j, larger);
            for (int m = Math.max(0, larger - (blocks - j)); m <= maxM; m++) {
                if (kept[m] == Long.MIN_VALUE) {
                    continue;
                }
                long first = (long) j * base + m;
                long small = kept[m] + overlap(start[j], start[j + 1], first, first + base);
                if (small > next[m]) {
                    next[m] = small;
                    choice.clear(j * (larger + 1) + m);
                }
                if (m < larger) {
                    long big = kept[m] + overlap(start[j], start[j + 1], first, first + base + 1);
                    if (big > next[m + 1]) {
                        next[m + 1] = big;
                        choice.set(j * (larger + 1) + m + 1);
                    }
                }
            }
            long[] swap = kept;
            kept = next;
            next = swap;
        }
        boolean[] isLarger = new boolean[blocks];
        for (int j = blocks - 1, m = larger; j >= 0; j--) {
            if (choice.get(j * (larger + 1) + m)) {
                isLarger[j] = true;
                m--;
            }
        }
        long[] targetFirst = new long[blocks];
        int[] targetSize = new int[blocks];
        long[] targetStart = new long[blocks + 1];
        for (int j = 0; j < blocks; j++) {
            int b = current.blockAt(j);
            targetSize[b] = base + (isLarger[j] ? 1 : 0);
            targetFirst[b] = targetStart[j];
            targetStart[j + 1] = targetStart[j] + targetSize[b];
        }
        // Merge the two tilings; every non-empty piece whose blocks differ is one transfer.
        List<long[]> moves = new ArrayList<>();
        long moved = 0;
        int j = 0;
        int t = 0;
        long x = 0;
        while (x < n) {
            while (start[j + 1] <= x) {
                j++;
            }
            while (targetStart[t + 1] <= x) {
                t++;
            }
            long end = Math.min(start[j + 1], targetStart[t + 1]);
            if (j != t) {
                moves.add(new long[] {current.blockAt(j), current.blockAt(t), x, end - x});
                moved += end - x;
            }
            x = end;
        }
        int[] fromBlock = new int[moves.size()];
        int[] toBlock = new int[moves.size()];
        long[] runFirst = new long[moves.size()];
        int[] runCount = new int[moves.size()];
        for (int i = 0; i < moves.size(); i++) {
            long[] move = moves.get(i);
            fromBlock[i] = (int) move[0];
            toBlock[i] = (int) move[1];
            runFirst[i] = move[2];
            runCount[i] = (int) move[3];
        }
        long[] sourceFirst = new long[blocks];
        int[] sourceSize = new int[blocks];
        for (int b = 0; b < blocks; b++) {
            sourceFirst[b] = current.firstIndex(b);
            sourceSize[b] = current.size(b);
        }
        return new Redistribution(sourceFirst, sourceSize, targetFirst, targetSize, fromBlock, toBlock, runFirst,
                runCount, moved);
    }

    private static long overlap(long a0, long a1, long b0, long b1) {
        return Math.max(0, Math.min(a1, b1) - Math.max(a0, b0));
    }

    /**
     * Rebalances blocks held in memory: {@code blocks[b]} must hold the run the plan was made
     * for. Returns new blocks; the inputs are not changed.
     *
     * @throws IllegalArgumentException if a block's size or first index differs from the plan's
     */
    public ParticleBlock[] apply(ParticleBlock[] blocks) {
        if (blocks.length != targetSize.length) {
            throw new IllegalArgumentException("need " + targetSize.length + " blocks, got " + blocks.length);
        }
        for (int b = 0; b < blocks.length; b++) {
            if (blocks[b].size() != sourceSize[b] || (sourceSize[b] > 0 && blocks[b].index()[0] != sourceFirstIndex[b])) {
                throw new IllegalArgumentException("block " + b + " does not hold the run [" + sourceFirstIndex[b]
                        + ", " + (sourceFirstIndex[b] + sourceSize[b]) + ")");
            }
        }
        ParticleBlock[] result = new ParticleBlock[blocks.length];
        for (int b = 0; b < blocks.length; b++) {
            result[b] = ParticleBlock.shapedLike(blocks[b], targetSize[b]);
            result[b].resize(targetSize[b]);
            long keptFirst = Math.max(sourceFirstIndex[b], targetFirstIndex[b]);
            long keptEnd = Math.min(sourceFirstIndex[b] + sourceSize[b], targetFirstIndex[b] + targetSize[b]);
            copyRun(blocks[b], b, result[b], b, keptFirst, keptEnd - keptFirst);
        }
        for (int i = 0; i < from.length; i++) {
            copyRun(blocks[from[i]], from[i], result[to[i]], to[i], runFirstIndex[i], runCount[i]);
        }
        return result;
    }

    private void copyRun(ParticleBlock source, int sourceBlock, ParticleBlock target, int targetBlock, long first,
            long count) {
        int fromSlot = (int) (first - sourceFirstIndex[sourceBlock]);
        int toSlot = (int) (first - targetFirstIndex[targetBlock]);
        for (int i = 0; i < count; i++) {
            target.copyParticle(source, fromSlot + i, toSlot + i);
        }
    }

    /** Number of blocks. */
    public int blockCount() {
        return targetSize.length;
    }

    /** Global index of the first particle {@code block} holds afterwards. */
    public long targetFirstIndex(int block) {
        return targetFirstIndex[block];
    }

    /** Number of particles {@code block} holds afterwards. */
    public int targetSize(int block) {
        return targetSize[block];
    }

    /** Number of runs to send. */
    public int transferCount() {
        return from.length;
    }

    /** Block that sends run {@code transfer}. */
    public int fromBlock(int transfer) {
        return from[transfer];
    }

    /** Block that receives run {@code transfer}. */
    public int toBlock(int transfer) {
        return to[transfer];
    }

    /** Global index of the first particle of run {@code transfer}. */
    public long runFirstIndex(int transfer) {
        return runFirstIndex[transfer];
    }

    /** Number of particles in run {@code transfer}. */
    public int runCount(int transfer) {
        return runCount[transfer];
    }

    /** Number of particles that change block. */
    public long movedCount() {
        return movedCount;
    }

    /** The layout afterwards. */
    public BlockLayout targetLayout() {
        return BlockLayout.of(targetFirstIndex, targetSize);
    }
}
