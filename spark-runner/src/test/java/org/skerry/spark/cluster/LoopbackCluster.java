package org.skerry.spark.cluster;

import java.io.File;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Collectors;

import org.apache.spark.launcher.JavaModuleOptions;

/**
 * A Spark standalone cluster on loopback addresses for integration tests: a master on 127.0.0.1
 * and worker {@code k} (1-based) on {@code 127.0.0.(k+1)}, each a separate JVM started from this
 * JVM's class path, so it works in Maven's {@code test} phase before any jar is packaged.
 *
 * <p>Each worker gets its own address because Spark keys shuffle output by host: with every worker
 * on one address, losing one worker would discard the output of all of them. Ports are chosen
 * free at start, the master's REST server is off, and everything a process writes (logs, work
 * folders, temporary files) stays under the folder given to {@link #start(Path, int)}.
 *
 * <p>{@link #close()} stops every process, executors included, also after a failed start:
 * <pre>{@code
 * try (LoopbackCluster cluster = LoopbackCluster.start(tempDir, 2)) {
 *     SparkConf conf = new SparkConf().setMaster(cluster.masterUrl()) ...
 * }
 * }</pre>
 */
public final class LoopbackCluster implements AutoCloseable {

    /** How long {@link #start(Path, int)} waits for the master to count every worker alive. */
    public static final Duration DEFAULT_START_TIMEOUT = Duration.ofSeconds(90);

    /** Heap of the master and worker daemons (Spark refuses much less than 450 MiB). */
    private static final String DAEMON_HEAP = "-Xmx512m";

    /** How long a process gets to exit after TERM, and after KILL. */
    private static final Duration TERM_GRACE = Duration.ofSeconds(15);
    private static final Duration KILL_GRACE = Duration.ofSeconds(10);

    private static final Pattern ALIVE_WORKERS = Pattern.compile("\"aliveworkers\"\\s*:\\s*(\\d+)");

    private final Path dir;
    private final int masterPort;
    private final int masterUiPort;
    private final HttpClient http = HttpClient.newBuilder()
            .connectTimeout(Duration.ofSeconds(2)).build();
    private final int workers;
    /** The processes started so far, master first, then workers 1..n; names alike. */
    private final List<Process> daemons = new ArrayList<>();
    private final List<String> names = new ArrayList<>();
    private boolean closed;

    private LoopbackCluster(Path dir, int workers, int masterPort, int masterUiPort) {
        this.dir = dir;
        this.workers = workers;
        this.masterPort = masterPort;
        this.masterUiPort = masterUiPort;
    }

    /**
     * Starts a master and {@code workers} workers (1 core, 1 GiB each) and waits up to
     * {@link #DEFAULT_START_TIMEOUT} until the master counts them all alive.
     *
     * @param dir an empty or new folder that will hold logs, work folders and temporary files
     * @param workers how many workers, 1 to 50
     * @return the running cluster; close it
     * @throws IOException when a process cannot be started
     * @throws IllegalStateException when a process exits during start or the cluster is not ready
     *         in time; the message names the process and quotes the end of its log
     */
    public static LoopbackCluster start(Path dir, int workers) throws IOException {
        return start(dir, workers, DEFAULT_START_TIMEOUT);
    }

    /**
     * Starts a cluster as {@link #start(Path, int)} does, waiting at most {@code timeout}.
     *
     * @param dir an empty or new folder that will hold logs, work folders and temporary files
     * @param workers how many workers, 1 to 50
     * @param timeout how long to wait for every worker to register
     * @return the running cluster; close it
     * @throws IOException when a process cannot be started
     */
    public static LoopbackCluster start(Path dir, int workers, Duration timeout) throws IOException {
        return start(dir, workers, timeout, k -> Map.of());
    }

    /**
     * Starts a cluster as {@link #start(Path, int, Duration)} does, worker {@code k} (1 to
     * {@code workers}) with {@code workerEnvironment.apply(k)} added to its environment, which its
     * executors inherit (a per-worker PATH, for instance).
     */
    public static LoopbackCluster start(Path dir, int workers, Duration timeout,
            java.util.function.IntFunction<Map<String, String>> workerEnvironment) throws IOException {
        Objects.requireNonNull(dir, "dir");
        Objects.requireNonNull(workerEnvironment, "workerEnvironment");
        Objects.requireNonNull(timeout, "timeout");
        if (workers < 1 || workers > 50) {
            throw new IllegalArgumentException("workers must be 1 to 50, not " + workers);
        }
        Path root = dir.toAbsolutePath();
        for (String sub : List.of("logs", "tmp", "work")) {
            Files.createDirectories(root.resolve(sub));
        }
        Path sparkHome = linkClassPathJars(root.resolve("spark-home"));

        LoopbackCluster cluster = new LoopbackCluster(root, workers, freePort("127.0.0.1"),
                freePort("127.0.0.1"));
        try {
            cluster.launch("master", "127.0.0.1", sparkHome, Map.of(), List.of(
                    "-Dspark.master.rest.enabled=false",
                    "org.apache.spark.deploy.master.Master",
                    "--host", "127.0.0.1",
                    "--port", Integer.toString(cluster.masterPort),
                    "--webui-port", Integer.toString(cluster.masterUiPort)));
            for (int k = 1; k <= workers; k++) {
                String host = workerHost(k);
                Path work = Files.createDirectories(root.resolve("work").resolve("worker-" + k));
                cluster.launch("worker-" + k, host, sparkHome, workerEnvironment.apply(k), List.of(
                        "org.apache.spark.deploy.worker.Worker",
                        "--host", host,
                        "--cores", "1",
                        "--memory", "1g",
                        "--webui-port", Integer.toString(freePort(host)),
                        "--work-dir", work.toString(),
                        cluster.masterUrl()));
            }
            cluster.awaitAlive(workers, timeout, true);
            return cluster;
        } catch (IOException | RuntimeException e) {
            try {
                cluster.close();
            } catch (RuntimeException stopFailure) {
                e.addSuppressed(stopFailure);
            }
            throw e;
        }
    }

    /** @return the address drivers connect to, {@code spark://127.0.0.1:PORT} */
    public String masterUrl() {
        return "spark://127.0.0.1:" + masterPort;
    }

    /** @return the master's web UI, whose {@code /json/} page lists the workers */
    public URI masterUi() {
        return URI.create("http://127.0.0.1:" + masterUiPort + "/");
    }

    /** @return how many workers the cluster was started with (alive or not) */
    public int workers() {
        return workers;
    }

    /**
     * @param k a worker number, 1-based
     * @return the loopback address worker {@code k} and its executors use, {@code 127.0.0.(k+1)}
     */
    public static String workerHost(int k) {
        return "127.0.0." + (k + 1);
    }

    /**
     * @param name {@code master} or {@code worker-K}
     * @return the file holding that process's standard output and error
     */
    public Path logFile(String name) {
        return dir.resolve("logs").resolve(name + ".log");
    }

    /**
     * @return every process of the cluster alive now: the daemons and their descendants
     *         (a worker's executors, and drivers it runs in cluster mode)
     */
    public List<ProcessHandle> processes() {
        List<ProcessHandle> all = new ArrayList<>();
        for (Process daemon : daemons) {
            if (daemon.isAlive()) {
                all.add(daemon.toHandle());
                daemon.descendants().forEach(all::add);
            }
        }
        return all;
    }

    /**
     * @param k a worker number, 1-based
     * @return the processes worker {@code k} launched that are alive now (its executors)
     */
    public List<ProcessHandle> executorsOf(int k) {
        return worker(k).descendants().collect(Collectors.toList());
    }

    /**
     * Kills worker {@code k} and its executors at once (SIGKILL, no shutdown hooks), as a machine
     * failure would, and waits until they have exited.
     *
     * @param k a worker number, 1-based
     * @throws IllegalStateException when a process is still alive after the wait
     */
    public void killWorker(int k) {
        Process worker = worker(k);
        // Collect the executors first: once the worker is gone they have no parent to find them by.
        List<ProcessHandle> tree = new ArrayList<>();
        tree.add(worker.toHandle());
        worker.descendants().forEach(tree::add);
        tree.forEach(ProcessHandle::destroyForcibly);
        List<ProcessHandle> left = awaitExit(tree, KILL_GRACE);
        if (!left.isEmpty()) {
            throw new IllegalStateException("worker-" + k + " processes still alive " + KILL_GRACE.toSeconds()
                    + " s after SIGKILL: " + pids(left));
        }
    }

    /**
     * Waits until the master counts exactly {@code expected} alive workers, e.g. after
     * {@link #killWorker(int)}; fails fast if the master exits meanwhile.
     *
     * @param expected the number of alive workers to wait for
     * @param timeout how long to wait
     * @throws IllegalStateException when the count is not reached in time or the master exited
     */
    public void awaitAliveWorkers(int expected, Duration timeout) {
        awaitAlive(expected, timeout, false);
    }

    // --- starting --------------------------------------------------------------------------------

    /**
     * Polls the master until it counts {@code expected} alive workers. The master must stay up;
     * with {@code allDaemons} (during start) every worker too, since one that exits will not
     * come back.
     */
    private void awaitAlive(int expected, Duration timeout, boolean allDaemons) {
        long deadline = System.nanoTime() + timeout.toNanos();
        String last = "no answer";
        while (true) {
            OptionalCount count = aliveWorkers();
            if (count.value == expected) {
                return;
            }
            last = count.describe();
            for (int i = 0; i < (allDaemons ? daemons.size() : 1); i++) {
                Process daemon = daemons.get(i);
                if (!daemon.isAlive()) {
                    throw new IllegalStateException(names.get(i) + " exited with status " + daemon.exitValue()
                            + " while waiting for " + expected + " alive workers\n" + logTail(names.get(i)));
                }
            }
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("the master at " + masterUrl() + " did not count " + expected
                        + " alive workers within " + timeout.toSeconds() + " s (last answer: " + last + ")\n"
                        + logTail("master"));
            }
            try {
                Thread.sleep(200); // polling interval of the readiness check, not a wait for an event
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for the cluster", e);
            }
        }
    }

    /**
     * Stops the workers, then the master, with their descendants: TERM, then KILL for what is still
     * alive after 15 s. Safe to call more than once and after a failed
     * start.
     *
     * @throws IllegalStateException when a process survives KILL
     */
    @Override
    public void close() {
        if (closed) {
            return;
        }
        closed = true;
        List<ProcessHandle> tree = new ArrayList<>();
        // Workers before the master, so they do not spend the grace period reconnecting.
        for (int i = daemons.size() - 1; i >= 0; i--) {
            Process daemon = daemons.get(i);
            tree.add(daemon.toHandle());
            daemon.descendants().forEach(tree::add);
        }
        tree.forEach(ProcessHandle::destroy);
        List<ProcessHandle> left = awaitExit(tree, TERM_GRACE);
        left.forEach(ProcessHandle::destroyForcibly);
        left = awaitExit(left, KILL_GRACE);
        if (!left.isEmpty()) {
            throw new IllegalStateException("cluster processes still alive after SIGKILL: " + pids(left));
        }
        removeJarLinks();
    }

    /** Removes the links to Maven's jars, so a temporary-folder cleanup has nothing outside to warn about. */
    private void removeJarLinks() {
        Path jars = dir.resolve("spark-home").resolve("jars");
        if (!Files.isDirectory(jars)) {
            return;
        }
        try (java.util.stream.Stream<Path> links = Files.list(jars)) {
            links.filter(Files::isSymbolicLink).forEach(link -> link.toFile().delete());
        } catch (IOException e) {
            // the links are harmless; the temporary folder's cleanup deals with them
        }
    }

    private void launch(String name, String host, Path sparkHome, Map<String, String> added, List<String> mainAndArgs)
            throws IOException {
        List<String> command = new ArrayList<>();
        command.add(Paths.get(System.getProperty("java.home"), "bin", "java").toString());
        command.add(DAEMON_HEAP);
        command.addAll(List.of(JavaModuleOptions.defaultModuleOptionArray()));
        Path tmp = dir.resolve("tmp");
        command.add("-Djava.io.tmpdir=" + tmp);
        command.add("-Dspark.local.dir=" + tmp);
        // A port taken between choosing and binding must fail the start, not move silently.
        command.add("-Dspark.port.maxRetries=0");
        // Marks the process as this cluster's, for people reading ps and for leak checks.
        command.add("-Dskerry.loopback.dir=" + dir);
        command.add("-cp");
        command.add(System.getProperty("java.class.path"));
        command.addAll(mainAndArgs);

        ProcessBuilder builder = new ProcessBuilder(command)
                .directory(dir.toFile())
                .redirectErrorStream(true)
                .redirectOutput(logFile(name).toFile())
                .redirectInput(ProcessBuilder.Redirect.from(new File("/dev/null")));
        Map<String, String> env = builder.environment();
        env.keySet().removeIf(key -> key.startsWith("SPARK_"));
        // Workers launch executors from SPARK_HOME/jars; without SPARK_SCALA_VERSION the executor
        // launcher looks for a source build. A worker passes its environment on to its executors,
        // so JAVA_TOOL_OPTIONS puts their temporary files under dir as well.
        env.put("SPARK_HOME", sparkHome.toString());
        env.put("SPARK_SCALA_VERSION", "2.13");
        env.put("SPARK_LOCAL_IP", host);
        env.put("SPARK_LOCAL_DIRS", tmp.toString());
        env.put("JAVA_TOOL_OPTIONS", "-Djava.io.tmpdir=" + tmp);
        env.putAll(added);
        daemons.add(builder.start());
        names.add(name);
    }

    /**
     * Makes {@code home/jars} hold a link to every jar on this JVM's class path: the folder a
     * worker builds its executors' class path from.
     */
    private static Path linkClassPathJars(Path home) throws IOException {
        Path jars = Files.createDirectories(home.resolve("jars"));
        Set<String> taken = new HashSet<>();
        for (String entry : System.getProperty("java.class.path").split(File.pathSeparator)) {
            Path jar = Paths.get(entry).toAbsolutePath();
            if (!entry.endsWith(".jar") || !Files.isRegularFile(jar)) {
                continue; // class folders travel to executors in the application jar (spark.jars)
            }
            String name = jar.getFileName().toString();
            for (int n = 2; !taken.add(name); n++) {
                name = n + "-" + jar.getFileName();
            }
            Path link = jars.resolve(name);
            Files.deleteIfExists(link);
            Files.createSymbolicLink(link, jar);
        }
        if (taken.stream().noneMatch(name -> name.startsWith("spark-core_"))) {
            throw new IllegalStateException("no spark-core jar on this JVM's class path: "
                    + System.getProperty("java.class.path"));
        }
        return home;
    }

    private static int freePort(String host) throws IOException {
        try (ServerSocket socket = new ServerSocket()) {
            socket.bind(new InetSocketAddress(InetAddress.getByName(host), 0));
            return socket.getLocalPort();
        }
    }

    // --- watching --------------------------------------------------------------------------------

    /** The master's alive-worker count, or -1 with the reason when it cannot be read. */
    private static final class OptionalCount {
        final int value;
        final String reason;

        OptionalCount(int value, String reason) {
            this.value = value;
            this.reason = reason;
        }

        String describe() {
            return value >= 0 ? value + " alive workers" : reason;
        }
    }

    private OptionalCount aliveWorkers() {
        HttpRequest request = HttpRequest.newBuilder(masterUi().resolve("/json/"))
                .timeout(Duration.ofSeconds(2)).GET().build();
        try {
            HttpResponse<String> response = http.send(request, HttpResponse.BodyHandlers.ofString());
            if (response.statusCode() != 200) {
                return new OptionalCount(-1, "HTTP status " + response.statusCode());
            }
            Matcher m = ALIVE_WORKERS.matcher(response.body());
            return m.find() ? new OptionalCount(Integer.parseInt(m.group(1)), null)
                    : new OptionalCount(-1, "no aliveworkers in the master's JSON");
        } catch (IOException e) {
            return new OptionalCount(-1, e.toString());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while asking the master for its workers", e);
        }
    }

    private Process worker(int k) {
        if (k < 1 || k > workers()) {
            throw new IllegalArgumentException("no worker " + k + "; workers are 1 to " + workers());
        }
        if (k >= daemons.size()) {
            throw new IllegalStateException("worker-" + k + " was never started");
        }
        return daemons.get(k);
    }

    /** Waits up to {@code grace} for every process to exit; returns those still alive. */
    private static List<ProcessHandle> awaitExit(List<ProcessHandle> processes, Duration grace) {
        long deadline = System.nanoTime() + grace.toNanos();
        for (ProcessHandle process : processes) {
            CompletableFuture<ProcessHandle> exit = process.onExit();
            long left = deadline - System.nanoTime();
            try {
                exit.get(Math.max(left, 0), TimeUnit.NANOSECONDS);
            } catch (TimeoutException stillAlive) {
                // reported below
            } catch (ExecutionException e) {
                throw new IllegalStateException("could not wait for process " + process.pid(), e);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while stopping the cluster", e);
            }
        }
        return processes.stream().filter(ProcessHandle::isAlive).collect(Collectors.toList());
    }

    private static String pids(List<ProcessHandle> processes) {
        return processes.stream().map(p -> Long.toString(p.pid())).collect(Collectors.joining(", "));
    }

    private String logTail(String name) {
        Path log = logFile(name);
        try {
            List<String> lines = Files.readAllLines(log).stream()
                    .filter(line -> !line.startsWith("WARNING")) // JVM notices, not Spark's
                    .collect(Collectors.toList());
            return "--- last lines of " + log + " ---\n"
                    + String.join("\n", lines.subList(Math.max(0, lines.size() - 15), lines.size()));
        } catch (IOException | UncheckedIOException e) {
            return "(could not read " + log + ": " + e + ")";
        }
    }

    /**
     * The full command line of a process, read from {@code /proc} because
     * {@link ProcessHandle.Info} cuts it at 4096 characters on Linux or leaves it out, and a
     * Spark daemon's class path alone is longer.
     *
     * @param process any process
     * @return its arguments, the program first; empty once it has exited or where {@code /proc}
     *         cannot be read
     */
    public static List<String> commandLine(ProcessHandle process) {
        try {
            String raw = Files.readString(Paths.get("/proc", Long.toString(process.pid()), "cmdline"));
            return raw.isEmpty() ? List.of() : List.of(raw.split("\0"));
        } catch (IOException | UncheckedIOException e) {
            return List.of();
        }
    }

    @Override
    public String toString() {
        return "LoopbackCluster[" + masterUrl() + ", " + workers() + " workers, " + dir + "]";
    }
}
