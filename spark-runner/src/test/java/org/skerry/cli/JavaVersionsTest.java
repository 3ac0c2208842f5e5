package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * The answer is promised across JVMs: the same run file run by the program on each Java the README
 * names — 17 and 25 — with the default settings (Spark in local mode, a checkpoint after every
 * iteration) gives byte-identical {@code summary.json}, {@code particles.csv}, {@code
 * iterations.csv} (less its timings) and checkpoint blocks. The demo's ODE model is the run: its
 * likelihood is all {@code exp}, {@code log} and {@code pow}, where JVMs could differ.
 *
 * <p>Where the JDKs are: {@code SKERRY_TEST_JDKS} (JDK folders separated by {@code :}) when set,
 * else this JVM's own, {@code JAVA_HOME}'s and every JDK under {@code /usr/lib/jvm} (a JDK's
 * version is read from its {@code release} file). When one of the versions is not found the test
 * fails under CI ({@code CI=true}, as {@code .ci/run} runs) and is skipped elsewhere, saying which
 * version is missing and how to point the test at it.
 */
class JavaVersionsTest {

    /** The Java feature versions the README names and CI checks. */
    static final List<Integer> VERSIONS = List.of(17, 25);

    private static final Path DEMO_RUN = Path.of("..", "conf", "demo", "buoy-07-sigmoidal.conf").toAbsolutePath()
            .normalize();

    @TempDir
    Path dir;

    @Test
    @Slow
    @DisplayName("the same run file on Java 17 and Java 25, with checkpoints (the default), gives the same bytes")
    void sameBytesOnEveryJava() throws Exception {
        Map<Integer, Path> jdks = requireJdks();
        Map<Integer, Process> running = new LinkedHashMap<>();
        for (int version : VERSIONS) {
            Path out = dir.resolve("java-" + version);
            running.put(version, ProgramProcess.start(jdks.get(version), dir.resolve("java-" + version + ".log"),
                    "run", DEMO_RUN.toString(), "--out", out.toString(), "--set", "sampler.particles=60",
                    "--set", "output.progress=log"));
        }
        for (Map.Entry<Integer, Process> entry : running.entrySet()) {
            Process process = entry.getValue();
            Path log = dir.resolve("java-" + entry.getKey() + ".log");
            if (!process.waitFor(300, TimeUnit.SECONDS)) {
                running.values().forEach(Process::destroyForcibly);
                fail("Java " + entry.getKey() + ": the run did not end within 300 s: " + Files.readString(log));
            }
            assertEquals(0, process.exitValue(), "Java " + entry.getKey() + ": " + Files.readString(log));
        }
        Path first = dir.resolve("java-" + VERSIONS.get(0));
        for (int version : VERSIONS.subList(1, VERSIONS.size())) {
            Path other = dir.resolve("java-" + version);
            String which = "Java " + VERSIONS.get(0) + " against Java " + version + ": ";
            for (String name : new String[] {"summary.json", "particles.csv"}) {
                assertArrayEquals(Files.readAllBytes(first.resolve(name)), Files.readAllBytes(other.resolve(name)),
                        which + name);
            }
            assertEquals(withoutTimings(first.resolve("iterations.csv")), withoutTimings(other.resolve("iterations.csv")),
                    which + "iterations.csv");
            List<Path> blocks = blocks(first);
            assertFalse(blocks.isEmpty(), "the run wrote checkpoints");
            assertEquals(blocks, blocks(other), which + "the same checkpoint files");
            for (Path block : blocks) {
                assertArrayEquals(Files.readAllBytes(first.resolve(block)), Files.readAllBytes(other.resolve(block)),
                        which + block);
            }
        }
    }

    @Test
    @Slow
    @DisplayName("a checkpoint path on another file system than the local one is refused at start on Java 25, "
            + "saying why and what works; accepted on Java 17")
    void otherFileSystemsOnlyWhereHadoopWorks() throws Exception {
        Map<Integer, Path> jdks = requireJdks();
        Map<Integer, Process> running = new LinkedHashMap<>();
        for (int version : VERSIONS) {
            running.put(version, ProgramProcess.start(jdks.get(version), dir.resolve("validate-" + version + ".log"),
                    "validate", DEMO_RUN.toString(), "--set", "checkpoint.path=\"hdfs://namenode:8020/skerry\""));
        }
        for (Map.Entry<Integer, Process> entry : running.entrySet()) {
            assertTrue(entry.getValue().waitFor(120, TimeUnit.SECONDS));
            String log = Files.readString(dir.resolve("validate-" + entry.getKey() + ".log"));
            if (entry.getKey() < 23) {
                assertEquals(0, entry.getValue().exitValue(), log);
            } else {
                assertEquals(ExitCodes.BAD_INPUT, entry.getValue().exitValue(), log);
                assertTrue(log.contains("checkpoint.path = \"hdfs://namenode:8020/skerry\": hdfs: file systems need "
                        + "Hadoop's user login, which calls Subject.getSubject, and Java " + entry.getKey()
                        + " no longer supports it"), log);
                assertTrue(log.contains("run skerry on Java 17 to 22 for hdfs: checkpoints, or put them in a local or "
                        + "shared folder"), log);
            }
        }
    }

    /** The JDKs of {@link #VERSIONS}; fails under CI and skips elsewhere when one is missing. */
    static Map<Integer, Path> requireJdks() throws IOException {
        Map<Integer, Path> jdks = findJdks();
        List<Integer> missing = VERSIONS.stream().filter(v -> !jdks.containsKey(v)).collect(Collectors.toList());
        if (!missing.isEmpty()) {
            String message = "no JDK " + missing + " found (looked in " + (System.getenv("SKERRY_TEST_JDKS") != null
                    ? "SKERRY_TEST_JDKS" : "this JVM's java.home, JAVA_HOME and /usr/lib/jvm") + "; found "
                    + jdks + "); install it or list JDK folders in SKERRY_TEST_JDKS (separated by ':')";
            if ("true".equals(System.getenv("CI"))) {
                fail(message);
            }
            assumeTrue(false, message + "; skipped outside CI");
        }
        return jdks;
    }

    /** Every checkpoint block file, relative to the run folder, in order. */
    private static List<Path> blocks(Path runFolder) throws IOException {
        try (Stream<Path> files = Files.walk(runFolder.resolve("checkpoints"))) {
            return files.filter(f -> f.getFileName().toString().matches("block-\\d+\\.bin")).map(runFolder::relativize)
                    .sorted().collect(Collectors.toList());
        }
    }

    /** iterations.csv without the columns that hold seconds (they differ between any two runs). */
    private static List<String> withoutTimings(Path csv) throws IOException {
        List<String> lines = Files.readAllLines(csv);
        String[] header = lines.get(0).split(",", -1);
        List<String> kept = new ArrayList<>();
        for (String line : lines) {
            String[] cells = line.split(",", -1);
            StringBuilder row = new StringBuilder();
            for (int i = 0; i < cells.length; i++) {
                if (i >= header.length || !header[i].toLowerCase(java.util.Locale.ROOT).contains("seconds")) {
                    row.append(cells[i]).append(',');
                }
            }
            kept.add(row.toString());
        }
        return kept;
    }

    /** JDK folders by feature version: the first found for each. */
    static Map<Integer, Path> findJdks() throws IOException {
        Set<Path> candidates = new LinkedHashSet<>();
        String listed = System.getenv("SKERRY_TEST_JDKS");
        if (listed != null && !listed.isBlank()) {
            for (String home : listed.split(File.pathSeparator)) {
                if (!home.isBlank()) {
                    candidates.add(Path.of(home.trim()));
                }
            }
        } else {
            candidates.add(Path.of(System.getProperty("java.home")));
            if (System.getenv("JAVA_HOME") != null) {
                candidates.add(Path.of(System.getenv("JAVA_HOME")));
            }
            Path jvms = Path.of("/usr/lib/jvm");
            if (Files.isDirectory(jvms)) {
                try (Stream<Path> folders = Files.list(jvms)) {
                    folders.sorted().forEach(candidates::add);
                }
            }
        }
        Map<Integer, Path> found = new LinkedHashMap<>();
        for (Path home : candidates) {
            int version = featureVersion(home);
            if (version > 0 && Files.isExecutable(home.resolve("bin").resolve("java"))) {
                found.putIfAbsent(version, home);
            }
        }
        return found;
    }

    /** The feature version in a JDK's {@code release} file (JAVA_VERSION="25.0.3" → 25, "1.8.0_402" → 8), or 0. */
    static int featureVersion(Path home) throws IOException {
        Path release = home.resolve("release");
        if (!Files.isRegularFile(release)) {
            return 0;
        }
        Matcher m = Pattern.compile("(?m)^JAVA_VERSION=\"(\\d+)(?:\\.(\\d+))?").matcher(Files.readString(release));
        if (!m.find()) {
            return 0;
        }
        int major = Integer.parseInt(m.group(1));
        return major == 1 && m.group(2) != null ? Integer.parseInt(m.group(2)) : major;
    }

    @Test
    @DisplayName("JDK versions are read from the release file")
    void readsReleaseFiles() throws IOException {
        Path jdk = Files.createDirectories(dir.resolve("jdk"));
        Files.writeString(jdk.resolve("release"), "IMPLEMENTOR=\"x\"\nJAVA_VERSION=\"25.0.3\"\n");
        assertEquals(25, featureVersion(jdk));
        Files.writeString(jdk.resolve("release"), "JAVA_VERSION=\"1.8.0_402\"\n");
        assertEquals(8, featureVersion(jdk));
        assertEquals(0, featureVersion(dir));
        assertTrue(featureVersion(Path.of(System.getProperty("java.home"))) >= 17, "this JVM's own release file");
    }
}
