package org.skerry.benchmarks;

import java.util.Arrays;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.spark.SparkBackend;

/**
 * skerry's Spark backend against {@link NaiveCollectBackend}, the same algorithm with the whole
 * population collected to the driver and re-parallelised for every likelihood pass, on one Spark
 * context in {@code local[threads]}. Fixed schedule and fixed MH steps, so both make exactly
 * N·(1 + temperatures·steps) evaluations (checked). The ratio of the scores is the gain from
 * keeping particles on the executors. Before timing, each fork checks on a small population that
 * both backends give bit-identical answers, so the comparison is between two implementations of
 * one computation.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 4)
public class NaiveCollectComparisonBenchmark extends SparkForkedBenchmark {

    @Param("2")
    public int dimension;

    private ModelSource source;
    private SparkBackend spark;
    private NaiveCollectBackend naive;
    private SamplerSettings settings;
    private final PhaseTotals sparkPhases = new PhaseTotals();
    private final PhaseTotals naivePhases = new PhaseTotals();

    @Setup(Level.Trial)
    public void setUp() {
        source = new BusyModelSource(dimension, costMicros);
        spark = LocalSpark.start("local[" + threads + "]", partitions, Map.of());
        naive = new NaiveCollectBackend(spark.context(), partitions);
        settings = fixedSettings(particles);
        checkSameAnswer();
    }

    /** Both backends on 500 particles with a free likelihood: same evidence, same final particles. */
    private void checkSameAnswer() {
        ModelSource cheap = new BusyModelSource(dimension, 0);
        SmcSampler sampler = new SmcSampler(fixedSettings(500));
        SamplerResult a = sampler.run(cheap, spark, IterationListener.NONE);
        SamplerResult b = sampler.run(cheap, naive, IterationListener.NONE);
        if (Double.compare(a.evidence().logEvidence(), b.evidence().logEvidence()) != 0
                || !Arrays.equals(a.particles().values(), b.particles().values())) {
            throw new IllegalStateException("naive and skerry backends disagree: log Z " + a.evidence().logEvidence()
                    + " vs " + b.evidence().logEvidence());
        }
    }

    @TearDown(Level.Trial)
    public void tearDown() {
        // Printed in the fork's output (one fork per benchmark method); warm-up included.
        if (sparkPhases.runs() > 0) {
            System.out.println(System.lineSeparator() + sparkPhases.describe(spark.description()));
        }
        if (naivePhases.runs() > 0) {
            System.out.println(System.lineSeparator() + naivePhases.describe(naive.description()));
        }
        spark.close();
    }

    private SamplerResult run(PopulationBackend backend, PhaseTotals phases) {
        long start = System.nanoTime();
        SamplerResult result = new SmcSampler(settings).run(source, backend, IterationListener.NONE);
        phases.add(result, (System.nanoTime() - start) * 1e-9);
        long expected = evaluations();
        if (result.evaluations().evaluations() != expected) {
            throw new IllegalStateException("expected " + expected + " evaluations, made "
                    + result.evaluations().evaluations());
        }
        return result;
    }

    @Benchmark
    public SamplerResult skerrySpark() {
        return run(spark, sparkPhases);
    }

    @Benchmark
    public SamplerResult naiveCollect() {
        return run(naive, naivePhases);
    }
}
