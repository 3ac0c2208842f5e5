package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.spark.SparkBackend;

/**
 * Side-by-side wall times on a shared, noisy machine: the variants (bare likelihood loop, thread
 * backend, skerry's Spark backend, the naive collect-everything Spark program) run one after
 * another in rounds, in an order rotated every round, in one JVM on one Spark context, so a burst
 * of load from other work hits one round rather than one variant. Each round gives each variant's
 * ratio to the first variant named; the summary states mean, min and max of those paired ratios.
 * JMH, which runs benchmark methods one after another in separate forks, cannot pair runs like
 * this (its benchmarks of the same settings are {@link SparkOverheadBenchmark} and
 * {@link NaiveCollectComparisonBenchmark}).
 *
 * <p>Fixed temperature schedule and fixed MH steps: every sampler run must make exactly
 * N·(1 + temperatures·steps) evaluations, and all sampler variants must give the same log
 * evidence bit for bit; the run fails otherwise.
 *
 * <p>Usage: {@code InterleavedComparison variants=bare,threads,spark particles=4000 dimension=2
 * costMicros=1000 rounds=3 warmup=1 threads=2 temperatures=4 steps=2 partitions=0}; {@code master=}
 * {@code local-cluster[…]} or {@code spark://…} (then {@code executorMemory=1g}) for executors in JVMs
 * of their own. {@code links=sk-d,sk-w1,sk-w2 netDev=/proc/PID/net/dev} prints the bytes each
 * run moved over those interfaces ({@link LinkBytes}).
 */
public final class InterleavedComparison {

    private final Map<String, String> options;
    private final int particles;
    private final int dimension;
    private final long costMicros;
    private final int threads;
    private final int temperatures;
    private final int steps;
    private final SamplerSettings settings;
    private final BusyModelSource source;

    private InterleavedComparison(Map<String, String> options) {
        this.options = options;
        particles = Integer.parseInt(options.getOrDefault("particles", "4000"));
        dimension = Integer.parseInt(options.getOrDefault("dimension", "2"));
        costMicros = Long.parseLong(options.getOrDefault("costMicros", "1000"));
        threads = Integer.parseInt(options.getOrDefault("threads", "2"));
        temperatures = Integer.parseInt(options.getOrDefault("temperatures", "4"));
        steps = Integer.parseInt(options.getOrDefault("steps", "2"));
        settings = SamplerSettings.builder().particles(particles).seed(11)
                .temperatureRule(FixedSchedule.power(temperatures, 3.0)).fixedSteps(steps).build();
        source = new BusyModelSource(dimension, costMicros);
    }

    public static void main(String[] args) throws Exception {
        Map<String, String> options = KeyValueArguments.parse(args);
        new InterleavedComparison(options).run();
    }

    private long evaluations() {
        return SparkForkedBenchmark.evaluations(particles, temperatures, steps);
    }

    private void run() throws Exception {
        List<String> variants = List.of(options.getOrDefault("variants", "bare,threads,spark").split(","));
        int rounds = Integer.parseInt(options.getOrDefault("rounds", "3"));
        int warmup = Integer.parseInt(options.getOrDefault("warmup", "1"));
        int partitions = Integer.parseInt(options.getOrDefault("partitions", "0"));
        System.out.printf(Locale.ROOT, "settings: %s; N=%d d=%d cost=%dus threads=%d temperatures=%d steps=%d "
                + "evaluations/run=%d; java %s; %d processors%n", options, particles, dimension, costMicros, threads,
                temperatures, steps, evaluations(), System.getProperty("java.version"),
                Runtime.getRuntime().availableProcessors());

        String master = options.getOrDefault("master", "local[" + threads + "]");
        SparkBackend spark = variants.contains("spark") || variants.contains("naive")
                ? LocalSpark.start(master, partitions,
                        LocalSpark.executorSettings(master, options.getOrDefault("executorMemory", "1g")))
                : null;
        ThreadPoolBackend threadBackend = new ThreadPoolBackend(threads, 0);
        ExecutorService barePool = Executors.newFixedThreadPool(threads);
        Map<String, PopulationBackend> backends = new LinkedHashMap<>();
        backends.put("threads", threadBackend);
        if (spark != null) {
            backends.put("spark", spark);
            backends.put("naive", new NaiveCollectBackend(spark.context(), partitions));
        }
        for (String variant : variants) {
            if (!variant.equals("bare") && !backends.containsKey(variant)) {
                throw new IllegalArgumentException("unknown variant " + variant + " (bare, threads, spark, naive)");
            }
        }

        LinkBytes links = options.containsKey("links")
                ? new LinkBytes(java.nio.file.Path.of(options.getOrDefault("netDev", "/proc/net/dev")),
                        List.of(options.get("links").split(",")))
                : null;
        Map<String, List<Double>> ratios = new LinkedHashMap<>();
        Map<String, List<Double>> times = new LinkedHashMap<>();
        Map<String, PhaseTotals> phases = new LinkedHashMap<>();
        for (String variant : variants) {
            ratios.put(variant, new ArrayList<>());
            times.put(variant, new ArrayList<>());
            phases.put(variant, new PhaseTotals());
        }
        try {
            for (int round = -warmup; round < rounds; round++) {
                Map<String, Double> wall = new LinkedHashMap<>();
                Double logEvidence = null;
                int shift = Math.floorMod(round, variants.size());
                for (int k = 0; k < variants.size(); k++) {
                    String variant = variants.get((k + shift) % variants.size());
                    Map<String, long[]> bytesBefore = links == null ? null : links.read();
                    long start = System.nanoTime();
                    long cpuStart = processCpuNanos();
                    SamplerResult result = variant.equals("bare") ? null : sample(backends.get(variant));
                    if (result == null) {
                        bareLoop(barePool);
                    }
                    double seconds = (System.nanoTime() - start) * 1e-9;
                    double cpu = (processCpuNanos() - cpuStart) * 1e-9;
                    wall.put(variant, seconds);
                    String label = round < 0 ? "warmup" : "round " + round;
                    System.out.printf(Locale.ROOT, "%s %s: %.3f s wall, %.3f s CPU of this JVM; load average %s%n",
                            label, variant, seconds, cpu, loadAverage());
                    if (links != null) {
                        System.out.println("  " + LinkBytes.describe(bytesBefore, links.read()));
                    }
                    if (result != null) {
                        double z = result.evidence().logEvidence();
                        if (logEvidence != null && Double.compare(logEvidence, z) != 0) {
                            throw new IllegalStateException("log evidence differs between variants: " + logEvidence
                                    + " vs " + z + " (" + variant + ")");
                        }
                        logEvidence = z;
                        PhaseTotals one = new PhaseTotals();
                        one.add(result, seconds);
                        System.out.println("  " + one.describe(variant));
                        if (round >= 0) {
                            phases.get(variant).add(result, seconds);
                        }
                    }
                }
                if (round >= 0) {
                    double base = wall.get(variants.get(0));
                    StringBuilder line = new StringBuilder("round " + round + " ratios to " + variants.get(0) + ":");
                    for (String variant : variants) {
                        ratios.get(variant).add(wall.get(variant) / base);
                        times.get(variant).add(wall.get(variant));
                        line.append(String.format(Locale.ROOT, " %s %.4f", variant, wall.get(variant) / base));
                    }
                    System.out.println(line + (logEvidence == null ? "" : "; log Z " + logEvidence));
                }
            }
        } finally {
            threadBackend.close();
            barePool.shutdownNow();
            if (spark != null) {
                spark.close();
            }
        }
        System.out.println();
        System.out.println("summary over " + rounds + " rounds (ratio = wall time / " + variants.get(0)
                + " wall time of the same round):");
        for (String variant : variants) {
            List<Double> r = ratios.get(variant);
            List<Double> t = times.get(variant);
            System.out.printf(Locale.ROOT, "  %-8s wall s mean %.3f [min %.3f, max %.3f]; ratio mean %.4f [min %.4f, max %.4f]%n",
                    variant, mean(t), min(t), max(t), mean(r), min(r), max(r));
        }
        for (String variant : variants) {
            if (phases.get(variant).runs() > 0) {
                System.out.println("  " + phases.get(variant).describe(variant));
            }
        }
    }

    private SamplerResult sample(PopulationBackend backend) {
        SamplerResult result = new SmcSampler(settings).run(source, backend, IterationListener.NONE);
        if (result.evaluations().evaluations() != evaluations()) {
            throw new IllegalStateException("expected " + evaluations() + " evaluations, made "
                    + result.evaluations().evaluations());
        }
        return result;
    }

    /** The floor: the same number of likelihood calls split evenly over the same number of threads. */
    private long bareLoop(ExecutorService pool) throws Exception {
        return BareLoop.run(pool, threads, evaluations(), costMicros);
    }

    /** CPU time of this whole JVM (driver, local executors, Spark's own threads). */
    private static long processCpuNanos() {
        return ((com.sun.management.OperatingSystemMXBean) java.lang.management.ManagementFactory
                .getOperatingSystemMXBean()).getProcessCpuTime();
    }

    /** The machine's 1-minute load average, to show how much other work shared the cores. */
    private static String loadAverage() {
        return String.format(Locale.ROOT, "%.2f",
                java.lang.management.ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
    }

    private static double mean(List<Double> values) {
        return values.stream().mapToDouble(Double::doubleValue).average().orElse(Double.NaN);
    }

    private static double min(List<Double> values) {
        return values.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN);
    }

    private static double max(List<Double> values) {
        return values.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN);
    }
}
