package org.skerry.benchmarks;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.random.RandomStream;

/**
 * A benchmark model whose likelihood costs a fixed wall time: it spins (busy work, not sleep, so
 * the core stays occupied as with a real solver) for the given number of microseconds, then returns
 * a standard Gaussian log-likelihood. Prior: independent N(0, 3²) on every coordinate.
 */
final class BusyModel implements Model {

    private static final double LOG_SQRT_2PI = 0.5 * StrictMath.log(2 * StrictMath.PI);

    private final ParameterSpace space;
    private final long costNanos;
    private final Prior prior;

    BusyModel(int dimension, long costMicros) {
        this.space = ParameterSpace.real("theta", dimension);
        this.costNanos = costMicros * 1000L;
        this.prior = new Prior() {
            @Override
            public int dimension() {
                return dimension;
            }

            @Override
            public void sample(RandomStream random, double[] out) {
                for (int i = 0; i < dimension; i++) {
                    out[i] = 3.0 * random.nextNormal();
                }
            }

            @Override
            public double logDensity(double[] x) {
                double total = 0;
                for (int i = 0; i < dimension; i++) {
                    total += -0.5 * x[i] * x[i] / 9.0 - StrictMath.log(3.0) - LOG_SQRT_2PI;
                }
                return total;
            }
        };
    }

    /** Spins for the configured cost; returns a value the JIT cannot discard. */
    static long spin(long nanos) {
        long start = System.nanoTime();
        long spins = 0;
        while (System.nanoTime() - start < nanos) {
            spins++;
        }
        return spins;
    }

    /**
     * The floor every overhead is measured against: {@code evaluations} spins of
     * {@code costMicros} split evenly over {@code threads} tasks of {@code pool}.
     */
    static long bareLoop(java.util.concurrent.ExecutorService pool, int threads, long evaluations, long costMicros)
            throws Exception {
        java.util.List<java.util.concurrent.Future<Long>> parts = new java.util.ArrayList<>();
        for (int t = 0; t < threads; t++) {
            long share = evaluations / threads + (t < evaluations % threads ? 1 : 0);
            parts.add(pool.submit(() -> {
                long spins = 0;
                for (long i = 0; i < share; i++) {
                    spins += spin(costMicros * 1000L);
                }
                return spins;
            }));
        }
        long spins = 0;
        for (java.util.concurrent.Future<Long> part : parts) {
            spins += part.get();
        }
        return spins;
    }

    @Override
    public ParameterSpace parameters() {
        return space;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    @Override
    public double logLikelihood(double[] x, LikelihoodContext context) {
        long spins = spin(costNanos);
        double total = 0;
        for (double v : x) {
            total += -0.5 * (v - 1.0) * (v - 1.0) - LOG_SQRT_2PI;
        }
        return total + (spins < 0 ? 1 : 0);
    }
}
