package org.skerry.benchmarks;

import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.PopulationBackend;

/**
 * The baseline to beat: a Spark backend written the simple way, which keeps the whole population
 * on the driver and ships all of it to the executors for every likelihood pass (see
 * {@link NaiveCollectBlocks}). It runs on an existing Spark context (skerry's, so both use the
 * same Kryo settings and executors) and does not stop it.
 */
final class NaiveCollectBackend implements PopulationBackend {

    private final JavaSparkContext context;
    private final int partitions;

    /** @param partitions blocks shipped per likelihood pass; 0 means three per core, as skerry's default */
    NaiveCollectBackend(JavaSparkContext context, int partitions) {
        this.context = context;
        this.partitions = partitions > 0 ? partitions : 3 * Math.max(1, context.defaultParallelism());
    }

    @Override
    public String description() {
        return "naive-collect(" + context.master() + ", " + partitions + " partitions)";
    }

    @Override
    public BlockExecutor open(ModelSource source, int particles, int blocks) {
        if (blocks != 0) {
            throw new IllegalArgumentException("the naive baseline has no island mode");
        }
        return new NaiveCollectBlocks(context, source, Math.min(partitions, particles));
    }

    @Override
    public void close() {
        // The context belongs to whoever started it.
    }
}
