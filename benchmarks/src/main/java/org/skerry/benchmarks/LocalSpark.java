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

    /** A Spark backend on {@code master}, driver bound to 127.0.0.1, after checking the JVM options. */
    static SparkBackend start(String master, int partitions, Map<String, String> extra) {
        requireModuleOptions();
        Map<String, String> settings = new java.util.HashMap<>(Map.of(
                "spark.driver.host", "127.0.0.1",
                "spark.driver.bindAddress", "127.0.0.1"));
        settings.putAll(extra);
        return SparkBackend.start(master, "skerry-benchmark", partitions, settings);
    }
}
