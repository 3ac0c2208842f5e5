package org.skerry.spark.cluster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.SkerryCommand;
import org.skerry.engine.Slow;
import org.skerry.engine.program.PythonWorkers;
import org.skerry.engine.reference.SyntheticData;

/**
 * A program model on the loopback standalone cluster, the program reaching the nodes through
 * their PATH (as a shared folder on every node's PATH would): while only worker 1's PATH holds
 * the program, the run is refused before it starts, naming the executor on the other worker and
 * the program's error; once both have it, the run gives the bytes of local mode.
 */
@Slow
class ProgramClusterTest {

    private static final String PROGRAM = "skerry-test-normal-mean";

    @TempDir
    static Path dir;

    private static LoopbackCluster cluster;
    private static Path appJar;
    private static Path[] bin;

    @BeforeAll
    static void startCluster() throws IOException {
        appJar = ClassPathJar.ofClassFolders(dir.resolve("app.jar"));
        bin = new Path[] {null, Files.createDirectories(dir.resolve("bin-1")), Files.createDirectories(dir.resolve("bin-2"))};
        install(bin[1]);
        String path = System.getenv("PATH");
        cluster = LoopbackCluster.start(dir.resolve("cluster"), 2, LoopbackCluster.DEFAULT_START_TIMEOUT,
                k -> Map.of("PATH", bin[k] + ":" + path));
    }

    @AfterAll
    static void stopCluster() {
        if (cluster != null) {
            cluster.close();
        }
    }

    /** The test worker as an executable of its own, as a user would install a program. */
    private static Path install(Path folder) throws IOException {
        Path script = folder.resolve(PROGRAM);
        Files.writeString(script, "#!/bin/sh\nexec " + PythonWorkers.PYTHON + " "
                + PythonWorkers.SCRIPTS.resolve("normal_mean.py") + " \"$@\"\n");
        Files.setPosixFilePermissions(script, PosixFilePermissions.fromString("rwxr-xr-x"));
        return script;
    }

    private static Path runFile(String command) throws IOException {
        double[][] rows = SyntheticData.normalRows(62, 10, new double[] {0.4}, 2.0);
        StringBuilder csv = new StringBuilder("# synthetic test data\ny\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", row[0]));
        }
        Files.writeString(dir.resolve("data.csv"), csv.toString());
        return Files.writeString(dir.resolve("program-" + (command.startsWith("/") ? "local" : "cluster") + ".conf"),
                String.join("\n",
                "name = program-cluster",
                "model.program {",
                "  command = [\"" + command + "\", \"2.0\", \"--jitter\"]",
                "  files = [\"data.csv\"]",
                "  environment { SKERRY_WORKER_LIBRARY = \"" + PythonWorkers.LIBRARY + "\" }",
                "  batch = 5",
                "  parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 3 } } ]",
                "}",
                "sampler { particles = 300, seed = 21 }",
                "checkpoint.enabled = false",
                "output.progress = off", ""));
    }

    private static int run(StringWriter err, String... args) {
        return SkerryCommand.execute(args, new PrintWriter(new StringWriter()), new PrintWriter(err, true));
    }

    private static String[] onCluster(Path runFile, Path out) {
        return new String[] {"run", runFile.toString(), "--out", out.toString(), "--master", cluster.masterUrl(),
            "--set", "backend.jars=[\"" + appJar + "\"]",
            "--set", "backend.partitions=4",
            "--set", "backend.spark.\"spark.driver.host\"=127.0.0.1",
            "--set", "backend.spark.\"spark.driver.bindAddress\"=127.0.0.1",
            "--set", "backend.spark.\"spark.executor.memory\"=512m",
            "--set", "backend.spark.\"spark.executor.cores\"=1"};
    }

    @Test
    @DisplayName("program on one worker only: refused before the run (exit 2) naming the other worker's executor and "
            + "the error; on both: the bytes of local mode")
    void refusedThenSameBytes() throws IOException {
        Path clusterRun = runFile(PROGRAM);
        Path refused = dir.resolve("refused");
        StringWriter err = new StringWriter();
        int code = run(err, onCluster(clusterRun, refused));
        String message = err.toString();
        assertEquals(ExitCodes.BAD_INPUT, code, message);
        assertTrue(message.contains("the model program cannot start on every executor"), message);
        assertTrue(message.contains("on 127.0.0.3: cannot start the model program " + PROGRAM), message);
        assertTrue(message.contains("program '" + PROGRAM + "' is not on the PATH"), message);
        assertFalse(message.contains("127.0.0.2:"), "worker 1 has the program: " + message);
        assertFalse(Files.exists(refused.resolve("summary.json")), "nothing ran");

        install(bin[2]);
        StringWriter clusterErr = new StringWriter();
        assertEquals(ExitCodes.SUCCESS, run(clusterErr, onCluster(clusterRun, dir.resolve("cluster-run"))), clusterErr.toString());
        Path localRun = runFile(bin[1].resolve(PROGRAM).toString());
        StringWriter localErr = new StringWriter();
        assertEquals(ExitCodes.SUCCESS, run(localErr, "run", localRun.toString(), "--out", dir.resolve("local").toString(),
                "--set", "backend.master=\"local[2]\"", "--set", "backend.partitions=3"), localErr.toString());
        for (String name : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(dir.resolve("local").resolve(name)),
                    Files.readAllBytes(dir.resolve("cluster-run").resolve(name)), name);
        }
    }
}
