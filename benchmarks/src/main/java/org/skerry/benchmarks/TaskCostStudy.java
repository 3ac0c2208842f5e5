package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.spark.SparkBackend;
import org.skerry.spark.TaskGrouping;

/**
 * Spark's per-task cost and the loop time per iteration against the block count P and the task
 * grouping, side by side in one JVM: each round runs every variant once, in an order rotated
 * every round, each Spark variant on a context of its own (per-executor tasks need
 * {@code spark.task.cpus} set when the context starts). Prints, per run, the loop's seconds per
 * iteration (the sampler's phase times after the initial draw), the wall time of the whole
 * sampling loop against the exact ideal (busy work counted by {@link CountedBusySource} ÷ cores),
 * and Spark's own per-task metrics per iteration ({@link TaskCosts}). Local mode only.
 *
 * <p>Usage: {@code TaskCostStudy variants=bare,threads,blocks:8,blocks:512,executors:8,executors:512
 * particles=100000 dimension=2 costMicros=0 slowFraction=0 slowFactor=20 temperatures=8 steps=2
 * cores=2 rounds=2 warmup=1 detail=true}. A variant is {@code bare} (the likelihood calls alone, split
 * over the cores: {@link BareLoop}), {@code threads}, {@code blocks:P} (a Spark
 * task per block) or {@code executors:P[:G]} (G tasks of consecutive blocks, worked through by
 * threads; G = 0 means one per executor).
 */
public final class TaskCostStudy {

    public static void main(String[] args) throws Exception {
        Map<String, String> options = KeyValueArguments.parse(args);
        int particles = Integer.parseInt(options.getOrDefault("particles", "100000"));
        int dimension = Integer.parseInt(options.getOrDefault("dimension", "2"));
        double cost = Double.parseDouble(options.getOrDefault("costMicros", "0"));
        double slowFraction = Double.parseDouble(options.getOrDefault("slowFraction", "0"));
        double slowFactor = Double.parseDouble(options.getOrDefault("slowFactor", "20"));
        int temperatures = Integer.parseInt(options.getOrDefault("temperatures", "8"));
        int steps = Integer.parseInt(options.getOrDefault("steps", "2"));
        int cores = Integer.parseInt(options.getOrDefault("cores", "2"));
        int rounds = Integer.parseInt(options.getOrDefault("rounds", "2"));
        int warmup = Integer.parseInt(options.getOrDefault("warmup", "1"));
        boolean detail = Boolean.parseBoolean(options.getOrDefault("detail", "true"));
        List<String> variants = List.of(options.getOrDefault("variants", "blocks:8,blocks:512").split(","));
        SamplerSettings settings = SamplerSettings.builder().particles(particles).seed(11)
                .temperatureRule(FixedSchedule.power(temperatures, 3.0)).fixedSteps(steps).build();
        CountedBusySource source = new CountedBusySource(dimension, cost, slowFraction, slowFactor);
        System.out.printf(Locale.ROOT, "settings: %s; java %s; %d processors; load average %s%n", options,
                System.getProperty("java.version"), Runtime.getRuntime().availableProcessors(), load());

        Map<String, List<Double>> walls = new LinkedHashMap<>();
        java.util.concurrent.ExecutorService barePool = java.util.concurrent.Executors.newFixedThreadPool(cores);
        long evaluations = (long) particles * (1 + (long) temperatures * steps);
        Map<String, List<Double>> perIteration = new LinkedHashMap<>();
        Map<String, List<Double>> toIdeal = new LinkedHashMap<>();
        variants.forEach(v -> {
            walls.put(v, new ArrayList<>());
            perIteration.put(v, new ArrayList<>());
            toIdeal.put(v, new ArrayList<>());
        });
        Double logEvidence = null;
        for (int round = -warmup; round < rounds; round++) {
            int shift = Math.floorMod(round, variants.size());
            for (int k = 0; k < variants.size(); k++) {
                String variant = variants.get((k + shift) % variants.size());
                TaskCosts costs = new TaskCosts();
                CountedBusySource.reset();
                String loadBefore = load();
                SamplerResult result;
                long started = System.nanoTime();
                if (variant.equals("bare")) {
                    BareLoop.run(barePool, cores, evaluations, (long) cost);
                    double wall = (System.nanoTime() - started) * 1e-9;
                    System.out.printf(Locale.ROOT, "%s bare: wall %.3f s (%d evaluations at %.0f us, no stragglers); "
                            + "load %s -> %s%n", round < 0 ? "warmup" : "round " + round, wall, evaluations, cost,
                            loadBefore, load());
                    if (round >= 0) {
                        walls.get(variant).add(wall);
                        perIteration.get(variant).add(wall);
                    }
                    continue;
                }
                if (variant.equals("threads")) {
                    try (ThreadPoolBackend backend = new ThreadPoolBackend(cores, 0)) {
                        result = new SmcSampler(settings).run(source, backend, r -> { });
                    }
                } else {
                    result = onSpark(variant, cores, settings, source, costs);
                }
                double wall = (System.nanoTime() - started) * 1e-9;
                double z = result.evidence().logEvidence();
                if (logEvidence != null && Double.compare(logEvidence, z) != 0) {
                    throw new IllegalStateException("log evidence differs: " + logEvidence + " vs " + z + " (" + variant
                            + ")");
                }
                logEvidence = z;
                double loop = 0;
                double all = 0;
                for (IterationRecord record : result.iterations()) {
                    PhaseTimes t = record.seconds();
                    all += t.total();
                    loop += t.total() - t.evaluate();
                }
                int iterations = Math.max(1, result.iterations().size() - 1);
                double ideal = source.workMicros() * 1e-6 / cores;
                String label = round < 0 ? "warmup" : "round " + round;
                System.out.printf(Locale.ROOT, "%s %s: wall %.3f s; loop %.4f s/iteration over %d iterations; "
                        + "sampling %.3f s, ideal %.3f s (%d evaluations, %d slow), ratio %.4f; load %s -> %s%n", label,
                        variant, wall, loop / iterations, iterations, all, ideal, CountedBusySource.EVALUATIONS.sum(),
                        CountedBusySource.SLOW.sum(), ideal > 0 ? all / ideal : Double.NaN, loadBefore, load());
                if (!variant.equals("threads")) {
                    double[] m = costs.loopMeans();
                    System.out.printf(Locale.ROOT, "  per task after the initial draw (ms): deserialise %.3f, run %.3f, "
                            + "scheduler delay %.3f, duration %.3f%n", m[0], m[1], m[2], m[3]);
                    if (detail) {
                        costs.lines().forEach(System.out::println);
                    }
                }
                if (round >= 0) {
                    walls.get(variant).add(wall);
                    perIteration.get(variant).add(loop / iterations);
                    if (ideal > 0) {
                        toIdeal.get(variant).add(all / ideal);
                    }
                }
            }
        }
        barePool.shutdownNow();
        System.out.println();
        System.out.println("summary over " + rounds + " rounds (log evidence " + logEvidence + " in every run):");
        String first = variants.get(0);
        for (String variant : variants) {
            List<Double> ratios = new ArrayList<>();
            List<Double> wallRatios = new ArrayList<>();
            for (int r = 0; r < rounds; r++) {
                ratios.add(perIteration.get(variant).get(r) / perIteration.get(first).get(r));
                wallRatios.add(walls.get(variant).get(r) / walls.get(first).get(r));
            }
            System.out.printf(Locale.ROOT, "  %-16s loop s/iteration %s; paired ratio to %s %s; wall s %s, paired wall "
                    + "ratio %s; sampling / ideal %s%n", variant, range(perIteration.get(variant)), first, range(ratios),
                    range(walls.get(variant)), range(wallRatios), range(toIdeal.get(variant)));
        }
    }

    private static SamplerResult onSpark(String variant, int cores, SamplerSettings settings, CountedBusySource source,
            TaskCosts costs) {
        String[] parts = variant.split(":");
        int partitions = Integer.parseInt(parts[1]);
        boolean grouped = parts[0].equals("executors");
        if (!grouped && !parts[0].equals("blocks")) {
            throw new IllegalArgumentException("unknown variant " + variant);
        }
        Map<String, String> extra = new java.util.HashMap<>();
        if (grouped) {
            extra.put("spark.task.cpus", String.valueOf(cores));
        }
        SparkBackend spark = LocalSpark.start("local[" + cores + "]", partitions, extra);
        try {
            spark.context().sc().addSparkListener(costs);
            TaskGrouping grouping = grouped
                    ? TaskGrouping.perExecutor(parts.length > 2 ? Integer.parseInt(parts[2]) : 0)
                    : TaskGrouping.perBlock();
            PopulationBackend backend = SparkBackend.on(spark.context(), partitions, grouping);
            return new SmcSampler(settings).run(source, backend, record -> costs.iteration = record.iteration());
        } finally {
            spark.close();
        }
    }

    private static String load() {
        try {
            return java.nio.file.Files.readString(java.nio.file.Path.of("/proc/loadavg")).trim();
        } catch (java.io.IOException e) {
            return "?";
        }
    }

    private static String range(List<Double> values) {
        if (values.isEmpty()) {
            return "n/a";
        }
        return String.format(Locale.ROOT, "mean %.4f [min %.4f, max %.4f]",
                values.stream().mapToDouble(Double::doubleValue).average().orElse(Double.NaN),
                values.stream().mapToDouble(Double::doubleValue).min().orElse(Double.NaN),
                values.stream().mapToDouble(Double::doubleValue).max().orElse(Double.NaN));
    }
}
