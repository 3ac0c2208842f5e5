package org.skerry.benchmarks;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.spark.SparkBackend;

/**
 * How much heap the driver needs: one full Spark run (fixed schedule, fixed MH steps, a cheap
 * busy-wait likelihood) while {@link HeapWatch} records this JVM's heap. Start it with a small
 * {@code -Xmx} to see whether the run completes. In {@code local[k]} mode the executors are
 * threads of this JVM, so the figure includes their cached particle blocks; with
 * {@code local-cluster[1,k,mb]} or a standalone master ({@code spark://…}) the executors are separate
 * JVMs and the figure is the driver's alone.
 *
 * <p>Usage: {@code DriverMemoryProbe master=local[2] particles=1000000 dimension=10 costMicros=10
 * partitions=0 executorMemory=2g}
 */
public final class DriverMemoryProbe {

    private DriverMemoryProbe() {
    }

    public static void main(String[] args) {
        Map<String, String> options = new LinkedHashMap<>();
        for (String arg : args) {
            int eq = arg.indexOf('=');
            options.put(arg.substring(0, eq), arg.substring(eq + 1));
        }
        String master = options.getOrDefault("master", "local[2]");
        int particles = Integer.parseInt(options.getOrDefault("particles", "1000000"));
        int dimension = Integer.parseInt(options.getOrDefault("dimension", "10"));
        long costMicros = Long.parseLong(options.getOrDefault("costMicros", "10"));
        int partitions = Integer.parseInt(options.getOrDefault("partitions", "0"));
        int temperatures = 4;
        int steps = 2;
        // Executors launched by a worker, not by us, get the module options and the memory the
        // cached blocks need.
        Map<String, String> extra = LocalSpark.executorSettings(master, options.getOrDefault("executorMemory", "2g"));
        System.out.printf(Locale.ROOT, "settings: %s; max heap %d MiB; java %s%n", options,
                Runtime.getRuntime().maxMemory() >> 20, System.getProperty("java.version"));

        SamplerSettings settings = SamplerSettings.builder().particles(particles).seed(11)
                .temperatureRule(FixedSchedule.power(temperatures, 3.0)).fixedSteps(steps).build();
        long expected = SparkForkedBenchmark.evaluations(particles, temperatures, steps);
        try (HeapWatch watch = new HeapWatch(5)) {
            long start = System.nanoTime();
            SamplerResult result;
            try (SparkBackend spark = LocalSpark.start(master, partitions, extra)) {
                System.out.println("backend: " + spark.description());
                result = new SmcSampler(settings).run(new BusyModelSource(dimension, costMicros), spark,
                        IterationListener.NONE);
            }
            double seconds = (System.nanoTime() - start) * 1e-9;
            if (result.evaluations().evaluations() != expected) {
                throw new IllegalStateException("expected " + expected + " evaluations, made "
                        + result.evaluations().evaluations());
            }
            PhaseTotals phases = new PhaseTotals();
            phases.add(result, seconds);
            System.out.println(phases.describe(master));
            System.out.printf(Locale.ROOT, "completed: %d evaluations, log Z %.6f, %.1f s (Spark start and stop "
                    + "included)%n", result.evaluations().evaluations(), result.evidence().logEvidence(), seconds);
            System.out.printf(Locale.ROOT, "driver JVM heap: max %d MiB; peak used (sampled every 5 ms) %d MiB; "
                    + "peak used after a collection %d MiB over %d collections%n",
                    Runtime.getRuntime().maxMemory() >> 20, watch.peakSampled() >> 20, watch.peakAfterGc() >> 20,
                    watch.collections());
            // The final particles are the run's output and stay on the driver by design.
            System.out.printf(Locale.ROOT, "of which the result's final particles: %d MiB%n",
                    (long) particles * (dimension + 4) * 8 >> 20);
        }
    }
}
