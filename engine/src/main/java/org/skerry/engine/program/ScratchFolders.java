package org.skerry.engine.program;

import java.io.IOException;
import java.nio.file.FileVisitResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.SimpleFileVisitor;
import java.nio.file.attribute.BasicFileAttributes;

/**
 * The scratch space of a program model in one JVM: a folder of its own under the configured
 * scratch folder (or the system's temporary folder), with one folder per worker inside, which is
 * the worker's current folder and {@code TMPDIR}. Each is removed when its owner ends.
 */
final class ScratchFolders {

    private ScratchFolders() {
    }

    /** A new, empty folder for this JVM's workers of one model, under {@code parent} (or the temporary folder). */
    static Path createRoot(Path parent) {
        try {
            Path base = parent != null ? parent : Path.of(System.getProperty("java.io.tmpdir"));
            Files.createDirectories(base);
            return Files.createTempDirectory(base, "skerry-program-");
        } catch (IOException e) {
            throw new ProgramStartException("cannot create a scratch folder for the model program under "
                    + (parent != null ? parent : System.getProperty("java.io.tmpdir")) + ": " + e);
        }
    }

    /** Creates {@code root/name} (empty). */
    static Path create(Path root, String name) {
        try {
            return Files.createDirectories(root.resolve(name));
        } catch (IOException e) {
            throw new ProgramStartException("cannot create the scratch folder " + root.resolve(name) + ": " + e);
        }
    }

    /** Removes {@code folder} and everything in it, as far as possible (best effort, never fails). */
    static void remove(Path folder) {
        if (folder == null || !Files.exists(folder)) {
            return;
        }
        try {
            Files.walkFileTree(folder, new SimpleFileVisitor<>() {
                @Override
                public FileVisitResult visitFile(Path file, BasicFileAttributes attributes) throws IOException {
                    Files.deleteIfExists(file);
                    return FileVisitResult.CONTINUE;
                }

                @Override
                public FileVisitResult visitFileFailed(Path file, IOException e) {
                    return FileVisitResult.CONTINUE;
                }

                @Override
                public FileVisitResult postVisitDirectory(Path dir, IOException e) throws IOException {
                    Files.deleteIfExists(dir);
                    return FileVisitResult.CONTINUE;
                }
            });
        } catch (IOException e) {
            // a file held open by a program that is still ending: left for the system's cleaner
        }
    }
}
