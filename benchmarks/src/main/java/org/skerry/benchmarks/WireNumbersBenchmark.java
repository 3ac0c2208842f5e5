package org.skerry.benchmarks;

import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.infra.Blackhole;
import org.skerry.cli.output.DoubleText;
import org.skerry.engine.program.WireNumbers;

/**
 * Nanoseconds per number for the two exact text forms a program model's protocol could use, on
 * skerry's side: writing parameter values (C99 hexadecimal with {@link Double#toHexString}, or
 * the shortest round-trip decimal of {@link DoubleText}, the form skerry's output files use) and
 * reading replies (our hexadecimal reader, {@link Double#parseDouble} on hexadecimal, and on
 * decimal). The values are log-likelihood-like and parameter-like doubles (normal, scaled over a
 * few binades). {@code Double.toString} is measured too, though it is not a candidate: its digits
 * changed in JDK 19, and on JDK 17 they are not always the shortest. Python's side is measured
 * by {@code benchmarks/wire-numbers.py}.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.NANOSECONDS)
@State(Scope.Thread)
public class WireNumbersBenchmark {

    private static final int SIZE = 4096;

    private double[] values;
    private String[] hex;
    private String[] decimal;
    private final StringBuilder out = new StringBuilder(64);

    @Setup
    public void setUp() {
        SplittableRandom random = new SplittableRandom(14);
        values = new double[SIZE];
        hex = new String[SIZE];
        decimal = new String[SIZE];
        for (int i = 0; i < SIZE; i++) {
            values[i] = random.nextGaussian() * Math.pow(10, random.nextInt(-3, 4));
            hex[i] = Double.toHexString(values[i]);
            decimal[i] = DoubleText.format(values[i]);
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void writeHex(Blackhole sink) {
        for (double x : values) {
            out.setLength(0);
            sink.consume(WireNumbers.appendHex(out, x).length());
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void writeShortestDecimal(Blackhole sink) {
        for (double x : values) {
            sink.consume(DoubleText.format(x));
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void writeJdkToString(Blackhole sink) {
        for (double x : values) {
            out.setLength(0);
            sink.consume(out.append(x).length());
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void readHex(Blackhole sink) {
        for (String text : hex) {
            sink.consume(WireNumbers.parse(text));
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void readHexWithParseDouble(Blackhole sink) {
        for (String text : hex) {
            sink.consume(Double.parseDouble(text));
        }
    }

    @Benchmark
    @OperationsPerInvocation(SIZE)
    public void readDecimal(Blackhole sink) {
        for (String text : decimal) {
            sink.consume(WireNumbers.parse(text));
        }
    }
}
