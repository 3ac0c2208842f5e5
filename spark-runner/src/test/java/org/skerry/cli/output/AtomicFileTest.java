package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AtomicFileTest {

    @TempDir
    Path folder;

    private List<String> names() throws IOException {
        try (Stream<Path> files = Files.list(folder)) {
            return files.map(p -> p.getFileName().toString()).sorted().collect(Collectors.toList());
        }
    }

    @Test
    @DisplayName("writes the content and leaves no temporary behind")
    void writesContent() throws IOException {
        Path target = folder.resolve("out.txt");
        byte[] bytes = "α,β\n1,2\n".getBytes(StandardCharsets.UTF_8);
        AtomicFile.write(target, out -> out.write(bytes));
        assertArrayEquals(bytes, Files.readAllBytes(target));
        assertEquals(List.of("out.txt"), names());
    }

    @Test
    @DisplayName("replaces an existing file")
    void replacesExisting() throws IOException {
        Path target = folder.resolve("out.txt");
        Files.writeString(target, "old content that is longer than the new one");
        AtomicFile.writeString(target, "new");
        assertEquals("new", Files.readString(target));
        assertEquals(List.of("out.txt"), names());
    }

    @Test
    @DisplayName("while being written, the name still shows the old file, never a partial one")
    void nameNeverShowsPartialContent() throws IOException {
        Path target = folder.resolve("out.txt");
        Files.writeString(target, "old");
        AtomicFile.writeText(target, out -> {
            out.write("half of the new ");
            out.flush();
            assertEquals("old", Files.readString(target));
            out.write("content");
            out.close();
            assertEquals("old", Files.readString(target));
        });
        assertEquals("half of the new content", Files.readString(target));

        Path fresh = folder.resolve("fresh.txt");
        AtomicFile.writeString(fresh, "");
        assertTrue(Files.exists(fresh));
        Path other = folder.resolve("other.txt");
        AtomicFile.writeText(other, out -> {
            out.write("x");
            out.flush();
            assertFalse(Files.exists(other));
        });
    }

    @Test
    @DisplayName("a failing writer leaves the existing file untouched and removes the temporary")
    void failureKeepsExistingFile() throws IOException {
        Path target = folder.resolve("out.txt");
        Files.writeString(target, "precious");
        IllegalStateException boom = new IllegalStateException("boom");
        IllegalStateException thrown = assertThrows(IllegalStateException.class, () -> AtomicFile.writeText(target, out -> {
            out.write("partial");
            out.flush();
            throw boom;
        }));
        assertSame(boom, thrown);
        assertEquals("precious", Files.readString(target));
        assertEquals(List.of("out.txt"), names());
    }

    @Test
    @DisplayName("an I/O failure in the writer names the target; nothing is left behind")
    void ioFailureNamesTarget() throws IOException {
        Path target = folder.resolve("new.txt");
        IOException thrown = assertThrows(IOException.class, () -> AtomicFile.write(target, out -> {
            out.write(1);
            throw new IOException("No space left on device");
        }));
        assertTrue(thrown.getMessage().contains(target.toString()), thrown.getMessage());
        assertTrue(thrown.getMessage().contains("No space left on device"), thrown.getMessage());
        assertEquals(List.of(), names());
    }

    @Test
    @DisplayName("a missing folder is reported with the target's name")
    void missingFolder() {
        Path target = folder.resolve("no-such-folder").resolve("out.txt");
        IOException thrown = assertThrows(IOException.class, () -> AtomicFile.writeString(target, "x"));
        assertTrue(thrown.getMessage().startsWith("cannot write " + target), thrown.getMessage());
    }

    @Test
    @DisplayName("a folder in the way is reported; the folder and its content stay, no temporary is left")
    void folderInTheWay() throws IOException {
        Path target = Files.createDirectory(folder.resolve("out.txt"));
        Files.writeString(target.resolve("inside"), "kept");
        IOException thrown = assertThrows(IOException.class, () -> AtomicFile.writeString(target, "x"));
        assertTrue(thrown.getMessage().startsWith("cannot write " + target + ": "), thrown.getMessage());
        assertEquals("kept", Files.readString(target.resolve("inside")));
        assertEquals(List.of("out.txt"), names());
    }
}
