package org.skerry.benchmarks;

import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
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
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.spark.SparkBackend;

/**
 * Overhead of the Spark backend in local mode: a full run with a busy-wait likelihood (fixed
 * schedule, fixed MH steps, so the evaluation count is known and checked) on Spark
 * {@code local[threads]}, the same run on the thread backend, and the bare loop of the same number
 * of likelihood calls on the same number of threads — all in one fork. Score ratios against the
 * bare loop are the overhead factors. At tear-down each sampler prints its mean phase times from
 * the run's own iteration records, which say where the overhead goes.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 4)
public class SparkOverheadBenchmark extends SparkForkedBenchmark {

    private ModelSource source;
    private SparkBackend spark;
    private ThreadPoolBackend threadBackend;
    private ExecutorService barePool;
    private SamplerSettings settings;
    private final PhaseTotals sparkPhases = new PhaseTotals();
    private final PhaseTotals threadPhases = new PhaseTotals();

    @Setup(Level.Trial)
    public void setUp() {
        source = new BusyModelSource(2, costMicros);
        spark = LocalSpark.start("local[" + threads + "]", partitions, Map.of());
        threadBackend = new ThreadPoolBackend(threads, 0);
        barePool = Executors.newFixedThreadPool(threads);
        settings = fixedSettings(particles);
    }

    @TearDown(Level.Trial)
    public void tearDown() {
        // Printed in the fork's output (JMH forks once per benchmark method); warm-up runs are
        // included in the means.
        if (sparkPhases.runs() > 0) {
            System.out.println(System.lineSeparator() + sparkPhases.describe(spark.description()));
        }
        if (threadPhases.runs() > 0) {
            System.out.println(System.lineSeparator() + threadPhases.describe(threadBackend.description()));
        }
        spark.close();
        threadBackend.close();
        barePool.shutdownNow();
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
    public SamplerResult sparkSampler() {
        return run(spark, sparkPhases);
    }

    @Benchmark
    public SamplerResult threadSampler() {
        return run(threadBackend, threadPhases);
    }

    /** The floor: the same number of likelihood calls split evenly over the same threads. */
    @Benchmark
    public long bareLikelihoodLoop() throws Exception {
        return BareLoop.run(barePool, threads, evaluations(), costMicros);
    }
}
