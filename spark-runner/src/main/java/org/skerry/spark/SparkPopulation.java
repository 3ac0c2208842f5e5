package org.skerry.spark;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import org.apache.spark.TaskContext;
import org.apache.spark.api.java.JavaPairRDD;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.storage.StorageLevel;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.PopulationSnapshot;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.population.block.BlockReading;
import org.skerry.engine.population.block.InitialDraw;
import org.skerry.engine.population.block.IslandResampling;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.population.block.MetropolisHastingsMover;
import org.skerry.engine.population.block.MomentCollector;
import org.skerry.engine.population.block.Reweighting;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.OffspringCounter;
import org.skerry.engine.resample.ParticleExpansion;
import org.skerry.engine.resample.Redistribution;
import org.skerry.engine.resample.ResamplingPlanner;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualSplit;
import org.skerry.engine.resample.ResidualTotals;
import org.skerry.engine.resample.WeightQuantiser;
import scala.Tuple2;


/**
 * A population held by Spark: a cached RDD with one {@link ParticleBlock} per partition, each a
 * contiguous run of global indices. Every step maps the cached states to new ones with the
 * engine's block-side code and caches the result; the states it replaces are dropped once a job
 * has computed the new ones. Parameter vectors stay on the executors until {@link #export()}; the
 * driver receives two scalars per particle for tempering and per-block sums otherwise.
 *
 * <p>Each Spark job costs a fixed latency (tens of milliseconds, more on a cluster) that dominates
 * short iterations, so steps share jobs wherever the data flow allows: reweighting and a
 * checkpoint's read-back are only defined, and computed by the next job; expansion,
 * redistribution and the moment sums after a global resampling are one job; the tempering inputs
 * travel with the reports of the initial draw and of the iteration's last move
 * ({@link #moveLast}). What reaches the driver is unchanged.
 */
final class SparkPopulation implements Population {

    private final JavaSparkContext context;
    private final ModelSource source;
    private final int size;
    private final long seed;
    private int partitions;
    private final int dimension;
    private JavaRDD<PartitionState> states;
    /** States that {@link #states} was defined from, dropped once a job has computed it. */
    private final List<JavaRDD<PartitionState>> replaced = new ArrayList<>();
    /** The tempering inputs of {@link #states}, gathered with the last step's reports, or null. */
    private TemperingInputs deliveredInputs;
    /** Moment sums of {@link #states} at {@link #deliveredMomentsLogTotal}, gathered while resampling, or null. */
    private MomentSums deliveredMoments;
    private double deliveredMomentsLogTotal;

    /** Partitions fetched per job by {@link #export()}: bounds the driver's extra memory. */
    private static final int EXPORT_PARTITIONS_PER_JOB = 16;

    SparkPopulation(JavaSparkContext context, ModelSource source, int size, long seed, int partitions) {
        this.context = context;
        this.source = source;
        this.size = size;
        this.seed = seed;
        this.partitions = partitions;
        this.dimension = source.create().dimension();
    }

    @Override
    public int size() {
        return size;
    }

    /** Number of partitions (blocks). */
    int partitions() {
        return partitions;
    }

    /** The current states' lineage, as Spark prints it (for tests). */
    String lineage() {
        return states.toDebugString();
    }

    /**
     * Makes {@code next} the population without running a job: it is cached when a job first
     * computes it, and the states it replaces are dropped then ({@link #run}).
     */
    private void define(JavaRDD<PartitionState> next) {
        next.persist(StorageLevel.MEMORY_ONLY());
        if (states != null) {
            replaced.add(states);
        }
        states = next;
        deliveredInputs = null;
        deliveredMoments = null;
    }

    /** Runs {@code job}, which computes every partition of the states, then drops the states they replaced. */
    private <T> List<T> run(JavaRDD<T> job) {
        List<T> result = job.collect();
        dropReplaced();
        return result;
    }

    private void dropReplaced() {
        for (JavaRDD<PartitionState> old : replaced) {
            old.unpersist(false);
        }
        replaced.clear();
    }

    /** Defines {@code next}, computes it and returns its reports: one job. */
    private List<Object> commit(JavaRDD<PartitionState> next) {
        define(next);
        return run(states.map(state -> state.report));
    }

    /**
     * Defines {@code next}, computes it and returns its reports together with its tempering inputs,
     * which {@link #temperingInputs()} then hands out without a job of its own.
     */
    private List<Object> commitDeliveringInputs(JavaRDD<PartitionState> next) {
        define(next);
        List<Object[]> parts = run(states.map(SparkPopulation::withInputs));
        List<Object> reports = new ArrayList<>(parts.size());
        for (Object[] part : parts) {
            reports.add(part[0]);
        }
        deliveredInputs = assembleInputs(parts);
        return reports;
    }

    /** Executor side: a partition's {@code {report, log-weights, log-likelihoods}}. */
    private static Object[] withInputs(PartitionState state) {
        return new Object[] {state.report, Arrays.copyOf(state.block.logWeight(), state.block.size()),
            Arrays.copyOf(state.block.logLikelihood(), state.block.size())};
    }

    /** Tempering inputs from per-partition {@code {report, log-weights, log-likelihoods}}, in partition order. */
    private TemperingInputs assembleInputs(List<Object[]> parts) {
        double[] logWeight = new double[size];
        double[] logPrior = new double[size];
        double[] logLikelihood = new double[size];
        int[] blockSizes = new int[parts.size()];
        int offset = 0;
        for (int p = 0; p < parts.size(); p++) {
            double[] partWeights = (double[]) parts.get(p)[1];
            double[] partLikelihoods = (double[]) parts.get(p)[2];
            System.arraycopy(partWeights, 0, logWeight, offset, partWeights.length);
            System.arraycopy(partLikelihoods, 0, logLikelihood, offset, partLikelihoods.length);
            blockSizes[p] = partWeights.length;
            offset += partWeights.length;
        }
        return new TemperingInputs(logWeight, logLikelihood, size, blockSizes);
    }

    @Override
    public EvaluationTally initialise(Prior proposal) {
        if (proposal != null && !(proposal instanceof java.io.Serializable)) {
            throw new IllegalArgumentException("a start proposal for the Spark backend must be Serializable: "
                    + proposal.getClass().getName());
        }
        List<long[]> runs = new ArrayList<>(partitions);
        long first = 0;
        for (int p = 0; p < partitions; p++) {
            int count = size / partitions + (p < size % partitions ? 1 : 0);
            runs.add(new long[] {first, count});
            first += count;
        }
        ModelSource modelSource = source;
        long streamSeed = seed;
        int d = dimension;
        JavaRDD<PartitionState> next = context.parallelize(runs, partitions).map(run -> {
            Model model = ModelCache.get(modelSource);
            int count = (int) run[1];
            ParticleBlock block = new ParticleBlock(d, count);
            block.resize(count);
            for (int i = 0; i < count; i++) {
                block.index()[i] = run[0] + i;
            }
            EvaluationTally tally = InitialDraw.draw(block, proposal,
                    new LikelihoodEvaluator(model, streamSeed, modelSource.evaluationRetries()), streamSeed);
            return new PartitionState(block, tally);
        });
        // The sampler asks for the tempering inputs next: they come with the draw's reports.
        EvaluationTally total = EvaluationTally.NONE;
        for (Object report : commitDeliveringInputs(next)) {
            total = total.plus((EvaluationTally) report);
        }
        return total;
    }

    @Override
    public TemperingInputs temperingInputs() {
        if (deliveredInputs != null) {
            TemperingInputs inputs = deliveredInputs;
            deliveredInputs = null;
            return inputs;
        }
        return assembleInputs(run(states.map(SparkPopulation::withInputs)));
    }

    /** Defined only: the weight totals of a resampling, or the moment sums, compute it. */
    @Override
    public void reweight(double fromTemperature, double toTemperature) {
        define(states.map(state -> {
            ParticleBlock block = state.block.copy();
            Reweighting.reweight(block, fromTemperature, toTemperature);
            return new PartitionState(block, null);
        }));
    }

    /**
     * Two jobs (three for the residual scheme): the partitions' weight totals, then one job that
     * expands the survivors, moves the surplus copies and sums the moments of the result at log N,
     * the log total every resampled population continues with, for {@link #moments}.
     */
    @Override
    public ResamplingReport resample(ResamplingScheme scheme, double logTotal, int iteration) {
        List<long[]> totals = run(states.map(state -> new long[] {
            state.block.size() == 0 ? -1 : state.block.index()[0], state.block.size(),
            WeightQuantiser.quantise(state.block.logWeight(), state.block.size(), logTotal,
                    new long[state.block.size()])}));
        long[] first = new long[partitions];
        int[] sizes = new int[partitions];
        long[] weightTotals = new long[partitions];
        long running = 0;
        for (int p = 0; p < partitions; p++) {
            long[] t = totals.get(p);
            sizes[p] = (int) t[1];
            first[p] = t[1] == 0 ? running : t[0];
            weightTotals[p] = t[2];
            running = first[p] + sizes[p];
        }
        BlockLayout layout = BlockLayout.of(first, sizes);
        BlockResamplingPlan[] plans;
        ResidualSplit split = null;
        if (scheme == ResamplingScheme.RESIDUAL) {
            split = ResamplingPlanner.residualSplit(layout, weightTotals);
            ResidualSplit residual = split;
            List<ResidualTotals> parts = run(states.map(state -> {
                long[] q = new long[state.block.size()];
                WeightQuantiser.quantise(state.block.logWeight(), state.block.size(), logTotal, q);
                return OffspringCounter.splitResidual(residual, q, state.block.size(), new int[state.block.size()]);
            }));
            plans = ResamplingPlanner.planResidual(seed, iteration, layout, split, parts.toArray(new ResidualTotals[0]));
        } else {
            plans = ResamplingPlanner.plan(scheme, seed, iteration, layout, weightTotals);
        }
        BlockResamplingPlan[] sentPlans = plans;
        ResidualSplit sentSplit = split;
        long start = System.nanoTime();
        define(states.mapPartitionsWithIndex((p, iterator) -> {
            PartitionState state = iterator.next();
            ParticleBlock block = state.block;
            long[] q = new long[block.size()];
            WeightQuantiser.quantise(block.logWeight(), block.size(), logTotal, q);
            int[] offspring = new int[block.size()];
            if (sentSplit != null) {
                OffspringCounter.splitResidual(sentSplit, q, block.size(), offspring);
            }
            OffspringCounter.count(sentPlans[p], q, block.size(), offspring);
            long distinct = ParticleExpansion.distinctAncestors(offspring, block.size());
            ParticleBlock children = ParticleExpansion.expand(block, offspring, sentPlans[p].firstNewIndex());
            return List.of(new PartitionState(children, distinct)).iterator();
        }, true));
        Redistribution redistribution = Redistribution.plan(ResamplingPlanner.expandedLayout(plans));
        if (redistribution.transferCount() > 0) {
            define(redistributed(redistribution));
        }
        double logN = StrictMath.log(size);
        ModelSource modelSource = source;
        long distinct = 0;
        MomentSums moments = new MomentSums(dimension);
        for (Object[] part : run(states.map(state -> new Object[] {state.report,
            MomentCollector.collect(state.block, ModelCache.get(modelSource).parameters(), logN)}))) {
            distinct += (Long) part[0];
            moments.merge((MomentSums) part[1]);
        }
        deliveredMoments = moments;
        deliveredMomentsLogTotal = logN;
        return new ResamplingReport(distinct, redistribution.movedCount(), (System.nanoTime() - start) * 1e-9);
    }

    /**
     * The expanded states rebalanced: only the runs the plan names move; each partition keeps the
     * part of its run it will hold, and its expansion's report (the distinct ancestors).
     */
    private JavaRDD<PartitionState> redistributed(Redistribution plan) {
        JavaRDD<Tuple2<Integer, ParticleBlock>> outgoing = states.mapPartitionsWithIndex((p, iterator) -> {
            ParticleBlock block = iterator.next().block;
            List<Tuple2<Integer, ParticleBlock>> runs = new ArrayList<>();
            for (int t = 0; t < plan.transferCount(); t++) {
                if (plan.fromBlock(t) == p) {
                    int from = (int) (plan.runFirstIndex(t) - block.index()[0]);
                    runs.add(new Tuple2<>(plan.toBlock(t), BlockSlices.slice(block, from, plan.runCount(t))));
                }
            }
            return runs.iterator();
        }, true);
        JavaRDD<ParticleBlock> incoming = JavaPairRDD.fromJavaRDD(outgoing).partitionBy(new BlockPartitioner(partitions))
                .values();
        int d = dimension;
        return states.zipPartitions(incoming,
                (Iterator<PartitionState> own, Iterator<ParticleBlock> arriving) -> {
                    int p = TaskContext.getPartitionId();
                    PartitionState state = own.next();
                    ParticleBlock block = state.block;
                    long targetFirst = plan.targetFirstIndex(p);
                    long targetEnd = targetFirst + plan.targetSize(p);
                    List<ParticleBlock> pieces = new ArrayList<>();
                    if (block.size() > 0) {
                        long keepFirst = Math.max(targetFirst, block.index()[0]);
                        long keepEnd = Math.min(targetEnd, block.index()[0] + block.size());
                        if (keepEnd > keepFirst) {
                            pieces.add(BlockSlices.slice(block, (int) (keepFirst - block.index()[0]),
                                    (int) (keepEnd - keepFirst)));
                        }
                    }
                    arriving.forEachRemaining(pieces::add);
                    return List.of(new PartitionState(BlockSlices.join(d, pieces), state.report)).iterator();
                });
    }

    @Override
    public ResamplingReport resampleIslands(ResamplingScheme scheme, int iteration) {
        long streamSeed = seed;
        long distinct = 0;
        for (Object report : commit(states.map(state -> {
            IslandResampling.Result result = IslandResampling.resample(state.block, scheme, streamSeed, iteration);
            return new PartitionState(result.block(), result.distinctAncestors());
        }))) {
            distinct += (Long) report;
        }
        return new ResamplingReport(distinct, 0);
    }

    /** No job when the global resampling just before summed them at this log total. */
    @Override
    public MomentSums moments(double logTotal) {
        if (deliveredMoments != null
                && Double.doubleToRawLongBits(logTotal) == Double.doubleToRawLongBits(deliveredMomentsLogTotal)) {
            MomentSums moments = deliveredMoments;
            deliveredMoments = null;
            return moments;
        }
        ModelSource modelSource = source;
        List<MomentSums> parts = run(states.map(state -> MomentCollector.collect(state.block,
                ModelCache.get(modelSource).parameters(), logTotal)));
        MomentSums total = new MomentSums(dimension);
        parts.forEach(total::merge);
        return total;
    }

    @Override
    public MoveTally move(Proposal proposal, double temperature, int iteration, int firstStep, int steps) {
        return total(commit(moved(proposal, temperature, iteration, firstStep, steps)));
    }

    /** The same moves; the next iteration's tempering inputs come back in the same job. */
    @Override
    public MoveTally moveLast(Proposal proposal, double temperature, int iteration, int firstStep, int steps) {
        return total(commitDeliveringInputs(moved(proposal, temperature, iteration, firstStep, steps)));
    }

    private JavaRDD<PartitionState> moved(Proposal proposal, double temperature, int iteration, int firstStep,
            int steps) {
        ModelSource modelSource = source;
        long streamSeed = seed;
        return states.map(state -> {
            ParticleBlock block = state.block.copy();
            MoveTally tally = MetropolisHastingsMover.move(block, proposal, temperature, iteration, firstStep, steps,
                    new LikelihoodEvaluator(ModelCache.get(modelSource), streamSeed,
                            modelSource.evaluationRetries()), streamSeed);
            return new PartitionState(block, tally);
        });
    }

    private static MoveTally total(List<Object> reports) {
        MoveTally total = MoveTally.NONE;
        for (Object report : reports) {
            total = total.plus((MoveTally) report);
        }
        return total;
    }

    @Override
    public FinalParticles export() {
        deliveredInputs = null;
        deliveredMoments = null;
        double[] values = new double[size * dimension];
        double[] logWeight = new double[size];
        double[] logPrior = new double[size];
        double[] logLikelihood = new double[size];
        long[] index = new long[size];
        long[] eve = new long[size];
        // A few partitions per job, so the driver never holds every block and the output at once.
        JavaRDD<ParticleBlock> blocks = states.map(state -> state.block);
        for (int from = 0; from < partitions; from += EXPORT_PARTITIONS_PER_JOB) {
            int[] ids = new int[Math.min(EXPORT_PARTITIONS_PER_JOB, partitions - from)];
            for (int k = 0; k < ids.length; k++) {
                ids[k] = from + k;
            }
            for (List<ParticleBlock> part : blocks.collectPartitions(ids)) {
                for (ParticleBlock block : part) {
                    copyOut(block, values, logWeight, logPrior, logLikelihood, index, eve);
                }
            }
        }
        dropReplaced();
        return new FinalParticles(dimension, size, values, logWeight, logPrior, logLikelihood, index, eve);
    }

    /** Places a block's particles at their global indices (always a permutation of 0..N−1). */
    private void copyOut(ParticleBlock block, double[] values, double[] logWeight, double[] logPrior,
            double[] logLikelihood, long[] index, long[] eve) {
        for (int i = 0; i < block.size(); i++) {
            int at = (int) block.index()[i];
            System.arraycopy(block.values(), i * dimension, values, at * dimension, dimension);
            logWeight[at] = block.logWeight()[i];
            logPrior[at] = block.logPrior()[i];
            logLikelihood[at] = block.logLikelihood()[i];
            index[at] = block.index()[i];
            eve[at] = block.eve()[i];
        }
    }

    /**
     * Executors write their own blocks in parallel (one job); then the population is redefined as
     * those files read back, which cuts its lineage: a lost partition is read back from the
     * checkpoint instead of being recomputed from the initial draw. The read-back is computed by
     * the next job; the old states are dropped at once, since the files now hold the population.
     * The tempering inputs and moment sums gathered before stay valid: the particles are the same.
     */
    @Override
    public List<StoredBlock> writeBlocks(BlockStore store) {
        List<StoredBlock> stored = run(states.mapPartitionsWithIndex((p, iterator) ->
                List.of(store.write(p, iterator.next().block)).iterator(), true));
        TemperingInputs inputs = deliveredInputs;
        MomentSums moments = deliveredMoments;
        String location = store.location();
        define(fromFiles(store, stored).map(state -> {
            if (state.report != null) {
                throw new java.io.UncheckedIOException(new java.io.IOException("the checkpoint just written to "
                        + location + " does not read back: " + state.report));
            }
            return state;
        }));
        dropReplaced();
        partitions = stored.size();
        deliveredInputs = inputs;
        deliveredMoments = moments;
        return stored;
    }

    @Override
    public List<String> readBlocks(BlockStore store, List<StoredBlock> stored) {
        long particles = 0;
        for (StoredBlock block : stored) {
            particles += block.particles();
        }
        if (particles != size) {
            return List.of("the checkpoint's blocks hold " + particles + " particles; the run has " + size);
        }
        JavaRDD<PartitionState> next = fromFiles(store, stored);
        next.persist(StorageLevel.MEMORY_ONLY());
        List<String> problems = new ArrayList<>();
        for (Object report : next.map(state -> state.report).collect()) {
            if (report != null) {
                problems.add((String) report);
            }
        }
        if (!problems.isEmpty()) {
            next.unpersist(false);
            return problems;
        }
        define(next);
        dropReplaced();
        partitions = stored.size();
        return problems;
    }

    /** The blocks in {@code stored} as states, each with what is wrong with its file as report (null when nothing). */
    private JavaRDD<PartitionState> fromFiles(BlockStore store, List<StoredBlock> stored) {
        long[] first = new long[stored.size()];
        long running = 0;
        for (int b = 0; b < stored.size(); b++) {
            first[b] = running;
            running += stored.get(b).particles();
        }
        int d = dimension;
        return context.parallelize(stored, stored.size()).mapPartitionsWithIndex((p, iterator) -> {
            BlockReading.Outcome outcome = BlockReading.read(store, iterator.next(), first[p], d);
            return List.of(new PartitionState(outcome.block(), outcome.problem())).iterator();
        }, true);
    }

    @Override
    public PopulationSnapshot snapshot() {
        return new PopulationSnapshot(run(states.map(state -> state.block)));
    }

    @Override
    public void restore(PopulationSnapshot snapshot) {
        List<ParticleBlock> blocks = snapshot.blocks();
        if (snapshot.size() != size || blocks.size() != partitions) {
            throw new IllegalArgumentException("snapshot holds " + snapshot.size() + " particles in " + blocks.size()
                    + " blocks; population has " + size + " in " + partitions);
        }
        commit(context.parallelize(blocks, partitions).map(block -> new PartitionState(block, null)));
    }

    @Override
    public void close() {
        dropReplaced();
        if (states != null) {
            states.unpersist(false);
            states = null;
        }
        deliveredInputs = null;
        deliveredMoments = null;
    }
}
