package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.fail;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.DoubleTextDigest;
import org.skerry.engine.Slow;

/**
 * Numbers are written the same on every Java the README names: 100 000 doubles of every kind
 * (bit patterns, subnormals, extremes, 15- to 17-digit decimals) give the same text, compared by
 * digest, in this JVM and in a JVM of each version (found as {@link JavaVersionsTest} finds them).
 */
class DoubleTextJavaVersionsTest {

    private static final long SEED = 17_25L;
    private static final int COUNT = 100_000;

    @TempDir
    Path dir;

    @Test
    @Slow
    @DisplayName("the same number text on Java 17 and Java 25")
    void sameTextOnEveryJava() throws Exception {
        String here = DoubleTextDigest.digest(SEED, COUNT);
        for (Map.Entry<Integer, Path> jdk : JavaVersionsTest.requireJdks().entrySet()) {
            if (!JavaVersionsTest.VERSIONS.contains(jdk.getKey())) {
                continue;
            }
            Path log = dir.resolve("java-" + jdk.getKey() + ".txt");
            Process process = new ProcessBuilder(List.of(jdk.getValue().resolve("bin").resolve("java").toString(),
                    "-cp", System.getProperty("java.class.path"), DoubleTextDigest.class.getName(),
                    Long.toString(SEED), Integer.toString(COUNT))).redirectErrorStream(true)
                    .redirectOutput(log.toFile()).start();
            if (!process.waitFor(120, TimeUnit.SECONDS)) {
                process.destroyForcibly();
                fail("Java " + jdk.getKey() + " did not finish within 120 s");
            }
            assertEquals(0, process.exitValue(), () -> "Java " + jdk.getKey() + ": " + read(log));
            assertEquals(here, read(log).strip(), "Java " + jdk.getKey() + " against this JVM");
        }
    }

    private static String read(Path log) {
        try {
            return Files.readString(log);
        } catch (java.io.IOException e) {
            return "(log unreadable: " + e.getMessage() + ")";
        }
    }
}
