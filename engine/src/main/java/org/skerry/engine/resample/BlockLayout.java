package org.skerry.engine.resample;

import java.io.Serializable;
import java.util.Arrays;

/**
 * Which run of global particle indices each block holds. Resampling works in canonical order
 * (by global index), and a block can compute its share from a few numbers only if its particles
 * are consecutive in that order; so every block must hold a contiguous run
 * {@code [firstIndex, firstIndex + size)}, in increasing order, and the runs must tile
 * {@code [0, N)}. Built on the driver from what the blocks report; immutable.
 *
 * <p>Blocks are numbered by the caller (a partition id, say) and need not be listed in canonical
 * order. Empty blocks are allowed; one sorts before the non-empty block starting at the same index.
 */
public final class BlockLayout implements Serializable {

    private static final long serialVersionUID = 1L;

    private final long[] firstIndex;
    private final int[] size;
    private final int[] blockAt;
    private final int populationSize;

    private BlockLayout(long[] firstIndex, int[] size, int[] blockAt, int populationSize) {
        this.firstIndex = firstIndex;
        this.size = size;
        this.blockAt = blockAt;
        this.populationSize = populationSize;
    }

    /**
     * The layout of blocks {@code 0..P-1}, block {@code b} holding
     * {@code [firstIndex[b], firstIndex[b] + size[b])}.
     *
     * @throws IllegalArgumentException if the arrays are empty or differ in length, a size is
     *     negative, the runs do not tile {@code [0, N)}, or {@code N} is 0 or above
     *     {@link Integer#MAX_VALUE}
     */
    public static BlockLayout of(long[] firstIndex, int[] size) {
        if (firstIndex.length == 0 || firstIndex.length != size.length) {
            throw new IllegalArgumentException("need one firstIndex and one size per block, got "
                    + firstIndex.length + " and " + size.length);
        }
        int blocks = size.length;
        Integer[] order = new Integer[blocks];
        for (int b = 0; b < blocks; b++) {
            if (size[b] < 0) {
                throw new IllegalArgumentException("size[" + b + "] must be >= 0, was " + size[b]);
            }
            order[b] = b;
        }
        // Driver side, P entries: boxing here is not on a hot path.
        Arrays.sort(order, (x, y) -> {
            int c = Long.compare(firstIndex[x], firstIndex[y]);
            if (c == 0) {
                c = Integer.compare(size[x], size[y]);
            }
            return c != 0 ? c : Integer.compare(x, y);
        });
        int[] blockAt = new int[blocks];
        long expected = 0;
        for (int j = 0; j < blocks; j++) {
            int b = order[j];
            if (firstIndex[b] != expected) {
                throw new IllegalArgumentException("blocks must hold contiguous runs tiling [0, N): block "
                        + b + " starts at " + firstIndex[b] + ", expected " + expected);
            }
            expected += size[b];
            blockAt[j] = b;
        }
        if (expected == 0 || expected > Integer.MAX_VALUE) {
            throw new IllegalArgumentException("population size must be in [1, 2^31 - 1], was " + expected);
        }
        return new BlockLayout(firstIndex.clone(), size.clone(), blockAt, (int) expected);
    }

    /** Number of blocks, {@code P}. */
    public int blockCount() {
        return size.length;
    }

    /** Number of particles, {@code N}. */
    public int populationSize() {
        return populationSize;
    }

    /** Global index of the first particle of {@code block}. */
    public long firstIndex(int block) {
        return firstIndex[block];
    }

    /** Number of particles in {@code block}. */
    public int size(int block) {
        return size[block];
    }

    /** The block at canonical position {@code position} (0 holds global index 0). */
    public int blockAt(int position) {
        return blockAt[position];
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof BlockLayout && Arrays.equals(firstIndex, ((BlockLayout) o).firstIndex)
                && Arrays.equals(size, ((BlockLayout) o).size);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(firstIndex) + Arrays.hashCode(size);
    }

    @Override
    public String toString() {
        return "BlockLayout[firstIndex=" + Arrays.toString(firstIndex) + ", size=" + Arrays.toString(size) + "]";
    }
}
