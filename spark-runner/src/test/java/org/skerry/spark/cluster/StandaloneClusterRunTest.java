package org.skerry.spark.cluster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestMethodOrder;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.SkerryCommand;
import org.skerry.cli.checkpoint.NodeLocalFileSystem;
import org.skerry.engine.Slow;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * skerry on a real standalone cluster: a master and two workers in separate JVMs on loopback
 * addresses, started and stopped by the test. Runs the conjugate model and the demo at small N
 * through the command and compares their files with local mode, byte for byte; last, loses a
 * worker (and its executor) in the middle of a run, which must still end byte-identical.
 */
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
@Slow
class StandaloneClusterRunTest {

    @TempDir
    static Path dir;

    private static LoopbackCluster cluster;
    private static Path appJar;

    @BeforeAll
    static void startCluster() throws IOException {
        appJar = ClassPathJar.ofClassFolders(dir.resolve("app.jar"));
        cluster = LoopbackCluster.start(dir.resolve("cluster"), 2);
    }

    @AfterAll
    static void stopCluster() {
        if (cluster != null) {
            cluster.close();
        }
    }

    private static int run(String... args) {
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(args, new PrintWriter(new StringWriter()), new PrintWriter(err));
        assertEquals(0, code, err.toString());
        return code;
    }

    private static List<String> onCluster(Path runFile, Path out, String... more) {
        List<String> args = new ArrayList<>(List.of("run", runFile.toString(), "--out", out.toString(),
                "--master", cluster.masterUrl(),
                "--set", "backend.jars=[\"" + appJar + "\"]",
                "--set", "backend.partitions=4",
                "--set", "backend.spark.\"spark.driver.host\"=127.0.0.1",
                "--set", "backend.spark.\"spark.driver.bindAddress\"=127.0.0.1",
                "--set", "backend.spark.\"spark.executor.memory\"=512m",
                "--set", "backend.spark.\"spark.executor.cores\"=1",
                "--set", "output.progress=off"));
        args.addAll(List.of(more));
        return args;
    }

    private static List<String> local(Path runFile, Path out, String... more) {
        List<String> args = new ArrayList<>(List.of("run", runFile.toString(), "--out", out.toString(),
                "--set", "backend.master=\"local[2]\"", "--set", "backend.partitions=3", "--set", "output.progress=off"));
        args.addAll(List.of(more));
        return args;
    }

    private static void assertSameFiles(Path a, Path b) throws IOException {
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(a.resolve(name)), Files.readAllBytes(b.resolve(name)), name);
        }
    }

    @Test
    @Order(1)
    @DisplayName("conjugate model on the cluster: bit-identical to local mode, evidence near the closed form (PRML eq. 2.115)")
    void conjugateOnCluster() throws IOException {
        double[][] rows = SyntheticData.normalRows(61, 20, new double[] {0.4}, 1.0);
        StringBuilder csv = new StringBuilder("# synthetic test data\ny\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", row[0]));
        }
        Files.writeString(dir.resolve("data.csv"), csv.toString());
        Path runFile = Files.writeString(dir.resolve("conjugate.conf"), String.join("\n",
                "name = conjugate-cluster",
                "model { name = normal-mean, settings { sigma = 1.0, prior { mean = 0, sd = 2 } } }",
                "data.file = \"data.csv\"",
                "sampler { particles = 600, seed = 77 }", ""));
        run(onCluster(runFile, dir.resolve("cluster-run")).toArray(new String[0]));
        run(local(runFile, dir.resolve("local-run")).toArray(new String[0]));
        assertSameFiles(dir.resolve("cluster-run"), dir.resolve("local-run"));

        Matcher m = Pattern.compile("\"log_evidence\"\\s*:\\s*([-0-9.eE+]+)[\\s\\S]*\"log_evidence_error\"\\s*:\\s*([0-9.eE+-]+)")
                .matcher(Files.readString(dir.resolve("cluster-run/summary.json")));
        assertTrue(m.find());
        double logZ = Double.parseDouble(m.group(1));
        double error = Double.parseDouble(m.group(2));
        // One run: within 5 single-run standard errors (a sanity check; the seeded accuracy tests are elsewhere).
        assertEquals(new NormalMeanExact(rows, 1.0, 0.0, 2.0).logEvidence(), logZ, 5 * error + 1e-9);
    }

    @Test
    @Order(2)
    @DisplayName("the demo at small N on the cluster: bit-identical to local mode")
    void demoOnCluster() throws IOException {
        Path runFile = Path.of("..", "conf", "demo", "buoy-07-sigmoidal.conf").toAbsolutePath().normalize();
        String[] small = {"--set", "sampler.particles=60", "--set", "sampler.moves.max-steps=3"};
        run(onCluster(runFile, dir.resolve("demo-cluster"), small).toArray(new String[0]));
        run(local(runFile, dir.resolve("demo-local"), small).toArray(new String[0]));
        assertSameFiles(dir.resolve("demo-cluster"), dir.resolve("demo-local"));
    }

    @Test
    @Order(3)
    @DisplayName("a checkpoint path the executors do not see (one node's local disk) is refused before the run, naming it")
    void checkpointPathNotShared() throws IOException {
        Path out = dir.resolve("not-shared");
        String root = "nodelocal://" + dir.resolve("node-checkpoints");
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(onCluster(dir.resolve("conjugate.conf"), out,
                "--set", "checkpoint.path=\"" + root + "\"",
                "--set", "backend.spark.\"spark.hadoop.fs.nodelocal.impl\"=" + NodeLocalFileSystem.class.getName(),
                "--set", "backend.spark.\"spark.executor.extraJavaOptions\"=\"-Dskerry.test.node=elsewhere\"")
                .toArray(new String[0]), new PrintWriter(new StringWriter()), new PrintWriter(err, true));
        assertEquals(2, code, err.toString());
        assertTrue(err.toString().contains("checkpoint.path = " + root + " is not visible from executors on"),
                err.toString());
        assertTrue(!Files.exists(out.resolve("iterations.csv")), "nothing was run");
    }

    @Test
    @Order(4)
    @DisplayName("a worker killed after checkpoint 2: the run completes, byte-identical to local mode (runs last: the cluster keeps one worker)")
    void lostWorker() throws Exception {
        Path runFile = Path.of("..", "conf", "demo", "buoy-07-sigmoidal.conf").toAbsolutePath().normalize();
        String[] more = {"--set", "sampler.particles=150"};
        Path out = dir.resolve("lost-worker");
        StringWriter err = new StringWriter();
        ExecutorService driver = Executors.newSingleThreadExecutor();
        try {
            Future<Integer> code = driver.submit(() -> SkerryCommand.execute(
                    onCluster(runFile, out, more).toArray(new String[0]), new PrintWriter(new StringWriter()),
                    new PrintWriter(err, true)));
            Path manifest = out.resolve("checkpoints/iteration-000002/manifest.txt");
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(240);
            while (!Files.exists(manifest)) {
                assertTrue(!code.isDone(), "the run ended before checkpoint 2: " + err);
                assertTrue(System.nanoTime() < deadline, "no checkpoint 2 within 240 s: " + err);
                Thread.sleep(20);
            }
            assertTrue(!cluster.executorsOf(2).isEmpty(), "worker 2 runs an executor of this run");
            cluster.killWorker(2);
            assertTrue(!Files.exists(out.resolve("summary.json")), "the worker was lost before the run ended");
            assertEquals(0, (int) code.get(300, TimeUnit.SECONDS), err.toString());
        } finally {
            driver.shutdownNow();
        }
        run(local(runFile, dir.resolve("lost-worker-local"), more).toArray(new String[0]));
        assertSameFiles(out, dir.resolve("lost-worker-local"));
    }
}
