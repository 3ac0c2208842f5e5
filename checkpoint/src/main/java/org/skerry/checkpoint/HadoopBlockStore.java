package org.skerry.checkpoint;

import java.io.BufferedOutputStream;
import java.io.ByteArrayInputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.FileNotFoundException;
import java.io.IOException;
import java.util.Locale;
import java.util.UUID;
import java.util.zip.CRC32C;
import java.util.zip.CheckedOutputStream;
import org.apache.hadoop.fs.FSDataInputStream;
import org.apache.hadoop.fs.FSDataOutputStream;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.Path;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.particle.ParticleBlockCodec;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.StoredBlock;

/**
 * The blocks of one checkpoint folder on a Hadoop-compatible file system. Runs where the blocks
 * live (executors, worker threads): each block is written to a temporary name unique to the
 * attempt, then renamed, so a retried or speculative task never leaves a half-written block under
 * the real name; reading checks length and CRC-32C against the manifest.
 */
public final class HadoopBlockStore implements BlockStore {

    private static final long serialVersionUID = 1L;

    private final CheckpointFileSystem files;
    private final String folder;

    /** @param folder the checkpoint's folder name under the root, e.g. {@code iteration-000007} */
    public HadoopBlockStore(CheckpointFileSystem files, String folder) {
        this.files = files;
        this.folder = folder;
    }

    /** The file name of block {@code block}. */
    public static String fileName(int block) {
        return String.format(Locale.ROOT, "block-%05d.bin", block);
    }

    @Override
    public StoredBlock write(int block, ParticleBlock particles) throws IOException {
        String name = fileName(block);
        Path target = files.path(folder + "/" + name);
        Path temporary = files.path(folder + "/_" + name + "." + UUID.randomUUID() + ".tmp");
        CRC32C crc = new CRC32C();
        long bytes;
        try (FSDataOutputStream raw = files.create(temporary);
                DataOutputStream out = new DataOutputStream(
                        new BufferedOutputStream(new CheckedOutputStream(raw, crc), 1 << 16))) {
            ParticleBlockCodec.write(particles, out);
            out.flush();
            bytes = out.size();
            raw.hsync();
        }
        files.publish(temporary, target);
        return new StoredBlock(block, name, bytes, crc.getValue(), particles.size());
    }

    @Override
    public ParticleBlock read(StoredBlock stored) throws IOException {
        Path path = files.path(folder + "/" + stored.fileName());
        FileStatus status;
        try {
            status = files.fileSystem().getFileStatus(path);
        } catch (FileNotFoundException e) {
            throw new IOException(path + " is missing");
        }
        if (status.getLen() != stored.bytes()) {
            throw new IOException(path + " is " + status.getLen() + " bytes; the manifest says " + stored.bytes());
        }
        if (stored.bytes() > Integer.MAX_VALUE - 16) {
            throw new IOException(path + " is too large to be a block (" + stored.bytes() + " bytes)");
        }
        // Checked before decoding, so damaged bytes never become a huge array size.
        byte[] bytes = new byte[(int) stored.bytes()];
        try (FSDataInputStream in = files.fileSystem().open(path)) {
            in.readFully(0, bytes);
        }
        CRC32C crc = new CRC32C();
        crc.update(bytes);
        if (crc.getValue() != stored.crc32c()) {
            throw new IOException(path + " fails its checksum (CRC-32C " + Long.toHexString(crc.getValue())
                    + ", the manifest says " + Long.toHexString(stored.crc32c()) + ")");
        }
        try {
            return ParticleBlockCodec.read(new DataInputStream(new ByteArrayInputStream(bytes)));
        } catch (IOException e) {
            throw new IOException(path + " does not hold a particle block: " + e.getMessage(), e);
        }
    }

    @Override
    public String location() {
        return files.root() + "/" + folder;
    }
}
