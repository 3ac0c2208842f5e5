package org.skerry.spark;

import java.util.Arrays;
import org.apache.spark.Partitioner;

/** Sends a run of particles keyed by its target block number to the partition holding that block's group. */
final class BlockPartitioner extends Partitioner {

    private static final long serialVersionUID = 2L;

    /** Group starts in block numbers, and the block count at the end ({@link TaskGrouping#starts}). */
    private final int[] starts;

    BlockPartitioner(int[] starts) {
        this.starts = starts.clone();
    }

    @Override
    public int numPartitions() {
        return starts.length - 1;
    }

    @Override
    public int getPartition(Object key) {
        return groupOf(starts, (Integer) key);
    }

    /** The group holding {@code block}. */
    static int groupOf(int[] starts, int block) {
        int found = Arrays.binarySearch(starts, 0, starts.length - 1, block);
        // Equal starts (never with groups <= blocks) would make the found index ambiguous.
        return found >= 0 ? found : -found - 2;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof BlockPartitioner && Arrays.equals(((BlockPartitioner) other).starts, starts);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(starts);
    }
}
