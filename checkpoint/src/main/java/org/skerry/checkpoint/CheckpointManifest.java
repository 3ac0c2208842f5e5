package org.skerry.checkpoint;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.zip.CRC32C;
import org.skerry.engine.population.StoredBlock;

/**
 * The last file of a checkpoint, whose presence makes the checkpoint exist: the iteration, the
 * driver-state file and every block file with its length and CRC-32C, and a final line with the
 * CRC-32C of all lines before it, so a truncated or altered manifest is recognised too. Plain
 * text, one entry a line, so a person can read it. Immutable.
 */
public final class CheckpointManifest {

    /** The manifest's file name inside a checkpoint folder. */
    public static final String FILE_NAME = "manifest.txt";
    /** The driver state's file name inside a checkpoint folder. */
    public static final String DRIVER_FILE = "driver-state.bin";

    private static final String HEADER = "skerry checkpoint format 1";

    private final int iteration;
    private final long driverBytes;
    private final long driverCrc32c;
    private final List<StoredBlock> blocks;

    public CheckpointManifest(int iteration, long driverBytes, long driverCrc32c, List<StoredBlock> blocks) {
        this.iteration = iteration;
        this.driverBytes = driverBytes;
        this.driverCrc32c = driverCrc32c;
        this.blocks = List.copyOf(blocks);
        for (int b = 0; b < this.blocks.size(); b++) {
            if (this.blocks.get(b).block() != b) {
                throw new IllegalArgumentException("blocks must be in block order; entry " + b + " is "
                        + this.blocks.get(b));
            }
        }
    }

    public int iteration() {
        return iteration;
    }

    public long driverBytes() {
        return driverBytes;
    }

    public long driverCrc32c() {
        return driverCrc32c;
    }

    public List<StoredBlock> blocks() {
        return blocks;
    }

    /** The manifest's text, ending with its own checksum line. */
    public String render() {
        StringBuilder text = new StringBuilder();
        text.append(HEADER).append('\n');
        text.append("iteration ").append(iteration).append('\n');
        text.append("driver ").append(DRIVER_FILE).append(' ').append(driverBytes).append(' ')
                .append(Long.toHexString(driverCrc32c)).append('\n');
        for (StoredBlock block : blocks) {
            text.append(String.format(Locale.ROOT, "block %d %s %d %s %d%n", block.block(), block.fileName(),
                    block.bytes(), Long.toHexString(block.crc32c()), block.particles()));
        }
        long covered = crc(text.toString());
        text.append("end ").append(Long.toHexString(covered)).append('\n');
        return text.toString();
    }

    /**
     * Parses a manifest.
     *
     * @param where the file's location, for messages
     * @throws IOException naming the line that is wrong, or saying that the checksum line is
     *                     missing or does not match
     */
    public static CheckpointManifest parse(String text, String where) throws IOException {
        String[] lines = text.split("\n", -1);
        if (lines.length < 4 || !lines[0].equals(HEADER)) {
            throw new IOException(where + ": line 1: not a checkpoint manifest");
        }
        int endLine = -1;
        for (int i = 0; i < lines.length; i++) {
            if (lines[i].startsWith("end ")) {
                endLine = i;
                break;
            }
        }
        if (endLine < 0) {
            throw new IOException(where + ": the final checksum line is missing (the manifest is incomplete)");
        }
        StringBuilder covered = new StringBuilder();
        for (int i = 0; i < endLine; i++) {
            covered.append(lines[i]).append('\n');
        }
        String expected = lines[endLine].substring(4).strip();
        if (!expected.equals(Long.toHexString(crc(covered.toString())))) {
            throw new IOException(where + ": line " + (endLine + 1) + ": checksum mismatch (the manifest is damaged)");
        }
        try {
            int iteration = Integer.parseInt(field(lines[1], "iteration", 2, where, 2)[1]);
            String[] driver = field(lines[2], "driver", 4, where, 3);
            List<StoredBlock> blocks = new ArrayList<>();
            for (int i = 3; i < endLine; i++) {
                String[] b = field(lines[i], "block", 6, where, i + 1);
                blocks.add(new StoredBlock(Integer.parseInt(b[1]), b[2], Long.parseLong(b[3]),
                        Long.parseUnsignedLong(b[4], 16), Integer.parseInt(b[5])));
            }
            return new CheckpointManifest(iteration, Long.parseLong(driver[2]), Long.parseUnsignedLong(driver[3], 16),
                    blocks);
        } catch (IllegalArgumentException e) {
            throw new IOException(where + ": " + e.getMessage(), e);
        }
    }

    private static String[] field(String line, String keyword, int parts, String where, int lineNumber)
            throws IOException {
        String[] words = line.split(" ");
        if (words.length != parts || !words[0].equals(keyword)) {
            throw new IOException(where + ": line " + lineNumber + ": expected '" + keyword + "' with " + (parts - 1)
                    + " fields, found '" + line + "'");
        }
        return words;
    }

    private static long crc(String text) {
        CRC32C crc = new CRC32C();
        crc.update(text.getBytes(StandardCharsets.UTF_8));
        return crc.getValue();
    }
}
