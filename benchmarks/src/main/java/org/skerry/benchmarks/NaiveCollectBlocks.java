package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ConcurrentHashMap;
import java.util.function.Consumer;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockSlot;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.BlockStep;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.resample.Redistribution;
import scala.Tuple2;

/**
 * The same algorithm (the engine's one loop and block steps) with the data flow a first Spark
 * program would have: the driver holds every particle, parameter vectors included. Steps without
 * likelihood calls (reweighting, resampling, moment sums) run on the driver over all blocks; a
 * step that calls the likelihood (initial draw, MH moves) {@code parallelize}s every block, runs
 * on the executors and collects every block back. Every particle thus crosses the wire twice per
 * likelihood pass, against skerry's cached partitions, where only scalars travel.
 *
 * <p>Kept honest: blocks travel through the same Kryo serializer as skerry's, the answer is
 * bit-identical to skerry's, and the executors keep one model per JVM. A step is tried on the
 * driver first with a model whose likelihood refuses ({@link NeedsExecutors}); on a copy, so a
 * refused step leaves nothing behind.
 */
final class NaiveCollectBlocks implements BlockExecutor {

    /** Executor side: one model per source id and JVM, as skerry's own backend does. */
    private static final ConcurrentHashMap<String, Model> MODELS = new ConcurrentHashMap<>();

    private final JavaSparkContext context;
    private final ModelSource source;
    private final Model driverModel;
    private final int count;
    private List<ParticleBlock> blocks = new ArrayList<>();

    NaiveCollectBlocks(JavaSparkContext context, ModelSource source, int count) {
        this.context = context;
        this.source = source;
        this.driverModel = new NoLikelihood(source.create());
        this.count = count;
    }

    @Override
    public int blockCount() {
        return blocks.isEmpty() ? count : blocks.size();
    }

    @Override
    public <R> List<R> create(long[] first, int[] sizes, BlockStep<R> step) {
        List<ParticleBlock> made = new ArrayList<>();
        for (int b = 0; b < sizes.length; b++) {
            made.add(ParticleBlock.indexed(driverModel.dimension(), first[b], sizes[b]));
        }
        blocks = made;
        return update(step);
    }

    @Override
    public <R> List<R> update(BlockStep<R> step) {
        List<ParticleBlock> next = new ArrayList<>(blocks.size());
        List<R> results = new ArrayList<>(blocks.size());
        try {
            ParticleBlock[] copies = new ParticleBlock[blocks.size()];
            for (int b = 0; b < copies.length; b++) {
                copies[b] = blocks.get(b).copy();
                results.add(step.apply(new BlockSlot(b, copies, driverModel, false)));
            }
            next.addAll(List.of(copies));
            blocks = next;
            return results;
        } catch (NeedsExecutors e) {
            return onExecutors(step);
        }
    }

    /** Ships every block to the executors, runs {@code step} there and collects every block back. */
    @SuppressWarnings("unchecked")
    private <R> List<R> onExecutors(BlockStep<R> step) {
        List<Tuple2<Integer, ParticleBlock>> numbered = new ArrayList<>(blocks.size());
        for (int b = 0; b < blocks.size(); b++) {
            numbered.add(new Tuple2<>(b, blocks.get(b)));
        }
        ModelSource shipped = source;
        List<Object[]> back = context.parallelize(numbered, numbered.size()).map(pair -> {
            Model model = MODELS.computeIfAbsent(shipped.id(), id -> shipped.create());
            int number = pair._1();
            ParticleBlock[] slots = new ParticleBlock[number + 1];
            slots[number] = pair._2();
            Object result = step.apply(new BlockSlot(number, slots, model, false));
            return new Object[] {slots[number], result};
        }).collect();
        List<ParticleBlock> next = new ArrayList<>(back.size());
        List<R> results = new ArrayList<>(back.size());
        for (Object[] part : back) {
            next.add((ParticleBlock) part[0]);
            results.add((R) part[1]);
        }
        blocks = next;
        return results;
    }

    @Override
    public <R> List<R> read(BlockStep<R> query) {
        List<R> results = new ArrayList<>(blocks.size());
        ParticleBlock[] current = blocks.toArray(new ParticleBlock[0]);
        for (int b = 0; b < current.length; b++) {
            results.add(query.apply(new BlockSlot(b, current, driverModel, true)));
        }
        return results;
    }

    @Override
    public void exchange(Redistribution plan) {
        blocks = new ArrayList<>(List.of(plan.apply(blocks.toArray(new ParticleBlock[0]))));
    }

    @Override
    public void forEachBlock(Consumer<ParticleBlock> sink) {
        blocks.forEach(sink);
    }

    @Override
    public List<StoredBlock> write(BlockStore store) {
        throw new UnsupportedOperationException("the naive baseline does not checkpoint");
    }

    @Override
    public List<String> read(List<StoredBlock> stored, BlockReader reader) {
        throw new UnsupportedOperationException("the naive baseline does not checkpoint");
    }

    @Override
    public void close() {
        blocks = new ArrayList<>();
    }

    /** Thrown (an Error, so no evaluator counts it as a failed evaluation) when a driver step calls the likelihood. */
    private static final class NeedsExecutors extends Error {
        private static final long serialVersionUID = 1L;

        NeedsExecutors() {
            super(null, null, false, false);
        }
    }

    /** The driver's model: everything but the likelihood, which belongs on the executors. */
    private static final class NoLikelihood implements Model {
        private final Model model;

        NoLikelihood(Model model) {
            this.model = model;
        }

        @Override
        public ParameterSpace parameters() {
            return model.parameters();
        }

        @Override
        public Prior prior() {
            return model.prior();
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new NeedsExecutors();
        }
    }
}
