package org.skerry.cli.runfile;

import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValue;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
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
 */
public record BackendSpec(String kind, String master, int connectTimeoutSeconds, int partitions,
        Map<String, String> sparkSettings, List<String> jars, int threads, int blockSize) {

    public BackendSpec {
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(master, "master");
        sparkSettings = Collections.unmodifiableMap(new LinkedHashMap<>(
                Objects.requireNonNull(sparkSettings, "sparkSettings")));
        jars = List.copyOf(jars);
    }

    /** Reads and checks the {@code backend} keys. */
    static BackendSpec read(SettingsReader r) {
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
        return new BackendSpec(kind, master, connectTimeoutSeconds, partitions, sparkSettings, jars, threads, blockSize);
    }
}
