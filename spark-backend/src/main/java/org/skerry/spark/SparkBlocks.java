package org.skerry.spark;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.function.Consumer;
import org.apache.spark.TaskContext;
import org.apache.spark.api.java.JavaPairRDD;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.storage.StorageLevel;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockCursor;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.BlockStep;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.population.block.BlockReading;
import org.skerry.engine.resample.Redistribution;
import scala.Tuple2;

/**
 * A population's blocks held by Spark: a cached RDD with one {@link ParticleBlock} per partition.
 * Each step is one job that maps the cached states to new ones and collects their typed results;
 * the states it replaces are dropped once that job has computed the new ones. An exchange of
 * particles between partitions is only defined, and computed (with its shuffle) by the next job;
 * its result is not cached, since that job's own result is.
 * The model source reaches each executor once, as a broadcast.
 */
final class SparkBlocks implements BlockExecutor {

    private static final String MAX_RESULT_SIZE = "spark.driver.maxResultSize";

    private final JavaSparkContext context;
    private final Broadcast<ModelShipment> source;
    private final int dimension;
    private int partitions;
    private JavaRDD<PartitionState<?>> states;
    /** States that {@link #states} was defined from, dropped once a job has computed it. */
    private final List<JavaRDD<PartitionState<?>>> replaced = new ArrayList<>();

    SparkBlocks(JavaSparkContext context, ModelSource source, int dimension, int partitions) {
        this.context = context;
        this.source = context.broadcast(new ModelShipment(source));
        this.dimension = dimension;
        this.partitions = partitions;
    }

    @Override
    public int blockCount() {
        return partitions;
    }

    /** The current states' lineage, as Spark prints it (for tests). */
    String lineage() {
        return states.toDebugString();
    }

    @Override
    public <R> List<R> create(long[] first, int[] sizes, BlockStep<R> step) {
        List<long[]> runs = new ArrayList<>(sizes.length);
        for (int b = 0; b < sizes.length; b++) {
            runs.add(new long[] {first[b], sizes[b]});
        }
        int d = dimension;
        Broadcast<ModelShipment> model = source;
        JavaRDD<PartitionState<?>> next = context.parallelize(runs, runs.size()).mapPartitionsWithIndex((p, it) -> {
            long[] run = it.next();
            ParticleBlock block = ParticleBlock.indexed(d, run[0], (int) run[1]);
            return List.<PartitionState<?>>of(applyTo(p, block, true, step, model)).iterator();
        }, true);
        partitions = runs.size();
        return commit(next);
    }

    @Override
    public <R> List<R> update(BlockStep<R> step) {
        Broadcast<ModelShipment> model = source;
        // Blocks of uncached states (an exchange's joins) are fresh objects no cache holds: the
        // step may change them in place instead of copying.
        boolean owned = !cached(states);
        return commit(states.mapPartitionsWithIndex((p, it) ->
                List.<PartitionState<?>>of(applyTo(p, it.next().block, owned, step, model)).iterator(), true));
    }

    @Override
    public <R> List<R> read(BlockStep<R> query) {
        Broadcast<ModelShipment> model = source;
        List<R> results = states.mapPartitionsWithIndex((p, it) -> {
            ParticleBlock block = it.next().block;
            return List.of(query.apply(new Cursor(p, block, false, model, true))).iterator();
        }, true).collect();
        dropReplaced();
        return results;
    }

    /** Executor side: runs {@code step} on a partition's block and keeps its result with the new state. */
    private static <R> PartitionState<R> applyTo(int partition, ParticleBlock block, boolean owned, BlockStep<R> step,
            Broadcast<ModelShipment> model) {
        Cursor cursor = new Cursor(partition, block, owned, model, false);
        R report = step.apply(cursor);
        return new PartitionState<>(cursor.result(), report);
    }

    /** Defines {@code next} as the states, computes it in one job and returns its results in partition order. */
    @SuppressWarnings("unchecked")
    private <R> List<R> commit(JavaRDD<PartitionState<?>> next) {
        define(next);
        List<R> results = new ArrayList<>(partitions);
        for (Object report : states.map(state -> state.report).collect()) {
            results.add((R) report);
        }
        dropReplaced();
        return results;
    }

    /**
     * Makes {@code next} the states without running a job: it is cached when a job first
     * computes it, and the states it replaces are dropped then.
     */
    private void define(JavaRDD<PartitionState<?>> next) {
        define(next, true);
    }

    /** As {@link #define(JavaRDD)}, {@code next} cached only when {@code cache}. */
    private void define(JavaRDD<PartitionState<?>> next, boolean cache) {
        if (cache) {
            next.persist(StorageLevel.MEMORY_ONLY());
        }
        if (states != null) {
            replaced.add(states);
        }
        states = next;
    }

    private static boolean cached(JavaRDD<?> rdd) {
        return rdd.getStorageLevel().useMemory();
    }

    /**
     * Drops the states the current ones replaced, once the current ones are cached: uncached
     * states (an exchange not yet followed by a step) are recomputed from those they replaced.
     */
    private void dropReplaced() {
        if (states != null && !cached(states)) {
            return;
        }
        for (JavaRDD<PartitionState<?>> old : replaced) {
            old.unpersist(false);
        }
        replaced.clear();
    }

    /**
     * Only the runs the plan names move; each partition keeps the part of its run it will hold,
     * and its last result.
     */
    @Override
    public void exchange(Redistribution plan) {
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
        // Not cached: the next step (a move) runs on the joined blocks and caches its own result,
        // so an executor holds two copies of its block during a step, not three. Until then the
        // states before the exchange stay cached (dropReplaced waits for cached states).
        define(states.zipPartitions(incoming, (Iterator<PartitionState<?>> own, Iterator<ParticleBlock> arriving) -> {
            int p = TaskContext.getPartitionId();
            PartitionState<?> state = own.next();
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
            return List.<PartitionState<?>>of(new PartitionState<>(BlockSlices.join(d, pieces), state.report))
                    .iterator();
        }), false);
    }

    @Override
    public void forEachBlock(Consumer<ParticleBlock> sink) {
        // Jobs of bounded bytes: each fetches runs of particles from a few partitions, a large
        // partition split over several jobs, so neither one task's result nor one job's results
        // together come near spark.driver.maxResultSize, whatever N is.
        List<Long> shapes = states.map(state -> (long) state.block.auxiliaryWidth() << 32 | state.block.size()).collect();
        long auxiliaryWidth = shapes.stream().mapToLong(shape -> shape >>> 32).max().orElse(0L);
        long bytesPerParticle = Double.BYTES * (dimension + 3L + auxiliaryWidth) + 2L * Long.BYTES;
        long perJob = Math.max(1L, fetchBudgetBytes(context.getConf().getSizeAsBytes(MAX_RESULT_SIZE, "1g"))
                / bytesPerParticle);
        int[] from = new int[partitions];
        int[] count = new int[partitions];
        List<Integer> ids = new ArrayList<>();
        long room = perJob;
        for (int p = 0; p < partitions; p++) {
            int size = (int) (long) shapes.get(p);
            int start = 0;
            while (start < size) {
                int take = (int) Math.min(size - start, room);
                from[p] = start;
                count[p] = take;
                ids.add(p);
                start += take;
                room -= take;
                if (room == 0) {
                    fetch(ids, from, count, sink);
                    room = perJob;
                }
            }
        }
        fetch(ids, from, count, sink);
        dropReplaced();
    }

    /** The share of the driver's result limit one export job may fetch: an eighth, at most 64 MiB. */
    static long fetchBudgetBytes(long maxResultSize) {
        long ceiling = 64L << 20;
        return maxResultSize <= 0 ? ceiling : Math.min(ceiling, maxResultSize / 8);
    }

    /** One job: run {@code [from[p], from[p]+count[p])} of each partition p in {@code ids}, handed on in order. */
    private void fetch(List<Integer> ids, int[] from, int[] count, Consumer<ParticleBlock> sink) {
        if (ids.isEmpty()) {
            return;
        }
        int[] starts = from.clone();
        int[] counts = count.clone();
        int[] partitionIds = ids.stream().mapToInt(Integer::intValue).toArray();
        JavaRDD<ParticleBlock> runs = states.mapPartitionsWithIndex((p, iterator) -> {
            ParticleBlock block = iterator.next().block;
            return List.of(BlockSlices.slice(block, starts[p], counts[p])).iterator();
        }, true);
        for (List<ParticleBlock> part : runs.collectPartitions(partitionIds)) {
            part.forEach(sink);
        }
        ids.clear();
    }

    /**
     * Executors write their own blocks in parallel (one job); then the states are redefined as
     * those files read back, which cuts their lineage: a lost partition is read back from the
     * checkpoint instead of being recomputed from the initial draw. The read-back is computed by
     * the next job; the old states are dropped at once, since the files now hold the population.
     */
    @Override
    public List<StoredBlock> write(BlockStore store) {
        List<StoredBlock> stored = states.mapPartitionsWithIndex((p, iterator) ->
                List.of(store.write(p, iterator.next().block)).iterator(), true).collect();
        dropReplaced();
        int d = dimension;
        String location = store.location();
        long[] first = StoredBlock.firstIndices(stored);
        define(fromFiles(stored, (number, block) -> BlockReading.read(store, block, first[number], d)).map(state -> {
            if (state.report != null) {
                throw new java.io.UncheckedIOException(new java.io.IOException("the checkpoint just written to "
                        + location + " does not read back: " + state.report));
            }
            return state;
        }));
        dropReplaced();
        partitions = stored.size();
        return stored;
    }

    @Override
    public List<String> read(List<StoredBlock> stored, BlockReader reader) {
        JavaRDD<PartitionState<?>> next = fromFiles(stored, reader);
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
    private JavaRDD<PartitionState<?>> fromFiles(List<StoredBlock> stored, BlockReader reader) {
        return context.parallelize(stored, stored.size()).mapPartitionsWithIndex((p, iterator) -> {
            BlockReading.Outcome outcome = reader.read(p, iterator.next());
            return List.<PartitionState<?>>of(new PartitionState<>(outcome.block(), outcome.problem())).iterator();
        }, true);
    }

    @Override
    public void close() {
        for (JavaRDD<PartitionState<?>> old : replaced) {
            old.unpersist(false);
        }
        replaced.clear();
        if (states != null) {
            states.unpersist(false);
            states = null;
        }
        ModelCache.release(source.value().source.id());
        source.destroy();
    }

    /**
     * Executor side: one partition's block for a step. A step that changes particles gets a
     * private copy, so the cached state it came from stays as it was (Spark may recompute from it).
     */
    private static final class Cursor implements BlockCursor {
        private final int number;
        private final ParticleBlock original;
        private final boolean owned;
        private final Broadcast<ModelShipment> source;
        private final boolean readOnly;
        private ParticleBlock result;

        Cursor(int number, ParticleBlock original, boolean owned, Broadcast<ModelShipment> source, boolean readOnly) {
            this.number = number;
            this.original = original;
            this.owned = owned;
            this.source = source;
            this.readOnly = readOnly;
            this.result = original;
        }

        @Override
        public int number() {
            return number;
        }

        @Override
        public ParticleBlock current() {
            return result;
        }

        @Override
        public ParticleBlock block() {
            if (readOnly) {
                throw new IllegalStateException("a query must not change block " + number);
            }
            if (result == original && !owned) {
                result = original.copy();
            }
            return result;
        }

        @Override
        public void replace(ParticleBlock replacement) {
            if (readOnly) {
                throw new IllegalStateException("a query must not replace block " + number);
            }
            result = replacement;
        }

        @Override
        public Model model() {
            return ModelCache.get(source.value().source);
        }

        ParticleBlock result() {
            return result;
        }
    }
}
