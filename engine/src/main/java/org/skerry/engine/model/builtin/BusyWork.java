package org.skerry.engine.model.builtin;

/**
 * A fixed amount of arithmetic that stands in for a costly likelihood: busy work, not sleep, so a
 * core stays occupied as it would with a real solver. The amount is counted in work units (a
 * dependent chain of integer multiply–adds the JIT cannot skip), not in wall time: two evaluations
 * that share a core take twice as long, so a scaling study on a loaded machine sees the contention
 * instead of hiding it. {@link #unitsFor(double)} converts a cost in microseconds to units with a
 * calibration measured once per JVM on an idle moment's best rate.
 */
public final class BusyWork {

    /** System property that fixes the work units per microsecond instead of measuring them. */
    public static final String PROPERTY = "skerry.busy-work.units-per-microsecond";

    /** Multiply–add steps in one work unit. */
    private static final int STEPS_PER_UNIT = 64;

    private BusyWork() {
    }

    /**
     * Does {@code units} units of work and returns a value that depends on all of it, so the JIT
     * cannot discard the loop (callers fold it into their result in a way that never changes it).
     */
    public static long work(long units) {
        // Knuth's MMIX linear congruential constants: a full-period chain, each step depending on the last.
        long x = units;
        for (long u = 0; u < units; u++) {
            for (int s = 0; s < STEPS_PER_UNIT; s++) {
                x = x * 6364136223846793005L + 1442695040888963407L;
            }
        }
        return x;
    }

    /** Work units per microsecond of one core, measured on first use in this JVM. */
    public static double unitsPerMicrosecond() {
        return Calibration.UNITS_PER_MICROSECOND;
    }

    /** The units that take about {@code micros} microseconds on one otherwise idle core (0 for 0). */
    public static long unitsFor(double micros) {
        if (!(micros >= 0) || Double.isInfinite(micros)) {
            throw new IllegalArgumentException("micros must be finite and >= 0, was " + micros);
        }
        return micros == 0 ? 0 : Math.max(1, Math.round(micros * unitsPerMicrosecond()));
    }

    /**
     * Calibration: after a warm-up that lets the JIT compile {@link #work}, the best of 100 trials
     * of 2 ms — the best, because a trial that lost its core to another process is slow, never
     * fast, and short trials are more often left alone on a loaded machine. About 0.3 s once per
     * JVM. The system property {@value #PROPERTY} fixes the rate instead (the figure a study's
     * summary reports), so that runs in other JVMs do the same work.
     */
    private static final class Calibration {
        static final double UNITS_PER_MICROSECOND = fixedOrMeasured();

        private static double fixedOrMeasured() {
            String fixed = System.getProperty(PROPERTY);
            if (fixed != null) {
                double value;
                try {
                    value = Double.parseDouble(fixed);
                } catch (NumberFormatException e) {
                    value = Double.NaN;
                }
                if (!(value > 0) || Double.isInfinite(value)) {
                    throw new IllegalArgumentException("system property " + PROPERTY
                            + " must be a positive number of work units per microsecond, was '" + fixed + "'");
                }
                return value;
            }
            return measure();
        }

        private static double measure() {
            long sink = 0;
            long units = 64;
            long warmEnd = System.nanoTime() + 100_000_000L;
            while (System.nanoTime() < warmEnd) {
                sink += work(units);
            }
            double best = 0;
            for (int trial = 0; trial < 100; trial++) {
                long done = 0;
                long start = System.nanoTime();
                long elapsed;
                do {
                    sink += work(units);
                    done += units;
                    elapsed = System.nanoTime() - start;
                } while (elapsed < 2_000_000L);
                best = Math.max(best, done / (elapsed / 1000.0));
            }
            return sink == 42 ? best + Double.MIN_VALUE : best;
        }
    }
}
