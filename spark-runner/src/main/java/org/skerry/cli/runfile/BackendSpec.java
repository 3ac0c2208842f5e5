package org.skerry.cli.runfile;

import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValue;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Properties;
import org.skerry.engine.settings.SettingsReader;

/**
 * Where a run's particles live: the thread pool or Spark, and how either is set up. None of it can
 * change the answer ({@code backend.} is among {@link AnswerSettings}' neutral keys).
 *
 * @param kind                  "spark" or "threads"
 * @param master                the Spark master
 * @param connectTimeoutSeconds how long to wait for a cluster's master to answer
 * @param partitions            partitions for the Spark backend; 0 for automatic
 * @param sparkSettings         extra {@code spark.*} settings, in the order written
 * @param jars                  extra jars for the executors
 * @param threads               the thread pool's threads; 0 for one per processor
 * @param blockSize             particles per block of the thread pool; 0 lets the backend choose
 * @param tasks                 Spark: "per-executor" (a task works through a group of blocks on its
 *                              executor's cores) or "per-block" (a task per block)
 * @param taskGroups            Spark, per executor: tasks per step; 0 for one per executor
 * @param launcherCores         Spark: cores per task from the settings the launcher gave this JVM
 *                              (spark-submit's {@code --executor-cores} or {@code --conf}, as system
 *                              properties), used where the run file sets none; 0 when none
 */
public record BackendSpec(String kind, String master, int connectTimeoutSeconds, int partitions,
        Map<String, String> sparkSettings, List<String> jars, int threads, int blockSize, String tasks,
        int taskGroups, int launcherCores) {

    /** The Spark setting that gives each task its cores. */
    public static final String TASK_CPUS = "spark.task.cpus";
    /** The Spark setting that gives each executor its cores. */
    public static final String EXECUTOR_CORES = "spark.executor.cores";

    public BackendSpec {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(master, "master");
        Objects.requireNonNull(tasks, "tasks");
        sparkSettings = Collections.unmodifiableMap(new LinkedHashMap<>(
                Objects.requireNonNull(sparkSettings, "sparkSettings")));
        jars = List.copyOf(jars);
    }

    /**
     * Reads and checks the {@code backend} keys. Under spark-submit the executors' cores may come
     * from its command line rather than the run file; {@code auto} sees them there too.
     */
    static BackendSpec read(SettingsReader r) {
        return read(r, launcherCores(System.getProperties()));
    }

    /**
     * Cores per task from Spark settings a launcher put in {@code properties}: spark-submit turns
     * {@code --executor-cores N} and {@code --conf spark.executor.cores=N} (and
     * {@code spark.task.cpus}) into system properties of the driver's JVM, from which
     * {@code new SparkConf()} reads them. {@code spark.task.cpus} first, as Spark itself gives it
     * precedence for a task; 0 when neither is a whole number from 1 (Spark reports a malformed
     * one when it starts).
     */
    static int launcherCores(Properties properties) {
        for (String key : List.of(TASK_CPUS, EXECUTOR_CORES)) {
            String value = properties.getProperty(key);
            if (value != null && value.trim().matches("[1-9]\\d{0,5}")) {
                return Integer.parseInt(value.trim());
            }
        }
        return 0;
    }

    /** {@link #read(SettingsReader)} with the launcher's cores given. */
    static BackendSpec read(SettingsReader r, int launcherCores) {
        String kind = r.choice("backend.kind", List.of("spark", "threads"));
        String master = r.text("backend.master");
        if (master == null || !SparkMasters.isValid(master)) {
            throw r.error("backend.master", "not a Spark master; use " + SparkMasters.FORMS);
        }
        int partitions = r.integer("backend.partitions", 0, 1_000_000);
        Map<String, String> sparkSettings = new LinkedHashMap<>();
        for (Map.Entry<String, ConfigValue> entry : r.object("backend.spark").entrySet()) {
            String key = "backend.spark." + entry.getKey();
            if (!entry.getKey().startsWith("\"spark.") && !entry.getKey().startsWith("spark.")) {
                throw r.error(key, "Spark settings start with spark. (quote the key: \"spark.executor.memory\" = 2g)");
            }
            sparkSettings.put(entry.getKey().replace("\"", ""), String.valueOf(entry.getValue().unwrapped()));
        }
        List<String> jars;
        try {
            jars = List.copyOf(r.config().getStringList("backend.jars"));
        } catch (ConfigException.WrongType e) {
            throw r.error("backend.jars", "expected a list of jar paths");
        }
        int connectTimeoutSeconds = r.integer("backend.connect-timeout-seconds", 1, 3600);
        int threads = r.integer("backend.threads", 0, 4096);
        int blockSize = r.integer("backend.block-size", 0, Integer.MAX_VALUE);
        String tasks = r.choice("backend.tasks", List.of("auto", "per-executor", "per-block"));
        int taskGroups = r.integer("backend.task-groups", 0, 1_000_000);
        for (String key : List.of(TASK_CPUS, EXECUTOR_CORES)) {
            String value = sparkSettings.get(key);
            if (value != null && !value.trim().matches("[1-9]\\d{0,5}")) {
                throw r.error("backend.spark.\"" + key + "\"", "a number of cores (a whole number from 1), was "
                        + value);
            }
        }
        boolean coresKnown = SparkMasters.coresPerExecutor(master) > 0 || sparkSettings.containsKey(EXECUTOR_CORES)
                || sparkSettings.containsKey(TASK_CPUS) || launcherCores > 0;
        if (tasks.equals("per-executor") && !coresKnown) {
            throw r.error("backend.tasks", "per-executor tasks on " + master + " need the executors' cores: set "
                    + "backend.spark { \"" + EXECUTOR_CORES + "\" = N } (or \"" + TASK_CPUS + "\"; or spark-submit's "
                + "--executor-cores N), or use per-block");
        }
        if (tasks.equals("auto")) {
            tasks = coresKnown ? "per-executor" : "per-block";
        }
        return new BackendSpec(kind, master, connectTimeoutSeconds, partitions, sparkSettings, jars, threads, blockSize,
                tasks, taskGroups, launcherCores);
    }

    /** Whether a Spark task works through a group of blocks on its executor's cores. */
    public boolean perExecutor() {
        return tasks.equals("per-executor");
    }

    /**
     * The cores a per-executor task takes ({@code spark.task.cpus}): the run file's own setting,
     * else the executors' cores from {@code spark.executor.cores}, else the master's (a local
     * master's own cores, which Spark's executor settings do not change), else the launcher's.
     */
    public int taskCores() {
        String set = sparkSettings.getOrDefault(TASK_CPUS, sparkSettings.get(EXECUTOR_CORES));
        if (set != null) {
            return Integer.parseInt(set.trim()); // checked when the run file was read
        }
        int masterCores = SparkMasters.coresPerExecutor(master);
        return masterCores > 0 ? masterCores : Math.max(1, launcherCores);
    }
}
