package org.skerry.cli.output;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * A UTF-8 text file written piece by piece over a long time (as the final population streams
 * past) with {@link AtomicFile}'s promise: it goes to a temporary in the same folder and gets its
 * name by an atomic move only at {@link #publish}; {@link #close} before that deletes the
 * temporary, so an abandoned file leaves nothing behind.
 */
final class StreamedFile implements AutoCloseable {

    private final Path target;
    private final Path absolute;
    private final Path temporary;
    private final FileChannel channel;
    private final Writer writer;
    private boolean published;
    private boolean closed;

    StreamedFile(Path target) throws IOException {
        this.target = target;
        this.absolute = target.toAbsolutePath();
        Path folder = absolute.getParent();
        if (folder == null || absolute.getFileName() == null) {
            throw new IllegalArgumentException("target must name a file in a folder: " + target);
        }
        this.temporary = AtomicFile.createTemporary(absolute, folder);
        FileChannel opened;
        try {
            opened = FileChannel.open(temporary, StandardOpenOption.WRITE);
        } catch (IOException e) {
            Files.deleteIfExists(temporary);
            throw new IOException("cannot write " + target + ": " + AtomicFile.reason(e), e);
        }
        this.channel = opened;
        this.writer = new BufferedWriter(new OutputStreamWriter(Channels.newOutputStream(channel), StandardCharsets.UTF_8),
                1 << 16);
    }

    /** Where the text goes until {@link #publish}; the caller must not close it. */
    Writer writer() {
        return writer;
    }

    /** Forces the text to the device and moves it onto its name. */
    Path publish() throws IOException {
        if (closed || published) {
            throw new IllegalStateException(target + " is already " + (published ? "published" : "abandoned"));
        }
        try {
            writer.flush();
            channel.force(true);
            channel.close();
        } catch (IOException e) {
            throw new IOException("cannot write " + target + ": " + AtomicFile.reason(e), e);
        }
        AtomicFile.move(temporary, absolute, target);
        published = true;
        AtomicFile.forceFolder(absolute.getParent());
        return target;
    }

    /** Abandons the file unless it was published: the temporary is deleted. */
    @Override
    public void close() throws IOException {
        if (closed) {
            return;
        }
        closed = true;
        if (!published) {
            try {
                channel.close();
            } finally {
                Files.deleteIfExists(temporary);
            }
        }
    }
}
