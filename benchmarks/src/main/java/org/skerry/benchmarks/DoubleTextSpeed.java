package org.skerry.benchmarks;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.skerry.cli.output.DoubleText;

/**
 * Paired speed ratio of {@link DoubleText#formatExact} to {@link DoubleText#format} on a shared,
 * noisy machine: in each round both write the same 10<sup>5</sup> values one after the other (the
 * order alternating), so a burst of load from other work hits one round rather than one variant;
 * prints each data kind's median, min and max of the per-round ratios, and ns per number. The data
 * kinds are those of {@link DoubleTextBenchmark}.
 *
 * <p>Usage: {@code java -cp benchmarks/target/benchmarks.jar org.skerry.benchmarks.DoubleTextSpeed [rounds]}
 * (default 30, after 10 warm-up rounds).
 */
public final class DoubleTextSpeed {

    private static final int SIZE = 100_000;
    private static volatile long sink;

    private DoubleTextSpeed() {
    }

    public static void main(String[] args) {
        int rounds = args.length > 0 ? Integer.parseInt(args[0]) : 30;
        for (String kind : new String[] {"particles", "bitPatterns", "weights"}) {
            double[] values = values(kind);
            double[] ratios = new double[rounds];
            double[] fast = new double[rounds];
            double[] exact = new double[rounds];
            for (int round = -10; round < rounds; round++) {
                long a;
                long b;
                if ((round & 1) == 0) {
                    a = time(values, true);
                    b = time(values, false);
                } else {
                    b = time(values, false);
                    a = time(values, true);
                }
                if (round >= 0) {
                    fast[round] = (double) a / SIZE;
                    exact[round] = (double) b / SIZE;
                    ratios[round] = (double) b / a;
                }
            }
            Arrays.sort(ratios);
            Arrays.sort(fast);
            Arrays.sort(exact);
            System.out.printf("%-12s exact/fast median %.1f (min %.1f, max %.1f) over %d rounds;"
                    + " ns per number: fast %.0f, exact %.0f (medians)%n", kind, ratios[rounds / 2], ratios[0],
                    ratios[rounds - 1], rounds, fast[rounds / 2], exact[rounds / 2]);
        }
    }

    private static long time(double[] values, boolean fast) {
        long start = System.nanoTime();
        long length = 0;
        for (double value : values) {
            length += (fast ? DoubleText.format(value) : DoubleText.formatExact(value)).length();
        }
        sink += length;
        return System.nanoTime() - start;
    }

    private static double[] values(String kind) {
        SplittableRandom random = new SplittableRandom(1946L);
        double[] values = new double[SIZE];
        for (int i = 0; i < SIZE; i++) {
            double x;
            switch (kind) {
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
        return values;
    }
}
