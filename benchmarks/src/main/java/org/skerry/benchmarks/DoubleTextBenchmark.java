package org.skerry.benchmarks;

import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.infra.Blackhole;
import org.skerry.cli.output.DoubleText;

/**
 * Nanoseconds per number written: {@link DoubleText#format} (Schubfach digits, exact path for the
 * rare cases) beside {@link DoubleText#formatExact} (the BigDecimal path it replaces), in one run,
 * over 10<sup>5</sup> values. "particles" are draws like a posterior sample (gaussian, a few
 * binades); "bitPatterns" are random finite bit patterns (extreme exponents, the slowest for
 * BigDecimal); "weights" are log-weights and probabilities in (0, 1).
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@State(Scope.Thread)
public class DoubleTextBenchmark {

    private static final int SIZE = 100_000;

    @Param({"particles", "bitPatterns", "weights"})
    public String data;

    private double[] values;

    @Setup
    public void setUp() {
        SplittableRandom random = new SplittableRandom(1946L);
        values = new double[SIZE];
        for (int i = 0; i < SIZE; i++) {
            double x;
            switch (data) {
                case "bitPatterns":
                    do {
                        x = Double.longBitsToDouble(random.nextLong());
                    } while (!Double.isFinite(x));
                    break;
                case "weights":
                    x = i % 2 == 0 ? -50.0 + 20.0 * random.nextGaussian() : random.nextDouble();
                    break;
                default:
                    x = 3.0 + 0.7 * random.nextGaussian();
            }
            values[i] = x;
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void fast(Blackhole sink) {
        for (double value : values) {
            sink.consume(DoubleText.format(value));
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void exact(Blackhole sink) {
        for (double value : values) {
            sink.consume(DoubleText.formatExact(value));
        }
    }
}
