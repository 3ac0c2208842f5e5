package org.skerry.clustertests;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.File;
import java.io.IOException;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * spark-submit with the application jar (submit-jar/target/skerry-submit.jar) against the
 * loopback standalone cluster with authentication on, the run file and data on a path the driver
 * sees (here: the same machine): client and cluster mode give summary.json and particles.csv byte
 * for byte those of a local run; in cluster mode spark-submit exits 0 even when the driver failed,
 * and skerry status tells the outcome from the run folder. spark-submit is Spark's own
 * org.apache.spark.deploy.SparkSubmit from the Maven artifacts, without skerry's jars on its class
 * path. The run: the normal mean with a normal prior (closed form: Gelman et al., BDA3 §2.5) on
 * synthetic data; the reference is the same run in local mode.
 */
@Slow
class SparkSubmitTest {

    @TempDir
    static Path dir;

    private static Path cluster;
    private static String master;
    private static List<String> moduleOptions;
    private static String sparkClassPath;
    private static Path local;

    private static final String RUN_FILE = String.join("\n",
            "name = submitted",
            "# synthetic data: see data.csv",
            "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
            "data { file = \"data.csv\" }",
            "sampler { particles = 200, seed = 4 }",
            "output { progress = log, report = false }",
            "");

    private static int freePort() throws IOException {
        try (ServerSocket socket = new ServerSocket(0)) {
            return socket.getLocalPort();
        }
    }

    @BeforeAll
    static void startCluster() throws Exception {
        Files.writeString(dir.resolve("data.csv"), "# synthetic test data\ny\n1.2\n0.7\n2.5\n1.9\n");
        Files.writeString(dir.resolve("run.conf"), RUN_FILE);
        moduleOptions = Packaged.moduleOptions(dir);
        // Spark's jars as a distribution has them: skerry's own modules left out, so the
        // application jar is what brings skerry to the driver.
        try (Stream<Path> jars = Files.list(Packaged.lib())) {
            sparkClassPath = String.join(File.pathSeparator, jars.filter(jar -> !jar.getFileName().toString()
                    .startsWith("skerry-")).map(Path::toString).sorted().toList());
        }

        // The reference run while the cluster comes up: both mostly wait for JVMs to start.
        local = dir.resolve("local");
        CompletableFuture<Processes.Result> reference = Processes.runInBackground(
                Packaged.localRun(moduleOptions, dir.resolve("run.conf"), local), dir, Map.of(), dir.resolve("local.log"),
                Duration.ofSeconds(300));

        cluster = dir.resolve("cluster");
        int port = freePort();
        master = "spark://127.0.0.1:" + port;
        Processes.Result started = Processes.run(List.of("bash", script(), "start", "--dir", cluster.toString(),
                "--workers", "2", "--port", Integer.toString(port), "--ui-port", Integer.toString(freePort()),
                "--timeout", "120"), dir, Map.of(), dir.resolve("cluster-start.log"), Duration.ofSeconds(180));
        assertEquals(0, started.exitCode(), started.output());
        assertEquals(0, reference.join().exitCode(), reference.join().output());
    }

    @AfterAll
    static void stopCluster() throws Exception {
        if (cluster != null) {
            Processes.run(List.of("bash", script(), "stop", "--dir", cluster.toString()), dir, Map.of(),
                    dir.resolve("cluster-stop.log"), Duration.ofSeconds(60));
            assertEquals(List.of(), Processes.carrying("-Dskerry.loopback.dir=" + cluster), "cluster processes left");
        }
        assertEquals(List.of(), Processes.carrying(dir.toString()), "processes left behind");
    }

    private static String script() {
        return Processes.root().resolve("deploy/loopback-cluster").toString();
    }

    private static Path applicationJar() {
        return Processes.root().resolve("submit-jar/target/skerry-submit.jar");
    }

    /** spark-submit's command line for {@code mode}, then skerry's arguments. */
    private static List<String> submit(String mode, String... skerry) {
        String options = String.join(" ", moduleOptions);
        List<String> command = new ArrayList<>(List.of(Packaged.java(), "-Xmx512m"));
        command.addAll(moduleOptions);
        command.addAll(List.of("-cp", sparkClassPath, "org.apache.spark.deploy.SparkSubmit",
                "--master", master, "--deploy-mode", mode,
                "--properties-file", cluster.resolve("auth.properties").toString(),
                "--class", "org.skerry.submit.SubmitMain",
                "--conf", "spark.driver.host=127.0.0.1",
                "--conf", "spark.driver.memory=512m",
                "--conf", "spark.executor.memory=512m",
                "--conf", "spark.driver.extraJavaOptions=" + options,
                "--conf", "spark.executor.extraJavaOptions=" + options,
                "--conf", "spark.standalone.submit.waitAppCompletion=true",
                applicationJar().toString()));
        command.addAll(List.of(skerry));
        return command;
    }

    private static Processes.Result status(Path runFolder) throws Exception {
        List<String> command = new ArrayList<>(List.of(Packaged.java(), "-cp",
                applicationJar() + File.pathSeparator + sparkClassPath, "org.skerry.submit.SubmitMain", "status",
                runFolder.toString()));
        return Processes.run(command, dir, Map.of(), dir.resolve("status-" + runFolder.getFileName() + ".log"),
                Duration.ofSeconds(60));
    }

    private static void assertSameAnswer(Path run) throws IOException {
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(local.resolve(file)), Files.readAllBytes(run.resolve(file)),
                    file + " of " + run + " against local mode");
        }
    }

    @Test
    @DisplayName("client mode: exit 0, the cluster's executors used, the bytes of local mode, status 0")
    void clientMode() throws Exception {
        Path out = dir.resolve("client");
        Processes.Result result = Processes.run(submit("client", "run", dir.resolve("run.conf").toString(),
                "--out", out.toString(), "--master", master), dir, Map.of("SPARK_LOCAL_IP", "127.0.0.1"),
                dir.resolve("client.log"), Duration.ofSeconds(300));
        assertEquals(0, result.exitCode(), Processes.tail(dir.resolve("client.log")));
        assertTrue(Files.readString(out.resolve("timing.json")).contains(master), "ran on the cluster");
        assertSameAnswer(out);
        Processes.Result status = status(out);
        assertEquals(0, status.exitCode(), status.output());
        assertTrue(status.output().contains("finished: "), status.output());
    }

    @Test
    @DisplayName("cluster mode: a worker runs the driver; the bytes of local mode, status 0")
    void clusterMode() throws Exception {
        Path out = dir.resolve("cluster-mode");
        Processes.Result result = Processes.run(submit("cluster", "run", dir.resolve("run.conf").toString(),
                "--out", out.toString(), "--master", master), dir, Map.of(), dir.resolve("cluster-mode.log"),
                Duration.ofSeconds(300));
        assertEquals(0, result.exitCode(), result.output());
        assertTrue(result.output().contains("is FINISHED"), Processes.tail(dir.resolve("cluster-mode.log")));
        Processes.Result status = status(out);
        assertEquals(0, status.exitCode(), status.output() + "\n" + driverLogs());
        assertSameAnswer(out);
    }

    @Test
    @DisplayName("cluster mode, a driver that fails: spark-submit still exits 0; skerry status exits 1 with the reason")
    void clusterModeFailure() throws Exception {
        Path out = dir.resolve("cluster-failed");
        // A checkpoint folder that cannot be made (not even by root): the run fails after it made its folder.
        Processes.Result result = Processes.run(submit("cluster", "run", dir.resolve("run.conf").toString(),
                "--out", out.toString(), "--master", master, "--set", "checkpoint.path=\"/proc/skerry-none\""), dir,
                Map.of(), dir.resolve("cluster-failed.log"), Duration.ofSeconds(300));
        assertEquals(0, result.exitCode(), "spark-submit's exit code does not tell: " + result.output());
        Processes.Result status = status(out);
        assertEquals(1, status.exitCode(), status.output() + "\n" + driverLogs());
        assertTrue(status.output().startsWith("failed: ") && status.output().contains("/proc/skerry-none"),
                status.output());
        assertFalse(Files.exists(out.resolve("summary.json")));
    }

    private static String driverLogs() throws IOException {
        StringBuilder text = new StringBuilder();
        try (Stream<Path> files = Files.walk(cluster.resolve("work"))) {
            for (Path file : files.filter(f -> f.toString().contains("driver-") && f.getFileName().toString().equals("stderr"))
                    .toList()) {
                text.append("--- ").append(file).append('\n').append(Processes.tail(file)).append('\n');
            }
        }
        return text.toString();
    }
}
