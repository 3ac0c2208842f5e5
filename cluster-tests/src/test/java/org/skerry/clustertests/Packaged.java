package org.skerry.clustertests;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.File;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * skerry as the build packaged it, started the way the cluster tests need it: the JVM the tests
 * run on, Spark's and skerry's jars in spark-runner/target/lib, the JVM module options that
 * deploy/lib/ModuleOptions.java prints for them, and the local-mode reference run whose
 * summary.json and particles.csv every cluster path must reproduce byte for byte.
 */
final class Packaged {

    private Packaged() {
    }

    /** The java launcher of the JVM running the tests. */
    static String java() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    /** spark-runner/target/lib: Spark, its dependencies and skerry's modules. */
    static Path lib() {
        return Processes.root().resolve("spark-runner/target/lib");
    }

    /** The module options Spark needs on this JVM, one per element; the log goes to {@code dir}. */
    static List<String> moduleOptions(Path dir) throws IOException, InterruptedException {
        Processes.Result options = Processes.run(List.of(java(), "-cp", lib() + File.separator + "*",
                Processes.root().resolve("deploy/lib/ModuleOptions.java").toString()), dir, Map.of(),
                dir.resolve("module-options.log"), Duration.ofSeconds(60));
        assertEquals(0, options.exitCode(), options.output());
        return options.output().lines().filter(line -> !line.isBlank()).toList();
    }

    /** The command of a local-mode run ({@code local[2]}) of {@code runFile} into {@code out}. */
    static List<String> localRun(List<String> moduleOptions, Path runFile, Path out) {
        List<String> command = new ArrayList<>(List.of(java()));
        command.addAll(moduleOptions);
        command.addAll(List.of("-cp", lib() + File.separator + "*" + File.pathSeparator
                + Processes.root().resolve("spark-runner/target/skerry-spark-runner.jar"), "org.skerry.cli.SkerryCommand",
                "run", runFile.toString(), "--out", out.toString(), "--set", "backend.master=\"local[2]\""));
        return command;
    }
}
