package org.skerry.benchmarks;

import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.temper.FixedSchedule;

/**
 * Base of the JMH benchmarks that run Spark: their forks get Spark's Java 17 module options (the
 * pom's {@code spark.module.options}; {@link LocalSpark#requireModuleOptions()} fails a run whose
 * JVM lacks any of them, so this list cannot drift from the pom unnoticed) and a fixed heap, so
 * runs on different machines hold the same amount of cached data in memory. It also holds the
 * parameters the Spark benchmarks share.
 */
@Fork(value = 1, jvmArgsAppend = {
        "-Xmx6g",
        "-XX:+IgnoreUnrecognizedVMOptions",
        "--add-modules=jdk.incubator.vector",
        "--add-opens=java.base/java.lang=ALL-UNNAMED",
        "--add-opens=java.base/java.lang.invoke=ALL-UNNAMED",
        "--add-opens=java.base/java.lang.reflect=ALL-UNNAMED",
        "--add-opens=java.base/java.io=ALL-UNNAMED",
        "--add-opens=java.base/java.net=ALL-UNNAMED",
        "--add-opens=java.base/java.nio=ALL-UNNAMED",
        "--add-opens=java.base/java.util=ALL-UNNAMED",
        "--add-opens=java.base/java.util.concurrent=ALL-UNNAMED",
        "--add-opens=java.base/java.util.concurrent.atomic=ALL-UNNAMED",
        "--add-opens=java.base/jdk.internal.ref=ALL-UNNAMED",
        "--add-opens=java.base/sun.nio.ch=ALL-UNNAMED",
        "--add-opens=java.base/sun.nio.cs=ALL-UNNAMED",
        "--add-opens=java.base/sun.security.action=ALL-UNNAMED",
        "--add-opens=java.base/sun.util.calendar=ALL-UNNAMED",
        "--add-opens=java.security.jgss/sun.security.krb5=ALL-UNNAMED",
        "-Dio.netty.tryReflectionSetAccessible=true",
        "-Dio.netty.allocator.type=pooled",
        "-Dio.netty.handler.ssl.defaultEndpointVerificationAlgorithm=NONE",
        "--sun-misc-unsafe-memory-access=allow",
        "--enable-native-access=ALL-UNNAMED"})
@State(Scope.Benchmark)
public abstract class SparkForkedBenchmark {

    @Param("4000")
    public int particles;

    @Param("1000")
    public long costMicros;

    @Param("2")
    public int threads;

    @Param("4")
    public int temperatures;

    @Param("2")
    public int steps;

    /** Spark partitions per population; 0 lets the backend choose (three per core). */
    @Param("0")
    public int partitions;

    /** Evaluations one run makes with these settings. */
    long evaluations() {
        return evaluations(particles, temperatures, steps);
    }

    /** A fixed schedule and fixed MH steps, so every run makes exactly {@link #evaluations()} evaluations. */
    SamplerSettings fixedSettings(int n) {
        return SamplerSettings.builder().particles(n).seed(11)
                .temperatureRule(FixedSchedule.power(temperatures, 3.0)).fixedSteps(steps).build();
    }


    /** Evaluations a run with a fixed schedule and fixed steps makes: N draws, then N per step and temperature. */
    static long evaluations(int particles, int temperatures, int steps) {
        return (long) particles * (1 + (long) temperatures * steps);
    }
}
