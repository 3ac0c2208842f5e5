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
import org.skerry.engine.math.ExactSum;

/**
 * Nanoseconds per added double for {@link ExactSum} beside a plain {@code double} loop, over
 * 10<sup>6</sup> values. Scores are per element thanks to {@link OperationsPerInvocation}.
 * "logWeights" mimics unnormalised log-weights (a few binades, mixed signs); "wideRange" spreads
 * exponents over ±300 binades, so the chunks touched jump about in memory.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@State(Scope.Thread)
public class ExactSumBenchmark {

    private static final int SIZE = 1_000_000;

    @Param({"logWeights", "wideRange"})
    public String data;

    private double[] values;
    private final ExactSum sum = new ExactSum();

    @Setup
    public void setUp() {
        SplittableRandom random = new SplittableRandom(20150519L);
        values = new double[SIZE];
        for (int i = 0; i < SIZE; i++) {
            double gaussian = random.nextGaussian();
            values[i] = "wideRange".equals(data)
                    ? gaussian * Math.scalb(1.0, random.nextInt(601) - 300)
                    : -50.0 + 20.0 * gaussian;
        }
    }

    /** The naive, order-dependent sum: the floor to compare against. */
    @Benchmark
    @OperationsPerInvocation(SIZE)
    public double plainLoop() {
        double total = 0.0;
        for (double value : values) {
            total += value;
        }
        return total;
    }

    /** One {@link ExactSum#add(double)} call per element. */
    @Benchmark
    @OperationsPerInvocation(SIZE)
    public double exactSumAddEach() {
        sum.reset();
        for (double value : values) {
            sum.add(value);
        }
        return sum.doubleValue();
    }

    /** The array form {@link ExactSum#add(double[], int, int)}. */
    @Benchmark
    @OperationsPerInvocation(SIZE)
    public double exactSumAddArray() {
        sum.reset();
        sum.add(values, 0, SIZE);
        return sum.doubleValue();
    }
}
