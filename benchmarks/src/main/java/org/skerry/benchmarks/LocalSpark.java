package org.skerry.benchmarks;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.lang.management.ManagementFactory;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import org.skerry.spark.SparkBackend;

/**
 * Starting the Spark backend for a benchmark: loopback addresses only (the build machine has no
 * usable host name), and a check that this JVM got the module options Spark needs on Java 17 —
 * without them Spark fails deep inside Kryo or Netty, or, worse, half works.
 */
final class LocalSpark {

    private LocalSpark() {
    }

    /** The pom's {@code spark.module.options}, copied into the jar by Maven's resource filtering. */
    static List<String> moduleOptions() {
        Properties properties = new Properties();
        try (InputStream in = LocalSpark.class.getResourceAsStream("jvm.properties")) {
            if (in == null) {
                throw new IllegalStateException("jvm.properties missing: build with Maven");
            }
            properties.load(in);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return Arrays.asList(properties.getProperty("spark.module.options").trim().split("\\s+"));
    }

    /** Fails unless every module option is among this JVM's arguments. */
    static void requireModuleOptions() {
        List<String> missing = new ArrayList<>(moduleOptions());
        missing.removeAll(ManagementFactory.getRuntimeMXBean().getInputArguments());
        if (!missing.isEmpty()) {
            throw new IllegalStateException("this JVM lacks Spark's module options " + missing
                    + "; see SparkForkedBenchmark or benchmarks/RESULTS.md for the command line");
        }
    }

    /**
     * Settings for executors that are JVMs of their own: with {@code local-cluster[…]} or a
     * standalone master ({@code spark://…}) the executors get the module options and
     * {@code executorMemory}; on a standalone cluster they also need this jar and skerry's jars
     * from {@code lib/} beside it (the workers' class path holds only the runner's dependencies).
     */
    static Map<String, String> executorSettings(String master, String executorMemory) {
        Map<String, String> settings = new java.util.HashMap<>();
        if (master.startsWith("local-cluster") || master.startsWith("spark://")) {
            settings.put("spark.executor.memory", executorMemory);
            settings.put("spark.executor.extraJavaOptions", String.join(" ", moduleOptions()));
        }
        if (master.startsWith("spark://")) {
            settings.put("spark.jars", String.join(",", shippedJars()));
        }
        return settings;
    }

    /** This jar and the skerry jars in the {@code lib/} folder beside it. */
    private static List<String> shippedJars() {
        try {
            java.nio.file.Path jar = java.nio.file.Path.of(
                    LocalSpark.class.getProtectionDomain().getCodeSource().getLocation().toURI());
            if (!java.nio.file.Files.isRegularFile(jar)) {
                throw new IllegalStateException("a standalone cluster needs the benchmarks jar; run from "
                        + "benchmarks/target/benchmarks.jar, not from " + jar);
            }
            List<String> jars = new ArrayList<>(List.of(jar.toString()));
            try (java.util.stream.Stream<java.nio.file.Path> files = java.nio.file.Files.list(jar.getParent().resolve("lib"))) {
                files.filter(f -> f.getFileName().toString().startsWith("skerry-")).sorted()
                        .forEach(f -> jars.add(f.toString()));
            }
            return jars;
        } catch (java.net.URISyntaxException | IOException e) {
            throw new IllegalStateException("cannot find the jars to ship to the executors: " + e, e);
        }
    }

    /**
     * A Spark backend on {@code master}, after checking the JVM options. The driver binds to
     * {@code SPARK_LOCAL_IP} when set (a driver in a network namespace of its own, started by
     * {@code deploy/loopback-cluster exec}), to 127.0.0.1 otherwise; a secret file named by
     * {@code SKERRY_SPARK_SECRET_FILE} turns on authentication against a standalone master.
     */
    static SparkBackend start(String master, int partitions, Map<String, String> extra) {
        requireModuleOptions();
        String address = System.getenv("SPARK_LOCAL_IP");
        if (address == null || address.isBlank()) {
            address = "127.0.0.1";
        }
        Map<String, String> settings = new java.util.HashMap<>(Map.of(
                "spark.driver.host", address,
                "spark.driver.bindAddress", address));
        String secretFile = System.getenv("SKERRY_SPARK_SECRET_FILE");
        if (master.startsWith("spark://") && secretFile != null && !secretFile.isBlank()) {
            try {
                // In the settings, not on the command line, where every user could read it.
                settings.put("spark.authenticate", "true");
                settings.put("spark.authenticate.secret", java.nio.file.Files.readString(
                        java.nio.file.Path.of(secretFile)).strip());
            } catch (IOException e) {
                throw new UncheckedIOException("cannot read the secret file " + secretFile
                        + " named by SKERRY_SPARK_SECRET_FILE", e);
            }
        }
        settings.putAll(extra);
        return SparkBackend.start(master, "skerry-benchmark", partitions, settings);
    }
}
