package org.skerry.engine.population;

import java.io.Serializable;
import java.util.Objects;

/**
 * Where one block of a checkpoint was written and how to know it again: its position in the
 * population, the file's name inside the checkpoint, its length, a CRC-32C of its bytes and the
 * number of particles it holds. Immutable; crosses from executors to the driver once per block
 * (a plain class rather than a record so that Spark's Kryo can copy it field by field).
 */
public final class StoredBlock implements Serializable {

    private static final long serialVersionUID = 1L;

    private final int block;
    private final String fileName;
    private final long bytes;
    private final long crc32c;
    private final int particles;

    /**
     * @param block     position of the block in the population (0-based)
     * @param fileName  file name inside the checkpoint folder
     * @param bytes     file length
     * @param crc32c    CRC-32C of the file's bytes
     * @param particles particles in the block
     */
    public StoredBlock(int block, String fileName, long bytes, long crc32c, int particles) {
        if (block < 0) {
            throw new IllegalArgumentException("block must be >= 0, was " + block);
        }
        if (fileName == null || fileName.isEmpty() || fileName.contains("/")) {
            throw new IllegalArgumentException("fileName must be a plain file name, was " + fileName);
        }
        if (bytes < 0 || particles < 0) {
            throw new IllegalArgumentException("bytes and particles must be >= 0, were " + bytes + ", " + particles);
        }
        this.block = block;
        this.fileName = fileName;
        this.bytes = bytes;
        this.crc32c = crc32c;
        this.particles = particles;
    }

    /** The global index of each block's first particle: the particle counts of the blocks before it. */
    public static long[] firstIndices(java.util.List<StoredBlock> blocks) {
        long[] first = new long[blocks.size()];
        long running = 0;
        for (int b = 0; b < blocks.size(); b++) {
            first[b] = running;
            running += blocks.get(b).particles();
        }
        return first;
    }

    public int block() {
        return block;
    }

    public String fileName() {
        return fileName;
    }

    public long bytes() {
        return bytes;
    }

    public long crc32c() {
        return crc32c;
    }

    public int particles() {
        return particles;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof StoredBlock)) {
            return false;
        }
        StoredBlock that = (StoredBlock) other;
        return block == that.block && fileName.equals(that.fileName) && bytes == that.bytes && crc32c == that.crc32c
                && particles == that.particles;
    }

    @Override
    public int hashCode() {
        return Objects.hash(block, fileName, bytes, crc32c, particles);
    }

    @Override
    public String toString() {
        return "block " + block + " (" + fileName + ", " + particles + " particles, " + bytes + " bytes, crc32c "
                + Long.toHexString(crc32c) + ")";
    }
}
