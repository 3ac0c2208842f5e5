package org.skerry.spark.cluster;

import java.io.File;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;
import java.util.jar.JarEntry;
import java.util.jar.JarOutputStream;
import java.util.stream.Collectors;
import java.util.stream.Stream;

/**
 * Packs the class folders on this JVM's class path ({@code target/classes},
 * {@code target/test-classes} of every module in the build) into one jar, for a test driver to
 * ship to executors with {@code spark.jars}.
 *
 * <p>Executors get their jars from {@code SPARK_HOME/jars} and from what the driver ships; class
 * folders reach them by neither way. Shipping a jar is what a real run does, so the tests exercise
 * the same path. Without it a task fails with a {@code ClassCastException} about
 * {@code SerializedLambda}, not with a missing class.
 */
public final class ClassPathJar {

    private ClassPathJar() {
    }

    /**
     * Writes the jar.
     *
     * @param jar the file to write; its folder must exist
     * @return {@code jar}
     * @throws IOException when a folder cannot be read or the jar written
     * @throws IllegalStateException when the class path has no class folder
     */
    public static Path ofClassFolders(Path jar) throws IOException {
        Objects.requireNonNull(jar, "jar");
        List<Path> folders = classFolders();
        if (folders.isEmpty()) {
            throw new IllegalStateException("no class folder on this JVM's class path: "
                    + System.getProperty("java.class.path"));
        }
        // The first folder that holds an entry wins, as it does on the class path.
        Set<String> written = new HashSet<>();
        try (OutputStream file = Files.newOutputStream(jar); JarOutputStream out = new JarOutputStream(file)) {
            for (Path folder : folders) {
                List<Path> files;
                try (Stream<Path> walk = Files.walk(folder)) {
                    files = walk.filter(Files::isRegularFile).sorted().collect(Collectors.toList());
                }
                for (Path path : files) {
                    String name = folder.relativize(path).toString().replace(File.separatorChar, '/');
                    if (name.equals("META-INF/MANIFEST.MF") || !written.add(name)) {
                        continue;
                    }
                    out.putNextEntry(new JarEntry(name));
                    Files.copy(path, out);
                    out.closeEntry();
                }
            }
        }
        return jar;
    }

    /** @return the folders (not jars) on this JVM's class path, in class-path order */
    public static List<Path> classFolders() {
        List<Path> folders = new ArrayList<>();
        for (String entry : System.getProperty("java.class.path").split(File.pathSeparator)) {
            Path path = Paths.get(entry);
            if (!entry.isEmpty() && Files.isDirectory(path)) {
                folders.add(path.toAbsolutePath());
            }
        }
        return folders;
    }
}
