package org.skerry.clustertests;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * The YARN path: Hadoop's mini YARN cluster (one resource manager, one node manager; the
 * mini-yarn module's program, in its own JVM because its Jersey 1 / javax web stack clashes with
 * Spark 4's Jakarta one) and spark-submit with the application jar
 * (submit-jar/target/skerry-submit.jar) and {@code --master yarn}. Client mode with the run file
 * and data on a path the driver sees, and cluster mode with both shipped by {@code --files}, give
 * summary.json and particles.csv byte for byte those of a local run, with the executors (and in
 * cluster mode the driver) in YARN containers of the queue asked for. Spark's jars reach the
 * containers as {@code spark.yarn.jars=local:…}, as from a Spark installed on every node. The
 * run: the normal mean with a normal prior (closed form: Gelman et al., BDA3 §2.5) on synthetic
 * data; the reference is the same run in local mode.
 */
@Slow
class YarnRunTest {

    @TempDir
    static Path dir;

    private static Process yarn;
    private static Path confDir;
    private static Path sparkJars;
    private static List<String> moduleOptions;
    private static Path local;

    /** The queue the runs ask for, made by the mini cluster beside {@code default}. */
    private static final String QUEUE = "skerry";

    private static final String RUN_FILE = String.join("\n",
            "name = on-yarn",
            "# synthetic data: see data.csv",
            "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
            "data { file = \"data.csv\" }",
            "sampler { particles = 200, seed = 4 }",
            "output { progress = log, report = false }",
            "");

    @BeforeAll
    static void startYarn() throws Exception {
        Files.writeString(dir.resolve("data.csv"), "# synthetic test data\ny\n1.2\n0.7\n2.5\n1.9\n");
        Files.writeString(dir.resolve("run.conf"), RUN_FILE);
        confDir = dir.resolve("hadoop-conf");

        // The mini cluster first: it takes longest to come up, and the rest is done meanwhile.
        Path miniYarn = Processes.root().resolve("mini-yarn/target");
        String miniClassPath = miniYarn.resolve("skerry-mini-yarn.jar") + File.pathSeparator
                + Files.readString(miniYarn.resolve("classpath.txt")).strip();
        Path yarnHome = Files.createDirectories(dir.resolve("yarn"));
        ProcessBuilder builder = new ProcessBuilder(List.of(Packaged.java(), "-Xmx768m", "-cp", miniClassPath,
                "org.skerry.miniyarn.MiniYarnMain", confDir.toString(), QUEUE)).directory(yarnHome.toFile())
                .redirectErrorStream(true).redirectOutput(dir.resolve("yarn.log").toFile());
        // Containers start java from the node manager's JAVA_HOME.
        builder.environment().put("JAVA_HOME", System.getProperty("java.home"));
        yarn = builder.start();

        moduleOptions = Packaged.moduleOptions(dir);

        // Spark's jars as a Spark installation has them (skerry's own modules left out, so the
        // application jar is what brings skerry), with Spark's YARN support, in one folder.
        sparkJars = Files.createDirectories(dir.resolve("spark-jars"));
        try (Stream<Path> jars = Files.list(Packaged.lib())) {
            for (Path jar : jars.filter(jar -> !jar.getFileName().toString().startsWith("skerry-")).toList()) {
                Files.createSymbolicLink(sparkJars.resolve(jar.getFileName()), jar);
            }
        }
        Path yarnSupport = Path.of(Class.forName("org.apache.spark.deploy.yarn.Client").getProtectionDomain()
                .getCodeSource().getLocation().toURI());
        Files.createSymbolicLink(sparkJars.resolve(yarnSupport.getFileName()), yarnSupport);

        local = dir.resolve("local");
        Processes.Result reference = Processes.run(Packaged.localRun(moduleOptions, dir.resolve("run.conf"), local), dir,
                Map.of(), dir.resolve("local.log"), Duration.ofSeconds(300));
        assertEquals(0, reference.exitCode(), reference.output());

        // The cluster writes its client configuration when its resource manager listens.
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(240);
        while (!Files.exists(confDir.resolve("yarn-site.xml"))) {
            if (!yarn.isAlive()) {
                fail("the mini YARN cluster stopped (exit " + yarn.exitValue() + "):\n" + Processes.tail(dir.resolve("yarn.log")));
            }
            if (System.nanoTime() > deadline) {
                fail("the mini YARN cluster did not come up in 240 s:\n" + Processes.tail(dir.resolve("yarn.log")));
            }
            Thread.sleep(200);
        }
    }

    @AfterAll
    static void stopYarn() throws Exception {
        if (yarn != null) {
            // TERM lets the cluster stop its containers (about 20 s at load 20 on the 2-core
            // machine); whatever of its process tree is left after 60 s is killed.
            List<ProcessHandle> tree = new ArrayList<>(yarn.descendants().toList());
            yarn.destroy();
            yarn.waitFor(60, TimeUnit.SECONDS);
            tree.add(yarn.toHandle());
            tree.stream().filter(ProcessHandle::isAlive).forEach(ProcessHandle::destroyForcibly);
            yarn.waitFor(10, TimeUnit.SECONDS);
        }
        assertEquals(List.of(), Processes.carrying(dir.toString()), "processes left behind");
    }

    /** spark-submit's command line for {@code mode} on YARN, then skerry's arguments. */
    private static List<String> submit(String mode, List<String> sparkOptions, String... skerry) {
        String options = String.join(" ", moduleOptions);
        List<String> command = new ArrayList<>(List.of(Packaged.java(), "-Xmx512m"));
        command.addAll(moduleOptions);
        // HADOOP_CONF_DIR on the class path, as Spark's launch scripts put it.
        command.addAll(List.of("-cp", confDir + File.pathSeparator + sparkJars + File.separator + "*",
                "org.apache.spark.deploy.SparkSubmit", "--master", "yarn", "--deploy-mode", mode,
                "--queue", QUEUE, "--class", "org.skerry.submit.SubmitMain",
                "--num-executors", "2", "--executor-cores", "1",
                "--driver-memory", "512m", "--executor-memory", "512m",
                "--conf", "spark.yarn.am.memory=512m",
                "--conf", "spark.yarn.jars=local:" + sparkJars + File.separator + "*",
                "--conf", "spark.yarn.stagingDir=" + dir.resolve("staging"),
                "--conf", "spark.driver.extraJavaOptions=" + options,
                "--conf", "spark.executor.extraJavaOptions=" + options,
                "--conf", "spark.yarn.am.extraJavaOptions=" + options));
        command.addAll(sparkOptions);
        command.add(Processes.root().resolve("submit-jar/target/skerry-submit.jar").toString());
        command.addAll(List.of(skerry));
        return command;
    }

    private static Map<String, String> environment() {
        return Map.of("HADOOP_CONF_DIR", confDir.toString(), "SPARK_LOCAL_IP", "127.0.0.1");
    }

    private static void assertSameAnswer(Path run) throws IOException {
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(local.resolve(file)), Files.readAllBytes(run.resolve(file)),
                    file + " of " + run + " against local mode");
        }
    }

    /** The YARN application spark-submit's log names, e.g. application_1796285146946_0001. */
    private static String application(String output) {
        Matcher m = Pattern.compile("application_\\d+_\\d+").matcher(output);
        assertTrue(m.find(), "no YARN application in spark-submit's output");
        return m.group();
    }

    /** The containers the node manager ran for {@code application} (its log folders). */
    private static List<Path> containers(String application) throws IOException {
        try (Stream<Path> files = Files.walk(dir.resolve("yarn"))) {
            return files.filter(f -> f.getFileName().toString().startsWith("container_")
                    && f.getParent().getFileName().toString().equals(application) && f.toString().contains("logDir"))
                    .toList();
        }
    }

    @Test
    @DisplayName("client mode: exit 0, executors in YARN containers of the queue asked for, the bytes of local mode")
    void clientMode() throws Exception {
        Path out = dir.resolve("client");
        Processes.Result result = Processes.run(submit("client", List.of("--conf", "spark.driver.host=127.0.0.1"),
                "run", dir.resolve("run.conf").toString(), "--out", out.toString(), "--master", "yarn"), dir,
                environment(), dir.resolve("client.log"), Duration.ofSeconds(400));
        assertEquals(0, result.exitCode(), Processes.tail(dir.resolve("client.log")));
        assertTrue(result.output().contains("queue: root." + QUEUE), "the queue asked for: " + Processes.tail(dir.resolve("client.log")));
        String timing = Files.readString(out.resolve("timing.json"));
        assertTrue(timing.contains("yarn"), "ran on YARN");
        // backend.tasks = auto saw spark-submit's --executor-cores, though the run file names no cores.
        assertTrue(timing.contains("a task per executor"), "tasks per executor from --executor-cores: " + timing);
        // The application master and the two executors.
        assertEquals(3, containers(application(result.output())).size(), "containers of the application");
        assertSameAnswer(out);
    }

    @Test
    @DisplayName("cluster mode, run file and data shipped with --files: the driver in a container, final status "
            + "SUCCEEDED, the bytes of local mode")
    void clusterMode() throws Exception {
        Path out = dir.resolve("cluster-mode");
        // The driver starts in its container's folder, where --files puts run.conf and data.csv.
        Processes.Result result = Processes.run(submit("cluster", List.of("--files",
                dir.resolve("run.conf") + "," + dir.resolve("data.csv")), "run", "run.conf", "--out", out.toString(),
                "--master", "yarn"), dir, environment(), dir.resolve("cluster-mode.log"), Duration.ofSeconds(400));
        assertEquals(0, result.exitCode(), Processes.tail(dir.resolve("cluster-mode.log")));
        assertTrue(result.output().contains("final status: SUCCEEDED"), Processes.tail(dir.resolve("cluster-mode.log")));
        assertEquals(3, containers(application(result.output())).size(), "containers of the application");
        assertSameAnswer(out);
    }
}
