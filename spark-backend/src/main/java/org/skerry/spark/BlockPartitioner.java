package org.skerry.spark;

import org.apache.spark.Partitioner;

/** Sends a run of particles keyed by its target block number to that partition. */
final class BlockPartitioner extends Partitioner {

    private static final long serialVersionUID = 1L;

    private final int partitions;

    BlockPartitioner(int partitions) {
        this.partitions = partitions;
    }

    @Override
    public int numPartitions() {
        return partitions;
    }

    @Override
    public int getPartition(Object key) {
        return (Integer) key;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof BlockPartitioner && ((BlockPartitioner) other).partitions == partitions;
    }

    @Override
    public int hashCode() {
        return partitions;
    }
}
