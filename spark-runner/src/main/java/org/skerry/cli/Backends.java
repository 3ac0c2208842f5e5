package org.skerry.cli;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;
import java.util.stream.Stream;
import org.skerry.cli.runfile.BackendSpec;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.cli.runfile.SparkMasters;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.spark.SparkBackend;
import org.skerry.spark.TaskGrouping;

/**
 * Opens the backend a run file asks for: a thread pool, or a Spark context (local mode, a
 * standalone master, or whatever master Spark accepts). For a {@code spark://} master the
 * address is tried first with a bounded timeout, so an unreachable master is reported at once
 * instead of after Spark's own registration retries.
 */
public final class Backends {

    private Backends() {
    }

    /** An open backend and the scratch folder it writes into (removed on close). */
    public static final class Opened implements AutoCloseable {
        final PopulationBackend backend;
        private final Path scratch;

        Opened(PopulationBackend backend, Path scratch) {
            this.backend = backend;
            this.scratch = scratch;
        }

        /** The open backend. */
        public PopulationBackend backend() {
            return backend;
        }

        @Override
        public void close() {
            try {
                backend.close();
            } finally {
                deleteQuietly(scratch);
            }
        }
    }

    static Opened open(RunSpec spec, Path runFolder) {
        return open(spec, runFolder, Map.of());
    }

    /**
     * Opens the backend of {@code spec} with Spark's scratch folder under {@code runFolder};
     * {@code sparkDefaults} go under the run file's own {@code backend.spark} settings (a batch
     * adds its fair scheduler here).
     */
    public static Opened open(RunSpec spec, Path runFolder, Map<String, String> sparkDefaults) {
        BackendSpec backend = spec.backend();
        if (backend.kind().equals("threads")) {
            int threads = backend.threads() == 0 ? Runtime.getRuntime().availableProcessors() : backend.threads();
            return new Opened(new ThreadPoolBackend(threads, backend.blockSize()), null);
        }
        String master = backend.master();
        if (master.startsWith("spark://")) {
            checkReachable(master, backend.connectTimeoutSeconds());
        }
        Path scratch = runFolder.resolve(".spark-scratch");
        Map<String, String> settings = new LinkedHashMap<>();
        settings.put("spark.local.dir", scratch.toAbsolutePath().toString());
        List<String> jars = new ArrayList<>(shippedJars());
        jars.addAll(backend.jars());
        if (SparkMasters.isInProcess(master)) {
            // Everything stays in this process: bind to loopback rather than the first interface.
            settings.put("spark.driver.host", "127.0.0.1");
            settings.put("spark.driver.bindAddress", "127.0.0.1");
        } else {
            settings.put("spark.jars", String.join(",", jars));
            SparkSecret.addTo(settings, System.getenv(), Boolean.parseBoolean(System.getProperty("spark.authenticate")),
                    System.getProperty("spark.authenticate.secret") != null);
        }
        settings.putAll(sparkDefaults);
        if (backend.perExecutor()) {
            // One task per executor: it takes all the executor's cores and spreads them over its blocks.
            settings.put(BackendSpec.TASK_CPUS, String.valueOf(backend.taskCores()));
        }
        settings.putAll(backend.sparkSettings());
        TaskGrouping grouping = backend.perExecutor() ? TaskGrouping.perExecutor(backend.taskGroups())
                : TaskGrouping.perBlock();
        try {
            Files.createDirectories(scratch);
            Supplier<SparkBackend> start = () -> SparkBackend.start(master, "skerry " + spec.name(), backend.partitions(),
                    grouping, settings);
            return new Opened(master.startsWith("local") ? withoutLoopbackWarning(start) : start.get(), scratch);
        } catch (IOException e) {
            throw new RunFileException("cannot create Spark's scratch folder " + scratch + ": " + e, e);
        } catch (Exception e) {
            // SparkException is a checked exception Scala throws unchecked: catch it here too.
            deleteQuietly(scratch);
            throw new RunFileException("cannot start Spark with master " + master + ": " + e.getMessage(), e);
        }
    }

    /** The logger of Spark's note that the host name resolves to a loopback address. */
    static final String SPARK_UTILS_LOGGER = "org.apache.spark.util.Utils";

    /**
     * Starts a local-mode context without Spark's two warnings that this machine's host name
     * resolves to a loopback address ("Your hostname, … resolves to a loopback address …; Set
     * SPARK_LOCAL_IP …"). They matter when executors on other machines must reach the driver; in
     * local mode everything stays in this process, bound to 127.0.0.1, yet Spark prints them on
     * every run on such a machine. The logger is raised to ERROR while the context starts (when
     * Spark looks the address up, once per JVM) and put back afterwards; on a cluster the
     * warnings still show.
     */
    static <T> T withoutLoopbackWarning(Supplier<T> start) {
        org.apache.logging.log4j.Level before;
        try {
            before = org.apache.logging.log4j.LogManager.getLogger(SPARK_UTILS_LOGGER).getLevel();
            org.apache.logging.log4j.core.config.Configurator.setLevel(SPARK_UTILS_LOGGER,
                    org.apache.logging.log4j.Level.ERROR);
        } catch (RuntimeException | LinkageError e) {
            return start.get(); // another logging back end: leave it as it is
        }
        try {
            return start.get();
        } finally {
            org.apache.logging.log4j.core.config.Configurator.setLevel(SPARK_UTILS_LOGGER, before);
        }
    }

    /**
     * Classes that executors load, one from each jar they need besides Spark's: the Spark
     * backend's (its block steps' plumbing), the checkpoint module's (block stores), the engine,
     * and the engine's libraries (Commons Math for priors and models, Typesafe Config for
     * rebuilding a model from its settings). Never this program's own jar: executors run no
     * command-line code. A jar is found through a class it holds, so its file name does not matter.
     */
    private static final List<Class<?>> EXECUTOR_CLASSES = List.of(SparkBackend.class,
            org.skerry.checkpoint.HadoopBlockStore.class, org.skerry.engine.model.Model.class, org.apache.commons.math3.util.FastMath.class,
            com.typesafe.config.Config.class);

    /** The jars executors need besides Spark's, or none when this program runs from class folders (tests). */
    static List<String> shippedJars() {
        List<String> jars = new ArrayList<>();
        for (Class<?> type : EXECUTOR_CLASSES) {
            Path jar = jarOf(type);
            if (jar == null) {
                // Running from classes (tests): executors in local mode share this JVM.
                return List.of();
            }
            if (!jars.contains(jar.toString())) {
                jars.add(jar.toString());
            }
        }
        return jars;
    }

    /** The jar file {@code type} was loaded from, or null when it came from a folder or is unknown. */
    static Path jarOf(Class<?> type) {
        try {
            java.security.CodeSource source = type.getProtectionDomain().getCodeSource();
            if (source == null || source.getLocation() == null) {
                return null;
            }
            Path location = Path.of(source.getLocation().toURI());
            return Files.isRegularFile(location) ? location : null;
        } catch (java.net.URISyntaxException | RuntimeException e) {
            return null;
        }
    }

    private static void checkReachable(String master, int timeoutSeconds) {
        for (String hostPort : master.substring("spark://".length()).split(",")) {
            URI uri = URI.create("spark://" + hostPort);
            int port = uri.getPort() < 0 ? 7077 : uri.getPort();
            try (Socket socket = new Socket()) {
                socket.connect(new InetSocketAddress(uri.getHost(), port), timeoutSeconds * 1000);
                return;
            } catch (IOException | IllegalArgumentException e) {
                if (!master.contains(",")) {
                    throw new RunFileException("cannot reach the Spark master " + master + " within " + timeoutSeconds
                            + " s (" + e.getMessage() + "); is the cluster up? (deploy/loopback-cluster status; "
                            + "backend.connect-timeout-seconds sets the wait)");
                }
            }
        }
        throw new RunFileException("cannot reach any of the Spark masters " + master + " within " + timeoutSeconds + " s");
    }

    private static void deleteQuietly(Path folder) {
        if (folder == null || !Files.exists(folder)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(folder)) {
            paths.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        } catch (IOException e) {
            // leftovers in a hidden scratch folder are harmless
        }
    }
}
