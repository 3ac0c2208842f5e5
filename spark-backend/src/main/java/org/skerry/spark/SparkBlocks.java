package org.skerry.spark;

import java.util.ArrayList;
import java.util.Arrays;
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
 * A population's blocks held by Spark: a cached RDD whose partitions each hold a group of
 * consecutive blocks ({@link TaskGrouping}: one block, or a group per executor worked through by
 * threads). Each step is one job that maps the cached states to new ones and collects their typed
 * results, in block order; the states it replaces are dropped once that job has computed the new
 * ones. An exchange of particles between blocks is only defined, and computed (with its shuffle,
 * which carries only the runs that leave their group) by the next job; its result is not cached,
 * since that job's own result is. The model source reaches each executor once, as a broadcast.
 */
final class SparkBlocks implements BlockExecutor {

    private static final String MAX_RESULT_SIZE = "spark.driver.maxResultSize";

    private final JavaSparkContext context;
    private final Broadcast<ModelShipment> source;
    private final int dimension;
    private final TaskGrouping grouping;
    /** Threads a task works its group with: spark.task.cpus when grouped, else 1. */
    private final int threads;
    private int blocks;
    /** Group starts in block numbers, then the block count ({@link TaskGrouping#starts}). */
    private int[] starts;
    private JavaRDD<PartitionState> states;
    /** States that {@link #states} was defined from, dropped once a job has computed it. */
    private final List<JavaRDD<PartitionState>> replaced = new ArrayList<>();

    SparkBlocks(JavaSparkContext context, ModelSource source, int dimension, int blocks, TaskGrouping grouping) {
        this.context = context;
        this.source = context.broadcast(new ModelShipment(source));
        this.dimension = dimension;
        this.grouping = grouping;
        this.threads = grouping.isPerBlock() ? 1 : Math.max(1, context.getConf().getInt("spark.task.cpus", 1));
        regroup(blocks);
    }

    /** Groups for {@code count} blocks: as many as Spark runs tasks at once when grouped per executor. */
    private void regroup(int count) {
        int slots = Math.max(1, context.defaultParallelism() / Math.max(1, context.getConf().getInt("spark.task.cpus",
                1)));
        blocks = count;
        starts = TaskGrouping.starts(count, grouping.groupsFor(count, slots));
    }

    private int groups() {
        return starts.length - 1;
    }

    @Override
    public int blockCount() {
        return blocks;
    }

    /** Tasks per step (for tests). */
    int groupCount() {
        return groups();
    }

    /** The current states' lineage, as Spark prints it (for tests). */
    String lineage() {
        return states.toDebugString();
    }

    @Override
    public <R> List<R> create(long[] first, int[] sizes, BlockStep<R> step) {
        regroup(sizes.length);
        List<long[]> runs = new ArrayList<>(sizes.length);
        for (int b = 0; b < sizes.length; b++) {
            runs.add(new long[] {first[b], sizes[b]});
        }
        int d = dimension;
        int[] start = starts;
        int workers = threads;
        Broadcast<ModelShipment> model = source;
        // parallelize slices a list as TaskGrouping.starts does, so partition g gets group g's runs.
        JavaRDD<PartitionState> next = context.parallelize(runs, groups()).mapPartitionsWithIndex((g, it) -> {
            List<ParticleBlock> made = new ArrayList<>();
            it.forEachRemaining(run -> made.add(ParticleBlock.indexed(d, run[0], (int) run[1])));
            checkGroup(g, made.size(), start);
            PartitionState fresh = new PartitionState(made.toArray(new ParticleBlock[0]), null, all(made.size()));
            return List.of(applyTo(start[g], fresh, step, model, workers, false)).iterator();
        }, true);
        return commit(next);
    }

    @Override
    public <R> List<R> update(BlockStep<R> step) {
        Broadcast<ModelShipment> model = source;
        int[] start = starts;
        int workers = threads;
        return commit(states.mapPartitionsWithIndex((g, it) ->
                List.of(applyTo(start[g], it.next(), step, model, workers, false)).iterator(), true));
    }

    @Override
    public <R> List<R> read(BlockStep<R> query) {
        Broadcast<ModelShipment> model = source;
        int[] start = starts;
        int workers = threads;
        List<Object[]> results = states.mapPartitionsWithIndex((g, it) ->
                java.util.Collections.singletonList(
                        applyTo(start[g], it.next(), query, model, workers, true).reports).iterator(), true).collect();
        dropReplaced();
        return flatten(results);
    }

    private static boolean[] all(int count) {
        boolean[] fresh = new boolean[count];
        Arrays.fill(fresh, true);
        return fresh;
    }

    private static void checkGroup(int group, int count, int[] start) {
        if (count != start[group + 1] - start[group]) {
            throw new IllegalStateException("partition " + group + " holds " + count + " blocks, expected "
                    + (start[group + 1] - start[group]));
        }
    }

    /**
     * Executor side: runs {@code step} on each block of a partition's group, on up to
     * {@code workers} threads, and keeps the results with the new state.
     */
    private static PartitionState applyTo(int firstBlock, PartitionState state, BlockStep<?> step,
            Broadcast<ModelShipment> model, int workers, boolean readOnly) {
        int count = state.blocks.length;
        if (workers > 1 && count > 1) {
            // Built (once per JVM) on the task's own thread, where Spark's task context is set: a
            // model that cannot be built fails here, as it would with a task per block.
            ModelCache.get(model.value().source);
        }
        ParticleBlock[] next = new ParticleBlock[count];
        Object[] reports = new Object[count];
        GroupWork.run(count, workers, i -> {
            Cursor cursor = new Cursor(firstBlock + i, state.blocks[i], state.fresh(i), model, readOnly);
            reports[i] = step.apply(cursor);
            next[i] = cursor.result();
        });
        return new PartitionState(next, reports);
    }

    @SuppressWarnings("unchecked")
    private static <R> List<R> flatten(List<Object[]> perGroup) {
        List<R> results = new ArrayList<>();
        for (Object[] reports : perGroup) {
            for (Object report : reports) {
                results.add((R) report);
            }
        }
        return results;
    }

    /** Defines {@code next} as the states, computes it in one job and returns its results in block order. */
    private <R> List<R> commit(JavaRDD<PartitionState> next) {
        define(next);
        List<R> results = flatten(states.map(state -> state.reports).collect());
        dropReplaced();
        return results;
    }

    /**
     * Makes {@code next} the states without running a job: it is cached when a job first
     * computes it, and the states it replaces are dropped then.
     */
    private void define(JavaRDD<PartitionState> next) {
        define(next, true);
    }

    /** As {@link #define(JavaRDD)}, {@code next} cached only when {@code cache}. */
    private void define(JavaRDD<PartitionState> next, boolean cache) {
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
        for (JavaRDD<PartitionState> old : replaced) {
            old.unpersist(false);
        }
        replaced.clear();
    }

    /**
     * Only the runs the plan names move, and only those that leave their group go through the
     * shuffle; a block the plan leaves alone is kept as it is, so the work follows the particles
     * moved. Each partition keeps its blocks' last results.
     */
    @Override
    public void exchange(Redistribution plan) {
        if (plan.blockCount() != blocks) {
            throw new IllegalArgumentException("plan for " + plan.blockCount() + " blocks, population has " + blocks);
        }
        int[] start = starts;
        JavaRDD<Tuple2<Integer, ParticleBlock>> outgoing = states.mapPartitionsWithIndex((g, iterator) -> {
            PartitionState state = iterator.next();
            List<Tuple2<Integer, ParticleBlock>> runs = new ArrayList<>();
            for (int t = 0; t < plan.transferCount(); t++) {
                int from = plan.fromBlock(t);
                int to = plan.toBlock(t);
                if (from >= start[g] && from < start[g + 1] && (to < start[g] || to >= start[g + 1])) {
                    ParticleBlock block = state.blocks[from - start[g]];
                    runs.add(new Tuple2<>(to, BlockSlices.slice(block, (int) (plan.runFirstIndex(t) - block.index()[0]),
                            plan.runCount(t))));
                }
            }
            return runs.iterator();
        }, true);
        JavaPairRDD<Integer, ParticleBlock> incoming = JavaPairRDD.fromJavaRDD(outgoing)
                .partitionBy(new BlockPartitioner(start));
        int d = dimension;
        // Not cached: the next step (a move) runs on the joined blocks and caches its own result,
        // so an executor holds two copies of its block during a step, not three. Until then the
        // states before the exchange stay cached (dropReplaced waits for cached states).
        define(states.zipPartitions(incoming.rdd().toJavaRDD(),
                (Iterator<PartitionState> own, Iterator<Tuple2<Integer, ParticleBlock>> arriving) -> {
            int g = TaskContext.getPartitionId();
            PartitionState state = own.next();
            int count = state.blocks.length;
            List<List<ParticleBlock>> pieces = new ArrayList<>(count);
            for (int i = 0; i < count; i++) {
                pieces.add(new ArrayList<>());
            }
            boolean[] touched = new boolean[count];
            for (int t = 0; t < plan.transferCount(); t++) {
                int from = plan.fromBlock(t);
                int to = plan.toBlock(t);
                boolean fromHere = from >= start[g] && from < start[g + 1];
                boolean toHere = to >= start[g] && to < start[g + 1];
                if (fromHere) {
                    touched[from - start[g]] = true;
                }
                if (toHere) {
                    touched[to - start[g]] = true;
                }
                if (fromHere && toHere) {
                    ParticleBlock block = state.blocks[from - start[g]];
                    pieces.get(to - start[g]).add(BlockSlices.slice(block,
                            (int) (plan.runFirstIndex(t) - block.index()[0]), plan.runCount(t)));
                }
            }
            arriving.forEachRemaining(run -> pieces.get(run._1() - start[g]).add(run._2()));
            ParticleBlock[] joined = new ParticleBlock[count];
            boolean[] fresh = new boolean[count];
            for (int i = 0; i < count; i++) {
                ParticleBlock block = state.blocks[i];
                long targetFirst = plan.targetFirstIndex(start[g] + i);
                long targetEnd = targetFirst + plan.targetSize(start[g] + i);
                if (!touched[i] && (block.size() == 0 ? targetEnd == targetFirst
                        : block.index()[0] == targetFirst && block.index()[0] + block.size() == targetEnd)) {
                    joined[i] = block; // nothing leaves or arrives: the cached block, still shared
                    continue;
                }
                List<ParticleBlock> parts = pieces.get(i);
                if (block.size() > 0) {
                    long keepFirst = Math.max(targetFirst, block.index()[0]);
                    long keepEnd = Math.min(targetEnd, block.index()[0] + block.size());
                    if (keepEnd > keepFirst) {
                        parts.add(BlockSlices.slice(block, (int) (keepFirst - block.index()[0]),
                                (int) (keepEnd - keepFirst)));
                    }
                }
                joined[i] = BlockSlices.join(d, parts);
                fresh[i] = true;
            }
            return List.of(new PartitionState(joined, state.reports, fresh)).iterator();
        }), false);
    }

    @Override
    public void forEachBlock(Consumer<ParticleBlock> sink) {
        // Jobs of bounded bytes: each fetches runs of particles from a few blocks, a large block
        // split over several jobs, so neither one task's result nor one job's results together
        // come near spark.driver.maxResultSize, whatever N is.
        List<long[]> perGroup = states.map(state -> {
            long[] shapes = new long[state.blocks.length];
            for (int i = 0; i < shapes.length; i++) {
                shapes[i] = (long) state.blocks[i].auxiliaryWidth() << 32 | state.blocks[i].size();
            }
            return shapes;
        }).collect();
        long[] shapes = perGroup.stream().flatMapToLong(Arrays::stream).toArray();
        long auxiliaryWidth = Arrays.stream(shapes).map(shape -> shape >>> 32).max().orElse(0L);
        long bytesPerParticle = Double.BYTES * (dimension + 3L + auxiliaryWidth) + 2L * Long.BYTES;
        long perJob = Math.max(1L, fetchBudgetBytes(context.getConf().getSizeAsBytes(MAX_RESULT_SIZE, "1g"))
                / bytesPerParticle);
        int[] from = new int[blocks];
        int[] count = new int[blocks];
        boolean any = false;
        long room = perJob;
        for (int b = 0; b < blocks; b++) {
            int size = (int) shapes[b];
            int begin = 0;
            while (begin < size) {
                int take = (int) Math.min(size - begin, room);
                from[b] = begin;
                count[b] = take;
                any = true;
                begin += take;
                room -= take;
                if (room == 0) {
                    fetch(from, count, sink);
                    Arrays.fill(count, 0);
                    any = false;
                    room = perJob;
                }
            }
        }
        if (any) {
            fetch(from, count, sink);
        }
        dropReplaced();
    }

    /** The share of the driver's result limit one export job may fetch: an eighth, at most 64 MiB. */
    static long fetchBudgetBytes(long maxResultSize) {
        long ceiling = 64L << 20;
        return maxResultSize <= 0 ? ceiling : Math.min(ceiling, maxResultSize / 8);
    }

    /** One job: run {@code [from[b], from[b]+count[b])} of each block b with a count, handed on in order. */
    private void fetch(int[] from, int[] count, Consumer<ParticleBlock> sink) {
        int[] starts = from.clone();
        int[] counts = count.clone();
        int[] start = this.starts;
        List<Integer> groups = new ArrayList<>();
        for (int g = 0; g < groups(); g++) {
            for (int b = start[g]; b < start[g + 1]; b++) {
                if (counts[b] > 0) {
                    groups.add(g);
                    break;
                }
            }
        }
        JavaRDD<ParticleBlock> runs = states.mapPartitionsWithIndex((g, iterator) -> {
            PartitionState state = iterator.next();
            List<ParticleBlock> slices = new ArrayList<>();
            for (int b = start[g]; b < start[g + 1]; b++) {
                if (counts[b] > 0) {
                    slices.add(BlockSlices.slice(state.blocks[b - start[g]], starts[b], counts[b]));
                }
            }
            return slices.iterator();
        }, true);
        for (List<ParticleBlock> part : runs.collectPartitions(groups.stream().mapToInt(Integer::intValue).toArray())) {
            part.forEach(sink);
        }
    }

    /**
     * Executors write their own blocks in parallel (one job); then the states are redefined as
     * those files read back, which cuts their lineage: a lost partition is read back from the
     * checkpoint instead of being recomputed from the initial draw. The read-back is computed by
     * the next job; the old states are dropped at once, since the files now hold the population.
     */
    @Override
    public List<StoredBlock> write(BlockStore store) {
        int[] start = starts;
        int workers = threads;
        List<StoredBlock> stored = flatten(states.mapPartitionsWithIndex((g, iterator) -> {
            PartitionState state = iterator.next();
            Object[] written = new Object[state.blocks.length];
            GroupWork.run(written.length, workers, i -> {
                try {
                    written[i] = store.write(start[g] + i, state.blocks[i]);
                } catch (java.io.IOException e) {
                    throw new java.io.UncheckedIOException("cannot write block " + (start[g] + i) + " to "
                            + store.location() + ": " + e, e);
                }
            });
            return java.util.Collections.singletonList(written).iterator();
        }, true).collect());
        dropReplaced();
        int d = dimension;
        String location = store.location();
        long[] first = StoredBlock.firstIndices(stored);
        regroup(stored.size());
        define(fromFiles(stored, (number, block) -> BlockReading.read(store, block, first[number], d)).map(state -> {
            for (Object report : state.reports) {
                if (report != null) {
                    throw new java.io.UncheckedIOException(new java.io.IOException("the checkpoint just written to "
                            + location + " does not read back: " + report));
                }
            }
            return state;
        }));
        dropReplaced();
        return stored;
    }

    @Override
    public List<String> read(List<StoredBlock> stored, BlockReader reader) {
        int[] before = starts;
        int blocksBefore = blocks;
        regroup(stored.size());
        JavaRDD<PartitionState> next = fromFiles(stored, reader);
        next.persist(StorageLevel.MEMORY_ONLY());
        List<String> problems = new ArrayList<>();
        for (Object report : flatten(next.map(state -> state.reports).collect())) {
            if (report != null) {
                problems.add((String) report);
            }
        }
        if (!problems.isEmpty()) {
            next.unpersist(false);
            starts = before;
            blocks = blocksBefore;
            return problems;
        }
        define(next);
        dropReplaced();
        return problems;
    }

    /**
     * The blocks in {@code stored} as states in the current grouping, each with what is wrong with
     * its file as report (null when nothing).
     */
    private JavaRDD<PartitionState> fromFiles(List<StoredBlock> stored, BlockReader reader) {
        int[] start = starts;
        int workers = threads;
        return context.parallelize(stored, groups()).mapPartitionsWithIndex((g, iterator) -> {
            List<StoredBlock> files = new ArrayList<>();
            iterator.forEachRemaining(files::add);
            checkGroup(g, files.size(), start);
            ParticleBlock[] read = new ParticleBlock[files.size()];
            Object[] problems = new Object[files.size()];
            GroupWork.run(files.size(), workers, i -> {
                BlockReading.Outcome outcome = reader.read(start[g] + i, files.get(i));
                read[i] = outcome.block();
                problems[i] = outcome.problem();
            });
            return List.of(new PartitionState(read, problems)).iterator();
        }, true);
    }

    @Override
    public void close() {
        for (JavaRDD<PartitionState> old : replaced) {
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
     * Executor side: one block for a step. A step that changes particles gets a private copy,
     * unless the block is fresh, so the cached state it came from stays as it was (Spark may
     * recompute from it).
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
