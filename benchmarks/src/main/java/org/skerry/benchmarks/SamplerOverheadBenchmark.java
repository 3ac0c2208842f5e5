package org.skerry.benchmarks;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
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
import org.skerry.engine.model.Model;
import org.skerry.engine.model.builtin.CostlyNormalModel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.temper.FixedSchedule;

/**
 * Sampler overhead: a full run with a busy-wait likelihood (fixed schedule, fixed MH steps, so the
 * number of evaluations is known) against the bare loop of the same number of likelihood calls on
 * the same number of threads. The ratio of the two scores is the overhead factor.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 5)
@Fork(1)
public class SamplerOverheadBenchmark {

    @Param("10000")
    public int particles;

    @Param("100")
    public long costMicros;

    @Param("2")
    public int threads;

    @Param("4")
    public int temperatures;

    @Param("2")
    public int steps;

    /** Particles per block; 0 lets the backend choose. */
    @Param("0")
    public int blockSize;

    private Model model;
    private ThreadPoolBackend backend;
    private ExecutorService barePool;
    private SamplerSettings settings;

    @Setup(Level.Trial)
    public void setUp() {
        model = CostlyNormalModel.of(2, costMicros);
        backend = new ThreadPoolBackend(threads, blockSize);
        barePool = Executors.newFixedThreadPool(threads);
        settings = SamplerSettings.builder().particles(particles).seed(11)
                .temperatureRule(FixedSchedule.power(temperatures, 3.0)).fixedSteps(steps).build();
    }

    @TearDown(Level.Trial)
    public void tearDown() {
        backend.close();
        barePool.shutdownNow();
    }

    /** Evaluations the sampler makes: N initial draws plus N proposals per step and temperature. */
    long evaluations() {
        return (long) particles * (1 + (long) temperatures * steps);
    }

    @Benchmark
    public SamplerResult sampler() {
        SamplerResult result = new SmcSampler(settings).run(model, backend);
        if (result.evaluations().evaluations() != evaluations()) {
            throw new IllegalStateException("expected " + evaluations() + " evaluations, made "
                    + result.evaluations().evaluations());
        }
        return result;
    }

    @Benchmark
    public long bareLikelihoodLoop() throws Exception {
        return BareLoop.run(barePool, threads, evaluations(), costMicros);
    }
}
