package org.skerry.cli.output;

import java.io.BufferedOutputStream;
import java.io.BufferedWriter;
import java.io.FilterOutputStream;
import java.io.FilterWriter;
import java.io.IOException;
import java.io.OutputStream;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryNotEmptyException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.concurrent.ThreadLocalRandom;

/**
 * Writes a file so that it appears under its name only when complete: the content goes to a
 * temporary file in the same folder ({@code .<name>.<random>.tmp}), is forced to the device, and
 * is then renamed onto the name with an atomic move. A crash leaves either the old file or the new
 * one, never a partial file under the real name (at worst a stray temporary). If the content
 * throws, the temporary is deleted and an existing file of that name is left as it was.
 *
 * <p>Where the file system cannot move atomically, the rename falls back to an ordinary replacing
 * move within the folder; the content is still complete on the device before it gets the name.
 * Text is UTF-8.
 */
public final class AtomicFile {

    /** Writes the bytes of a file. The stream may be closed or left open. */
    @FunctionalInterface
    public interface ByteContent {
        void writeTo(OutputStream out) throws IOException;
    }

    /** Writes the text of a file. The writer may be closed or left open. */
    @FunctionalInterface
    public interface TextContent {
        void writeTo(Writer out) throws IOException;
    }

    private static final int NAME_ATTEMPTS = 16;

    private AtomicFile() {
    }

    /**
     * Writes {@code target} with the bytes {@code content} produces.
     *
     * @throws IOException whose message names {@code target}, if the file cannot be written
     *     (including an I/O failure inside {@code content}); an unchecked exception from
     *     {@code content} propagates unchanged. Either way the temporary is removed first.
     */
    public static void write(Path target, ByteContent content) throws IOException {
        if (target == null) {
            throw new IllegalArgumentException("target must not be null");
        }
        if (content == null) {
            throw new IllegalArgumentException("content must not be null");
        }
        Path absolute = target.toAbsolutePath();
        Path folder = absolute.getParent();
        if (folder == null || absolute.getFileName() == null) {
            throw new IllegalArgumentException("target must name a file in a folder: " + target);
        }
        Path temporary = createTemporary(absolute, folder);
        try {
            try (FileChannel channel = FileChannel.open(temporary, StandardOpenOption.WRITE)) {
                OutputStream stream = new BufferedOutputStream(new KeepOpen(Channels.newOutputStream(channel)));
                content.writeTo(stream);
                stream.flush();
                channel.force(true);
            } catch (IOException e) {
                throw new IOException("cannot write " + target + ": " + reason(e), e);
            }
            move(temporary, absolute, target);
        } catch (Throwable failure) {
            try {
                Files.deleteIfExists(temporary);
            } catch (IOException e) {
                failure.addSuppressed(e);
            }
            throw failure;
        }
        forceFolder(folder);
    }

    /** Writes {@code target} with the UTF-8 text {@code content} produces. */
    public static void writeText(Path target, TextContent content) throws IOException {
        if (content == null) {
            throw new IllegalArgumentException("content must not be null");
        }
        write(target, out -> {
            Writer writer = new BufferedWriter(new OutputStreamWriter(out, StandardCharsets.UTF_8));
            content.writeTo(new KeepOpenWriter(writer));
            writer.flush();
        });
    }

    /** Writes {@code target} holding exactly {@code text} in UTF-8. */
    public static void writeString(Path target, String text) throws IOException {
        if (text == null) {
            throw new IllegalArgumentException("text must not be null");
        }
        writeText(target, out -> out.write(text));
    }

    static Path createTemporary(Path absolute, Path folder) throws IOException {
        String name = absolute.getFileName().toString();
        for (int attempt = 0; ; attempt++) {
            // A random part rather than Files.createTempFile, whose owner-only permissions would
            // then become the permissions of the output file.
            Path temporary = folder.resolve("." + name + "." + Long.toHexString(ThreadLocalRandom.current().nextLong())
                    + ".tmp");
            try {
                Files.newByteChannel(temporary, StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE).close();
                return temporary;
            } catch (FileAlreadyExistsException e) {
                if (attempt >= NAME_ATTEMPTS) {
                    throw new IOException("cannot write " + absolute + ": no free temporary name in " + folder, e);
                }
            } catch (IOException e) {
                throw new IOException("cannot write " + absolute + ": " + reason(e), e);
            }
        }
    }

    static void move(Path temporary, Path absolute, Path target) throws IOException {
        try {
            try {
                Files.move(temporary, absolute, StandardCopyOption.ATOMIC_MOVE);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(temporary, absolute, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            throw new IOException("cannot write " + target + ": " + reason(e), e);
        }
    }

    /** Makes the rename itself durable where the platform allows it; some cannot open a folder. */
    static void forceFolder(Path folder) {
        try (FileChannel channel = FileChannel.open(folder, StandardOpenOption.READ)) {
            channel.force(true);
        } catch (IOException | UnsupportedOperationException e) {
            // The file is complete either way; only the durability of its name is not promised.
        }
    }

    static String reason(IOException e) {
        if (e instanceof NoSuchFileException) {
            return "no such file or folder " + ((NoSuchFileException) e).getFile();
        }
        if (e instanceof DirectoryNotEmptyException) {
            return "a folder of that name is in the way";
        }
        if (e instanceof AccessDeniedException) {
            return "permission denied on " + ((AccessDeniedException) e).getFile();
        }
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }

    /** Lets content close its writer while the bytes still have to reach the device. */
    private static final class KeepOpenWriter extends FilterWriter {
        KeepOpenWriter(Writer out) {
            super(out);
        }

        @Override
        public void close() throws IOException {
            flush();
        }
    }

    /** Lets content close its stream without closing the channel before it is forced. */
    private static final class KeepOpen extends FilterOutputStream {
        KeepOpen(OutputStream out) {
            super(out);
        }

        @Override
        public void write(byte[] b, int off, int len) throws IOException {
            out.write(b, off, len);
        }

        @Override
        public void close() throws IOException {
            flush();
        }
    }
}
