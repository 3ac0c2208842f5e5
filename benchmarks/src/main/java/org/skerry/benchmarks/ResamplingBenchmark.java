package org.skerry.benchmarks;

import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.OffspringCounter;
import org.skerry.engine.resample.Resampling;
import org.skerry.engine.resample.ResamplingPlanner;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualSplit;
import org.skerry.engine.resample.ResidualTotals;
import org.skerry.engine.resample.WeightQuantiser;

/**
 * Resampling throughput on one thread, from log-weights to offspring counts: quantisation, the
 * driver's plan for one block, and the block's counting pass. Scores are particles per second
 * (one operation = one particle). The log-normaliser is computed once in setup, as it comes
 * from elsewhere in the sampler. Target: at least 5e7 particles/s for SYSTEMATIC at N = 10^6.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
public class ResamplingBenchmark {

    private static final int N = 1_000_000;

    @Param({"SYSTEMATIC", "STRATIFIED", "MULTINOMIAL", "RESIDUAL"})
    public ResamplingScheme scheme;

    private double[] logWeights;
    private double max;
    private double relative;
    private long[] weights;
    private int[] offspring;
    private BlockLayout layout;
    private int iteration;

    @Setup
    public void setUp() {
        Random random = new Random(42);
        logWeights = new double[N];
        for (int i = 0; i < N; i++) {
            // Spread typical of a tempering step: a few orders of magnitude between particles.
            logWeights[i] = 2.0 * random.nextGaussian();
        }
        max = Resampling.maxLogWeight(logWeights, N);
        relative = Resampling.logSumRelative(logWeights, N, max);
        weights = new long[N];
        offspring = new int[N];
        layout = BlockLayout.of(new long[] {0}, new int[] {N});
    }

    @Benchmark
    @OperationsPerInvocation(N)
    public int resample() {
        long total = WeightQuantiser.quantise(logWeights, N, max, relative, weights);
        int step = iteration++ & 0x7FFFFFFF;
        BlockResamplingPlan plan;
        if (scheme == ResamplingScheme.RESIDUAL) {
            ResidualSplit split = ResamplingPlanner.residualSplit(layout, new long[] {total});
            ResidualTotals totals = OffspringCounter.splitResidual(split, weights, N, offspring);
            plan = ResamplingPlanner.planResidual(42, step, layout, split, new ResidualTotals[] {totals})[0];
        } else {
            plan = ResamplingPlanner.plan(scheme, 42, step, layout, new long[] {total})[0];
        }
        OffspringCounter.count(plan, weights, N, offspring);
        return offspring[step % N];
    }
}
