package org.skerry.checkpoint;

import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.UUID;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.zip.CRC32C;
import org.apache.hadoop.fs.FSDataInputStream;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.sampler.SamplerState;

/**
 * Driver side: the folder holding a run's checkpoints, one sub-folder per checkpointed iteration
 * ({@code iteration-000007/}: block files, {@code driver-state.bin}, and last {@code manifest.txt}).
 * Writes a checkpoint, prunes all but the newest few complete ones, and lists and loads them
 * newest first for a resume.
 */
public final class CheckpointFolder {

    private static final Pattern NAME = Pattern.compile("iteration-(\\d{6,})");

    private final CheckpointFileSystem files;
    private final int keep;

    /** The problem of a checkpoint folder without a manifest: its write never finished. */
    static final String NO_MANIFEST = "no manifest (the checkpoint was not finished)";

    /** A checkpoint found on disk: complete (a valid manifest) or with the reason it is not. */
    public record Found(int iteration, String folder, CheckpointManifest manifest, String problem) {

        /** Whether this is a write that never finished (no manifest): it never existed as a checkpoint. */
        public boolean unfinished() {
            return NO_MANIFEST.equals(problem);
        }
    }

    /** A checkpoint whose manifest and driver state read back. */
    public record Loaded(Found found, DriverStateCodec.Saved saved) {
    }

    /** @param keep complete checkpoints to keep (at least 1) */
    public CheckpointFolder(CheckpointFileSystem files, int keep) {
        if (keep < 1) {
            throw new IllegalArgumentException("keep must be >= 1, was " + keep);
        }
        this.files = files;
        this.keep = keep;
    }

    public CheckpointFileSystem files() {
        return files;
    }

    /** {@code iteration-000007}. */
    public static String folderName(int iteration) {
        return String.format(Locale.ROOT, "iteration-%06d", iteration);
    }

    /**
     * Writes the checkpoint of {@code state}: blocks in parallel where they live, then the driver
     * state, then the manifest; then removes older checkpoints beyond the newest {@link #keep}.
     *
     * @return the manifest written
     */
    public CheckpointManifest write(SamplerState state, Population population, Map<String, String> answerSettings)
            throws IOException {
        String folder = folderName(state.iteration());
        FileSystem fs = files.fileSystem();
        Path path = files.path(folder);
        if (fs.exists(path)) {
            fs.delete(path, true); // an unfinished attempt at this iteration: it never existed
        }
        if (!fs.mkdirs(path)) {
            throw new IOException("cannot create " + path);
        }
        List<StoredBlock> blocks = population.writeBlocks(new HadoopBlockStore(files, folder));
        byte[] driver = DriverStateCodec.encode(answerSettings, state);
        writeFile(folder, CheckpointManifest.DRIVER_FILE, driver);
        CRC32C crc = new CRC32C();
        crc.update(driver);
        CheckpointManifest manifest = new CheckpointManifest(state.iteration(), driver.length, crc.getValue(), blocks);
        writeFile(folder, CheckpointManifest.FILE_NAME, manifest.render().getBytes(StandardCharsets.UTF_8));
        prune();
        return manifest;
    }

    private void writeFile(String folder, String name, byte[] bytes) throws IOException {
        Path target = files.path(folder + "/" + name);
        Path temporary = files.path(folder + "/_" + name + "." + UUID.randomUUID() + ".tmp");
        try (org.apache.hadoop.fs.FSDataOutputStream out = files.create(temporary)) {
            out.write(bytes);
            out.hsync();
        }
        files.publish(temporary, target);
    }

    /** Keeps the newest {@link #keep} complete checkpoints and deletes every checkpoint older than them. */
    void prune() throws IOException {
        List<Found> found = list();
        int complete = 0;
        int oldestKept = Integer.MAX_VALUE;
        for (Found f : found) {
            if (f.problem() == null && complete < keep) {
                complete++;
                oldestKept = f.iteration();
            }
        }
        if (complete < keep) {
            return;
        }
        for (Found f : found) {
            if (f.iteration() < oldestKept) {
                // The manifest goes first, so a half-deleted checkpoint never looks complete.
                files.fileSystem().delete(files.path(f.folder() + "/" + CheckpointManifest.FILE_NAME), false);
                files.fileSystem().delete(files.path(f.folder()), true);
            }
        }
    }

    /**
     * Removes what interrupted checkpoint writes left behind (a process killed or abandoned while
     * it wrote one), before a resumed run writes again: the checkpoint folders newer than
     * {@code after} that have no manifest, and temporary files ({@code _…tmp}) in the others.
     * Call it only while nothing writes checkpoints here.
     *
     * @param after the iteration the run resumes from, or −1 when it starts again from the beginning
     * @return what was removed, for the log (empty when nothing was)
     */
    public List<String> removeUnfinished(int after) throws IOException {
        FileSystem fs = files.fileSystem();
        List<String> removed = new ArrayList<>();
        int temporary = 0;
        for (Found f : list()) {
            if (f.unfinished() && f.iteration() > after) {
                fs.delete(files.path(f.folder()), true);
                removed.add(f.folder() + " (unfinished: no manifest)");
                continue;
            }
            for (FileStatus entry : fs.listStatus(files.path(f.folder()))) {
                String name = entry.getPath().getName();
                if (entry.isFile() && name.startsWith("_") && name.endsWith(".tmp") && fs.delete(entry.getPath(), false)) {
                    temporary++;
                }
            }
        }
        if (temporary > 0) {
            removed.add(temporary + (temporary == 1 ? " temporary file" : " temporary files") + " of interrupted writes");
        }
        return removed;
    }

    /** The newest complete checkpoint's iteration, or −1 (also when the folder cannot be listed). */
    public int newestComplete() {
        try {
            for (Found found : list()) {
                if (found.problem() == null) {
                    return found.iteration();
                }
            }
        } catch (IOException | RuntimeException e) {
            // a file system that just failed may fail again; callers then say there is none
        }
        return -1;
    }

    /** Every checkpoint folder, newest first, each with its manifest or the reason it has none. */
    public List<Found> list() throws IOException {
        FileSystem fs = files.fileSystem();
        List<Found> found = new ArrayList<>();
        FileStatus[] entries;
        try {
            entries = fs.listStatus(files.rootPath());
        } catch (FileNotFoundException e) {
            return found;
        }
        for (FileStatus entry : entries) {
            Matcher m = NAME.matcher(entry.getPath().getName());
            if (!entry.isDirectory() || !m.matches()) {
                continue;
            }
            int iteration = Integer.parseInt(m.group(1));
            String folder = entry.getPath().getName();
            Path manifestPath = files.path(folder + "/" + CheckpointManifest.FILE_NAME);
            try {
                String text = new String(readAll(manifestPath), StandardCharsets.UTF_8);
                CheckpointManifest manifest = CheckpointManifest.parse(text, manifestPath.toString());
                if (manifest.iteration() != iteration) {
                    found.add(new Found(iteration, folder, null, manifestPath + " names iteration "
                            + manifest.iteration()));
                } else {
                    found.add(new Found(iteration, folder, manifest, null));
                }
            } catch (FileNotFoundException e) {
                found.add(new Found(iteration, folder, null, NO_MANIFEST));
            } catch (IOException e) {
                found.add(new Found(iteration, folder, null, e.getMessage()));
            }
        }
        found.sort(Comparator.comparingInt(Found::iteration).reversed());
        return found;
    }

    /**
     * Reads a complete checkpoint's driver state, checking it against the manifest.
     *
     * @throws IOException when it is missing, of another length, fails its checksum or does not decode
     */
    public Loaded load(Found found) throws IOException {
        Path path = files.path(found.folder() + "/" + CheckpointManifest.DRIVER_FILE);
        byte[] bytes = readAll(path);
        if (bytes.length != found.manifest().driverBytes()) {
            throw new IOException(path + " is " + bytes.length + " bytes; the manifest says "
                    + found.manifest().driverBytes());
        }
        CRC32C crc = new CRC32C();
        crc.update(bytes);
        if (crc.getValue() != found.manifest().driverCrc32c()) {
            throw new IOException(path + " fails its checksum");
        }
        try {
            return new Loaded(found, DriverStateCodec.decode(bytes));
        } catch (IOException e) {
            throw new IOException(path + ": " + e.getMessage(), e);
        }
    }

    /** A block store for a checkpoint's folder. */
    public HadoopBlockStore blocks(Found found) {
        return new HadoopBlockStore(files, found.folder());
    }

    private byte[] readAll(Path path) throws IOException {
        FileSystem fs = files.fileSystem();
        long length = fs.getFileStatus(path).getLen();
        if (length > Integer.MAX_VALUE - 16) {
            throw new IOException(path + " is too large (" + length + " bytes)");
        }
        byte[] bytes = new byte[(int) length];
        try (FSDataInputStream in = fs.open(path)) {
            in.readFully(0, bytes);
        }
        return bytes;
    }

    /** Writes a small file under the root and returns its path, for checking that executors see it. */
    public Path writeProbe(String token) throws IOException {
        FileSystem fs = files.fileSystem();
        fs.mkdirs(files.rootPath());
        Path probe = files.path("_probe-" + token);
        try (OutputStream out = files.create(probe)) {
            out.write(token.getBytes(StandardCharsets.UTF_8));
        }
        return probe;
    }
}
