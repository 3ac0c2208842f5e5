package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.PopulationSnapshot;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.population.block.InitialDraw;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.population.block.MetropolisHastingsMover;
import org.skerry.engine.population.block.MomentCollector;
import org.skerry.engine.population.block.Reweighting;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.OffspringCounter;
import org.skerry.engine.resample.ParticleExpansion;
import org.skerry.engine.resample.ResamplingPlanner;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualSplit;
import org.skerry.engine.resample.ResidualTotals;
import org.skerry.engine.resample.WeightQuantiser;

/**
 * The same tempered SMC algorithm (the engine's one loop, the engine's block-side code) with the
 * data flow a first Spark program would have: the driver holds every particle, parameter vectors
 * included, as one block. Reweighting, resampling and moment sums run on the driver over all N
 * particles; each likelihood pass (initial draw, MH steps) cuts the population into blocks,
 * {@code parallelize}s them, and collects the moved blocks back. Every particle thus crosses the
 * wire twice per move phase, against skerry's cached partitions, where only scalars travel.
 *
 * <p>Kept honest: the arrays are copied with {@code System.arraycopy}, blocks travel through the
 * same Kryo serializer as skerry's, the driver resamples with the same planner on a one-block
 * layout (so the answer is bit-identical to skerry's), and the executors keep one model per JVM.
 */
final class NaiveCollectPopulation implements Population {

    /** Executor side: one model per source id and JVM, as skerry's own backend does. */
    private static final ConcurrentHashMap<String, Model> MODELS = new ConcurrentHashMap<>();

    private final JavaSparkContext context;
    private final ModelSource source;
    private final Model model;
    private final int size;
    private final long seed;
    private final int partitions;
    private final int dimension;
    private ParticleBlock all;

    NaiveCollectPopulation(JavaSparkContext context, ModelSource source, int size, long seed, int partitions) {
        this.context = context;
        this.source = source;
        this.model = source.create();
        this.size = size;
        this.seed = seed;
        this.partitions = partitions;
        this.dimension = model.dimension();
    }

    private static Model model(ModelSource source) {
        return MODELS.computeIfAbsent(source.id(), id -> source.create());
    }

    @Override
    public int size() {
        return size;
    }

    /** Particles {@code [from, from+count)} of the driver's block, as a block of their own. */
    private ParticleBlock cut(int from, int count) {
        int d = dimension;
        double[] values = new double[count * d];
        System.arraycopy(all.values(), from * d, values, 0, count * d);
        return new ParticleBlock(d, count, values, copy(all.logPrior(), from, count),
                copy(all.logLikelihood(), from, count), copy(all.logWeight(), from, count),
                copy(all.index(), from, count), copy(all.eve(), from, count));
    }

    private static double[] copy(double[] array, int from, int count) {
        double[] out = new double[count];
        System.arraycopy(array, from, out, 0, count);
        return out;
    }

    private static long[] copy(long[] array, int from, int count) {
        long[] out = new long[count];
        System.arraycopy(array, from, out, 0, count);
        return out;
    }

    /** The collected blocks, which arrive in partition order, joined back into one. */
    private ParticleBlock join(List<ParticleBlock> blocks) {
        ParticleBlock joined = new ParticleBlock(dimension, size);
        joined.resize(size);
        int at = 0;
        for (ParticleBlock block : blocks) {
            int n = block.size();
            System.arraycopy(block.values(), 0, joined.values(), at * dimension, n * dimension);
            System.arraycopy(block.logPrior(), 0, joined.logPrior(), at, n);
            System.arraycopy(block.logLikelihood(), 0, joined.logLikelihood(), at, n);
            System.arraycopy(block.logWeight(), 0, joined.logWeight(), at, n);
            System.arraycopy(block.index(), 0, joined.index(), at, n);
            System.arraycopy(block.eve(), 0, joined.eve(), at, n);
            at += n;
        }
        return joined;
    }

    private int first(int p) {
        return (int) ((long) size * p / partitions);
    }

    @Override
    public EvaluationTally initialise(Prior proposal) {
        List<long[]> runs = new ArrayList<>();
        for (int p = 0; p < partitions; p++) {
            runs.add(new long[] {first(p), first(p + 1) - first(p)});
        }
        ModelSource modelSource = source;
        long streamSeed = seed;
        int d = dimension;
        List<Object[]> results = context.parallelize(runs, partitions).map(run -> {
            int count = (int) run[1];
            ParticleBlock block = new ParticleBlock(d, count);
            block.resize(count);
            for (int i = 0; i < count; i++) {
                block.index()[i] = run[0] + i;
            }
            EvaluationTally tally = InitialDraw.draw(block, proposal,
                    new LikelihoodEvaluator(model(modelSource), streamSeed), streamSeed);
            return new Object[] {block, tally};
        }).collect();
        List<ParticleBlock> blocks = new ArrayList<>();
        EvaluationTally total = EvaluationTally.NONE;
        for (Object[] result : results) {
            blocks.add((ParticleBlock) result[0]);
            total = total.plus((EvaluationTally) result[1]);
        }
        all = join(blocks);
        return total;
    }

    @Override
    public TemperingInputs temperingInputs() {
        return new TemperingInputs(copy(all.logWeight(), 0, size), copy(all.logLikelihood(), 0, size), size);
    }

    @Override
    public void reweight(double fromTemperature, double toTemperature) {
        Reweighting.reweight(all, fromTemperature, toTemperature);
    }

    @Override
    public ResamplingReport resample(ResamplingScheme scheme, double logTotal, int iteration) {
        long[] q = new long[size];
        long total = WeightQuantiser.quantise(all.logWeight(), size, logTotal, q);
        BlockLayout layout = BlockLayout.of(new long[] {0}, new int[] {size});
        int[] offspring = new int[size];
        BlockResamplingPlan plan;
        if (scheme == ResamplingScheme.RESIDUAL) {
            ResidualSplit split = ResamplingPlanner.residualSplit(layout, new long[] {total});
            ResidualTotals totals = OffspringCounter.splitResidual(split, q, size, offspring);
            plan = ResamplingPlanner.planResidual(seed, iteration, layout, split, new ResidualTotals[] {totals})[0];
        } else {
            plan = ResamplingPlanner.plan(scheme, seed, iteration, layout, new long[] {total})[0];
        }
        OffspringCounter.count(plan, q, size, offspring);
        long distinct = ParticleExpansion.distinctAncestors(offspring, size);
        all = ParticleExpansion.expand(all, offspring, plan.firstNewIndex());
        // No blocks to rebalance: the next likelihood pass ships every particle anyway.
        return new ResamplingReport(distinct, 0);
    }

    @Override
    public ResamplingReport resampleIslands(ResamplingScheme scheme, int iteration) {
        throw new UnsupportedOperationException("the naive baseline has no island mode");
    }

    @Override
    public MomentSums moments(double logTotal) {
        return MomentCollector.collect(all, model.parameters(), logTotal);
    }

    @Override
    public MoveTally move(Proposal proposal, double temperature, int iteration, int firstStep, int steps) {
        List<ParticleBlock> blocks = new ArrayList<>(partitions);
        for (int p = 0; p < partitions; p++) {
            blocks.add(cut(first(p), first(p + 1) - first(p)));
        }
        ModelSource modelSource = source;
        long streamSeed = seed;
        List<Object[]> results = context.parallelize(blocks, partitions).map(block -> {
            MoveTally tally = MetropolisHastingsMover.move(block, proposal, temperature, iteration, firstStep, steps,
                    new LikelihoodEvaluator(model(modelSource), streamSeed), streamSeed);
            return new Object[] {block, tally};
        }).collect();
        blocks.clear();
        MoveTally total = MoveTally.NONE;
        for (Object[] result : results) {
            blocks.add((ParticleBlock) result[0]);
            total = total.plus((MoveTally) result[1]);
        }
        all = join(blocks);
        return total;
    }

    @Override
    public FinalParticles export() {
        return new FinalParticles(dimension, size, copy(all.values(), 0, size * dimension),
                copy(all.logWeight(), 0, size), copy(all.logPrior(), 0, size), copy(all.logLikelihood(), 0, size),
                copy(all.index(), 0, size), copy(all.eve(), 0, size));
    }

    /** The baseline measures a run without checkpoints; it has none to write. */
    @Override
    public List<org.skerry.engine.population.StoredBlock> writeBlocks(org.skerry.engine.population.BlockStore store) {
        throw new UnsupportedOperationException("the naive baseline does not write checkpoints");
    }

    @Override
    public List<String> readBlocks(org.skerry.engine.population.BlockStore store,
            List<org.skerry.engine.population.StoredBlock> blocks) {
        throw new UnsupportedOperationException("the naive baseline does not read checkpoints");
    }

    @Override
    public PopulationSnapshot snapshot() {
        return new PopulationSnapshot(List.of(all.copy()));
    }

    @Override
    public void restore(PopulationSnapshot snapshot) {
        all = join(snapshot.blocks());
    }

    @Override
    public void close() {
        all = null;
    }
}
