package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.spark.SparkBackend;

/**
 * The ABC loop's overhead, side by side (as {@link InterleavedComparison}, whose method it
 * follows): in rounds, in an order rotated every round, in one JVM on one Spark context, the
 * variants {@code bare} (the simulator's busy work alone, the same number of calls over the same
 * threads), {@code abc-threads} and {@code abc-spark} (an ABC run of the costly simulator with a
 * fixed tolerance schedule), and {@code likelihood-threads} and {@code likelihood-spark} (a
 * likelihood run of the costly-normal model with as many evaluations of the same cost: a fixed
 * temperature schedule of as many steps). Both samplers resample every iteration and make fixed
 * MH steps, so each run makes exactly N·(1 + targets·steps) calls; the harness fails otherwise,
 * and fails unless the ABC runs give the same posterior mean bit for bit on both backends.
 *
 * <p>Usage: {@code AbcComparison particles=4000 costMicros=1000 rounds=3 warmup=1 threads=2 steps=2
 * variants=bare,abc-threads,likelihood-threads,abc-spark,likelihood-spark}.
 */
public final class AbcComparison {

    private static final double[] TOLERANCES = {2.0, 1.0, 0.5, 0.25};

    public static void main(String[] args) throws Exception {
        Map<String, String> options = KeyValueArguments.parse(args);
        int particles = Integer.parseInt(options.getOrDefault("particles", "4000"));
        long costMicros = Long.parseLong(options.getOrDefault("costMicros", "1000"));
        int threads = Integer.parseInt(options.getOrDefault("threads", "2"));
        int steps = Integer.parseInt(options.getOrDefault("steps", "2"));
        int rounds = Integer.parseInt(options.getOrDefault("rounds", "3"));
        int warmup = Integer.parseInt(options.getOrDefault("warmup", "1"));
        List<String> variants = List.of(options.getOrDefault("variants",
                "bare,abc-threads,likelihood-threads,abc-spark,likelihood-spark").split(","));
        long calls = (long) particles * (1 + TOLERANCES.length * steps);

        SamplerSettings abc = SamplerSettings.builder().particles(particles).seed(11).resampleEveryIteration(true)
                .targets(SequenceSettings.abc(AbcSettings.of(0.25).withSchedule(TOLERANCES)
                        .withWeights(Map.of("mean", 1.0)).withSteps(steps))).build();
        SamplerSettings likelihood = SamplerSettings.builder().particles(particles).seed(11).resampleEveryIteration(true)
                .temperatureRule(FixedSchedule.power(TOLERANCES.length, 3.0)).fixedSteps(steps).build();
        ModelSource simulator = new BusySimulatorSource(costMicros);
        ModelSource costly = new BusyModelSource(1, costMicros);
        System.out.printf(Locale.ROOT, "settings: %s; N=%d cost=%dus threads=%d steps=%d tolerances=%s calls/run=%d; "
                + "java %s; %d processors%n", options, particles, costMicros, threads, steps,
                java.util.Arrays.toString(TOLERANCES), calls, System.getProperty("java.version"),
                Runtime.getRuntime().availableProcessors());

        boolean needSpark = variants.stream().anyMatch(v -> v.endsWith("spark"));
        SparkBackend spark = needSpark ? LocalSpark.start("local[" + threads + "]", 0,
                LocalSpark.executorSettings("local[" + threads + "]", "1g")) : null;
        ThreadPoolBackend threadBackend = new ThreadPoolBackend(threads, 0);
        ExecutorService barePool = Executors.newFixedThreadPool(threads);
        Map<String, List<Double>> ratios = new LinkedHashMap<>();
        Map<String, List<Double>> times = new LinkedHashMap<>();
        List<Double> abcOverLikelihoodSpark = new ArrayList<>();
        List<Double> abcOverLikelihoodThreads = new ArrayList<>();
        variants.forEach(v -> {
            ratios.put(v, new ArrayList<>());
            times.put(v, new ArrayList<>());
        });
        try {
            for (int round = -warmup; round < rounds; round++) {
                Map<String, Double> wall = new LinkedHashMap<>();
                Double abcMean = null;
                int shift = Math.floorMod(round, variants.size());
                for (int k = 0; k < variants.size(); k++) {
                    String variant = variants.get((k + shift) % variants.size());
                    PopulationBackend backend = variant.endsWith("spark") ? spark : threadBackend;
                    long start = System.nanoTime();
                    SamplerResult result = null;
                    switch (variant) {
                        case "bare" -> BareLoop.run(barePool, threads, calls, costMicros);
                        case "abc-threads", "abc-spark" -> result = new SmcSampler(abc).run(simulator, backend,
                                IterationListener.NONE);
                        case "likelihood-threads", "likelihood-spark" -> result = new SmcSampler(likelihood)
                                .run(costly, backend, IterationListener.NONE);
                        default -> throw new IllegalArgumentException("unknown variant " + variant);
                    }
                    double seconds = (System.nanoTime() - start) * 1e-9;
                    wall.put(variant, seconds);
                    if (result != null && result.evaluations().evaluations() != calls) {
                        throw new IllegalStateException(variant + " made " + result.evaluations().evaluations()
                                + " calls, not " + calls);
                    }
                    if (result != null && variant.startsWith("abc")) {
                        double mean = result.parameters().get(0).mean();
                        if (abcMean != null && Double.compare(abcMean, mean) != 0) {
                            throw new IllegalStateException("ABC posterior mean differs between backends");
                        }
                        abcMean = mean;
                    }
                    System.out.printf(Locale.ROOT, "%s %s: %.3f s wall; load average %.2f%n",
                            round < 0 ? "warmup" : "round " + round, variant, seconds,
                            java.lang.management.ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage());
                }
                if (round >= 0) {
                    double base = wall.getOrDefault("bare", Double.NaN);
                    StringBuilder line = new StringBuilder("round " + round + " ratios to bare:");
                    for (String variant : variants) {
                        ratios.get(variant).add(wall.get(variant) / base);
                        times.get(variant).add(wall.get(variant));
                        line.append(String.format(Locale.ROOT, " %s %.4f", variant, wall.get(variant) / base));
                    }
                    if (wall.containsKey("abc-spark") && wall.containsKey("likelihood-spark")) {
                        abcOverLikelihoodSpark.add(wall.get("abc-spark") / wall.get("likelihood-spark"));
                        line.append(String.format(Locale.ROOT, "; abc-spark / likelihood-spark %.4f",
                                wall.get("abc-spark") / wall.get("likelihood-spark")));
                    }
                    if (wall.containsKey("abc-threads") && wall.containsKey("likelihood-threads")) {
                        abcOverLikelihoodThreads.add(wall.get("abc-threads") / wall.get("likelihood-threads"));
                        line.append(String.format(Locale.ROOT, "; abc-threads / likelihood-threads %.4f",
                                wall.get("abc-threads") / wall.get("likelihood-threads")));
                    }
                    System.out.println(line);
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
        System.out.println("summary over " + rounds + " rounds (ratio = wall time / bare wall time of the same round):");
        for (String variant : variants) {
            System.out.printf(Locale.ROOT, "  %-18s wall s mean %.3f [min %.3f, max %.3f]; ratio mean %.4f [min %.4f, "
                    + "max %.4f]%n", variant, mean(times.get(variant)), min(times.get(variant)), max(times.get(variant)),
                    mean(ratios.get(variant)), min(ratios.get(variant)), max(ratios.get(variant)));
        }
        if (!abcOverLikelihoodSpark.isEmpty()) {
            System.out.printf(Locale.ROOT, "  abc-spark / likelihood-spark: mean %.4f [min %.4f, max %.4f]%n",
                    mean(abcOverLikelihoodSpark), min(abcOverLikelihoodSpark), max(abcOverLikelihoodSpark));
        }
        if (!abcOverLikelihoodThreads.isEmpty()) {
            System.out.printf(Locale.ROOT, "  abc-threads / likelihood-threads: mean %.4f [min %.4f, max %.4f]%n",
                    mean(abcOverLikelihoodThreads), min(abcOverLikelihoodThreads), max(abcOverLikelihoodThreads));
        }
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
