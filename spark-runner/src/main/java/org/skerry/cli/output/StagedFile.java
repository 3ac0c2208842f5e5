package org.skerry.cli.output;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * A file written over many calls that appears under its name only when {@link #publish}ed: the
 * same temporary-then-atomic-move as {@link AtomicFile}, for writers that stream (the content is
 * not one callback). {@link #close} before {@code publish} deletes the temporary, so an abandoned
 * file leaves nothing behind and an existing file of that name stays as it was.
 */
final class StagedFile implements AutoCloseable {

    private final Path target;
    private final Path absolute;
    private final Path temporary;
    private final FileChannel channel;
    private boolean published;
    private boolean closed;

    private StagedFile(Path target, Path absolute, Path temporary, FileChannel channel) {
        this.target = target;
        this.absolute = absolute;
        this.temporary = temporary;
        this.channel = channel;
    }

    /** Opens the temporary for {@code target} in {@code target}'s folder. */
    static StagedFile open(Path target) throws IOException {
        Path absolute = target.toAbsolutePath();
        Path folder = absolute.getParent();
        if (folder == null || absolute.getFileName() == null) {
            throw new IllegalArgumentException("target must name a file in a folder: " + target);
        }
        Path temporary = AtomicFile.createTemporary(absolute, folder);
        try {
            return new StagedFile(target, absolute, temporary, FileChannel.open(temporary, StandardOpenOption.WRITE));
        } catch (IOException e) {
            Files.deleteIfExists(temporary);
            throw new IOException("cannot write " + target + ": " + AtomicFile.reason(e), e);
        }
    }

    /** Where the bytes go until {@link #publish}. */
    FileChannel channel() {
        return channel;
    }

    /** The name the file gets. */
    Path target() {
        return target;
    }

    /** Forces the bytes to the device, closes the channel and moves the file onto its name. */
    Path publish() throws IOException {
        if (closed) {
            throw new IllegalStateException("already closed: " + target);
        }
        try {
            channel.force(true);
            channel.close();
        } catch (IOException e) {
            throw new IOException("cannot write " + target + ": " + AtomicFile.reason(e), e);
        }
        AtomicFile.move(temporary, absolute, target);
        published = true;
        closed = true;
        AtomicFile.forceFolder(absolute.getParent());
        return target;
    }

    /** Deletes the temporary unless it was published. */
    @Override
    public void close() throws IOException {
        if (closed) {
            return;
        }
        closed = true;
        try {
            channel.close();
        } finally {
            if (!published) {
                Files.deleteIfExists(temporary);
            }
        }
    }
}
