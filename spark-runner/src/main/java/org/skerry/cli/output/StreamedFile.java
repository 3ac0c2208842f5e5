package org.skerry.cli.output;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;

/**
 * A UTF-8 text file on a {@link StagedFile}, written piece by piece over a long time (as the final population streams
 * past) with {@link AtomicFile}'s promise: it goes to a temporary in the same folder and gets its
 * name by an atomic move only at {@link #publish}; {@link #close} before that deletes the
 * temporary, so an abandoned file leaves nothing behind.
 */
final class StreamedFile implements AutoCloseable {

    private final StagedFile file;
    private final Writer writer;
    private boolean published;
    private boolean closed;

    StreamedFile(Path target) throws IOException {
        this.file = StagedFile.open(target);
        this.writer = new BufferedWriter(new OutputStreamWriter(Channels.newOutputStream(file.channel()),
                StandardCharsets.UTF_8), 1 << 16);
    }

    /** Where the text goes until {@link #publish}; the caller must not close it. */
    Writer writer() {
        return writer;
    }

    /** Forces the text to the device and moves it onto its name. */
    Path publish() throws IOException {
        if (closed || published) {
            throw new IllegalStateException(file.target() + " is already " + (published ? "published" : "abandoned"));
        }
        try {
            writer.flush();
        } catch (IOException e) {
            throw new IOException("cannot write " + file.target() + ": " + AtomicFile.reason(e), e);
        }
        Path target = file.publish();
        published = true;
        return target;
    }

    /** Abandons the file unless it was published: the temporary is deleted. */
    @Override
    public void close() throws IOException {
        if (closed) {
            return;
        }
        closed = true;
        file.close();
    }
}
