package org.skerry.spark.cluster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Collectors;
import java.util.stream.IntStream;

import org.apache.spark.SparkConf;
import org.apache.spark.SparkEnv;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * Starts real standalone clusters (separate JVMs on loopback addresses) and runs jobs on them from
 * this JVM as the driver.
 */
class LoopbackClusterTest {

    private static final List<Integer> ONE_TO_THOUSAND =
            IntStream.rangeClosed(1, 1000).boxed().collect(Collectors.toList());

    @TempDir
    Path dir;

    @BeforeAll
    static void driverJvmHasSparkModuleOptions() {
        // Spark's driver reaches into JDK internals; without the opens the SparkContext fails deep
        // inside Spark with an IllegalAccessError that does not say what to do.
        boolean open = Object.class.getModule().isOpen("sun.nio.ch", LoopbackClusterTest.class.getModule());
        assertTrue(open, "the test JVM lacks Spark's module options; give surefire an argLine with "
                + String.join(" ", org.apache.spark.launcher.JavaModuleOptions.defaultModuleOptionArray()));
    }

    @Test
    @Slow
    void jobRunsOnBothWorkersAndCloseLeavesNoProcess() throws IOException {
        Map<ProcessHandle, String> seen = new LinkedHashMap<>(); // process and its Spark class
        long t0 = System.nanoTime();
        long closing;
        try (LoopbackCluster cluster = LoopbackCluster.start(dir.resolve("cluster"), 2)) {
            long t1 = System.nanoTime();
            try (JavaSparkContext sc = new JavaSparkContext(driverConf(cluster.masterUrl(), 2))) {
                JavaRDD<Integer> numbers = sc.parallelize(ONE_TO_THOUSAND, 4);
                long sum = numbers.map(Integer::longValue).reduce(Long::sum);
                long t2 = System.nanoTime();
                assertEquals(500_500L, sum);
                assertEquals(Set.of("127.0.0.2", "127.0.0.3"), executorHosts(numbers),
                        "the four partitions should run on both workers' executors");
                cluster.processes().forEach(p -> seen.put(p, mainClass(p)));
                System.out.printf("[timing] cluster start %.1f s, first job (context and executors) %.1f s%n",
                        seconds(t1 - t0), seconds(t2 - t1));
            }
            assertEquals(List.of("Master", "Worker", "Worker", "CoarseGrainedExecutorBackend",
                            "CoarseGrainedExecutorBackend"),
                    seen.values().stream().map(name -> name.substring(name.lastIndexOf('.') + 1)).sorted(
                            Comparator.comparing((String name) -> !name.equals("Master"))
                                    .thenComparing(name -> !name.equals("Worker"))).collect(Collectors.toList()),
                    "expected master, 2 workers and an executor on each, saw " + seen);
            closing = System.nanoTime();
        }
        System.out.printf("[timing] close %.1f s%n", seconds(System.nanoTime() - closing));
        List<ProcessHandle> alive = seen.keySet().stream().filter(ProcessHandle::isAlive).collect(Collectors.toList());
        assertTrue(alive.isEmpty(), "still alive after close: " + alive.stream().map(seen::get)
                .collect(Collectors.toList()));
    }

    @Test
    @Slow
    void killedWorkerTakesItsExecutorAlongAndTheJobRunsOnTheOther() throws IOException {
        try (LoopbackCluster cluster = LoopbackCluster.start(dir.resolve("cluster"), 2);
                JavaSparkContext sc = new JavaSparkContext(driverConf(cluster.masterUrl(), 2))) {
            JavaRDD<Integer> numbers = sc.parallelize(ONE_TO_THOUSAND, 4);
            assertEquals(Set.of("127.0.0.2", "127.0.0.3"), executorHosts(numbers));
            List<ProcessHandle> secondWorker = new ArrayList<>(cluster.executorsOf(2));
            assertEquals(1, secondWorker.size(), "worker-2 should run one executor: " + describe(secondWorker));
            assertTrue(mainClass(secondWorker.get(0)).endsWith("CoarseGrainedExecutorBackend"),
                    "worker-2's child is not an executor: " + describe(secondWorker));

            cluster.killWorker(2);
            assertFalse(secondWorker.get(0).isAlive(), "worker-2's executor survived the kill");
            cluster.awaitAliveWorkers(1, Duration.ofSeconds(60));

            assertEquals(500_500L, (long) numbers.map(Integer::longValue).reduce(Long::sum));
            assertEquals(Set.of("127.0.0.2"), executorHosts(numbers));
        }
    }

    @Test
    @Slow
    void failedStartLeavesNoProcess() {
        Path clusterDir = dir.resolve("cluster");
        IllegalStateException e = assertThrows(IllegalStateException.class,
                () -> LoopbackCluster.start(clusterDir, 1, Duration.ZERO));
        assertTrue(e.getMessage().contains("did not count 1 alive workers"), e.getMessage());
        List<ProcessHandle> left = ProcessHandle.current().descendants()
                .filter(p -> String.join(" ", LoopbackCluster.commandLine(p)).contains(clusterDir.toString()))
                .collect(Collectors.toList());
        assertTrue(left.isEmpty(), "a failed start left processes behind: " + describe(left));
    }

    @Test
    void refusesANumberOfWorkersOutOfRange() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> LoopbackCluster.start(dir, 0));
        assertEquals("workers must be 1 to 50, not 0", e.getMessage());
    }

    /** Driver settings for a test: loopback only, small, everything written under the temp dir. */
    private SparkConf driverConf(String masterUrl, int executors) throws IOException {
        Path tmp = Files.createDirectories(dir.resolve("driver-tmp"));
        return new SparkConf()
                .setMaster(masterUrl)
                .setAppName(getClass().getSimpleName())
                .set("spark.jars", ClassPathJar.ofClassFolders(dir.resolve("app.jar")).toString())
                .set("spark.driver.host", "127.0.0.1")
                .set("spark.driver.bindAddress", "127.0.0.1")
                .set("spark.ui.enabled", "false")
                .set("spark.local.dir", tmp.toString())
                .set("spark.executor.memory", "512m")
                .set("spark.executor.cores", "1")
                .set("spark.cores.max", Integer.toString(executors))
                // Wait for every executor before the first job, so tasks can land on all of them.
                .set("spark.scheduler.minRegisteredResourcesRatio", "1.0")
                .set("spark.scheduler.maxRegisteredResourcesWaitingTime", "60s");
    }

    /** The hosts of the executors that ran the partitions of {@code rdd}. */
    private static Set<String> executorHosts(JavaRDD<Integer> rdd) {
        return new TreeSet<>(rdd.mapPartitions(it -> List.of(SparkEnv.get().blockManager().blockManagerId().host())
                .iterator()).collect());
    }

    private static String describe(List<ProcessHandle> processes) {
        return processes.stream().map(p -> p.pid() + " " + mainClass(p)).collect(Collectors.joining(", ", "[", "]"));
    }

    /** The first Spark class named on a live process's command line, or "?". */
    private static String mainClass(ProcessHandle process) {
        return LoopbackCluster.commandLine(process).stream()
                .filter(arg -> arg.startsWith("org.apache.spark.")).findFirst().orElse("?");
    }

    private static double seconds(long nanos) {
        return nanos / 1e9;
    }
}
