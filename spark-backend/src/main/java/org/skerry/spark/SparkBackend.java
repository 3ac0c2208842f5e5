package org.skerry.spark;

import java.io.IOException;
import java.io.ObjectOutputStream;
import java.io.OutputStream;
import java.util.Map;
import org.apache.spark.SparkConf;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.PopulationBackend;

/**
 * The Spark backend: each population is an RDD of particle blocks, one block per partition,
 * cached between steps. One backend holds one Spark context and may serve several populations.
 * In global mode the answer is bit-identical to the thread backend's for any partition count.
 */
public final class SparkBackend implements PopulationBackend {

    private final JavaSparkContext context;
    private final int partitions;
    private final TaskGrouping grouping;
    private final boolean ownsContext;

    private SparkBackend(JavaSparkContext context, int partitions, TaskGrouping grouping, boolean ownsContext) {
        if (partitions < 0) {
            throw new IllegalArgumentException("partitions must be >= 0, was " + partitions);
        }
        this.context = context;
        this.partitions = partitions;
        this.grouping = java.util.Objects.requireNonNull(grouping, "grouping");
        this.ownsContext = ownsContext;
    }

    /**
     * Starts a Spark context with skerry's serialisation settings on top of {@code extra}.
     *
     * @param master     e.g. {@code local[2]} or {@code spark://127.0.0.1:7077}
     * @param partitions partitions per population; 0 means three per executor core
     * @param extra      further Spark settings ({@code spark.*} keys), applied last
     */
    public static SparkBackend start(String master, String appName, int partitions, Map<String, String> extra) {
        return start(master, appName, partitions, TaskGrouping.perBlock(), extra);
    }

    /**
     * As {@link #start(String, String, int, Map)}, blocks grouped into tasks by {@code grouping}
     * (per executor: set {@code spark.task.cpus} in {@code extra} to the executors' cores, so that
     * each task gets an executor's cores to spread over its blocks).
     */
    public static SparkBackend start(String master, String appName, int partitions, TaskGrouping grouping,
            Map<String, String> extra) {
        SparkConf conf = new SparkConf().setMaster(master).setAppName(appName)
                .set("spark.serializer", "org.apache.spark.serializer.KryoSerializer")
                .set("spark.kryo.registrator", SkerryKryoRegistrator.class.getName())
                .set("spark.kryo.registrationRequired", "true")
                .set("spark.ui.enabled", "false")
                .set("spark.ui.showConsoleProgress", "false");
        extra.forEach(conf::set);
        return new SparkBackend(new JavaSparkContext(conf), partitions, grouping, true);
    }

    /** A backend on an existing context, which the caller keeps and stops. */
    public static SparkBackend on(JavaSparkContext context, int partitions) {
        return new SparkBackend(context, partitions, TaskGrouping.perBlock(), false);
    }

    /** A backend on an existing context, which the caller keeps and stops, with blocks grouped into tasks. */
    public static SparkBackend on(JavaSparkContext context, int partitions, TaskGrouping grouping) {
        return new SparkBackend(context, partitions, grouping, false);
    }

    public JavaSparkContext context() {
        return context;
    }

    /** Partitions a population of {@code particles} gets. */
    int partitionsFor(int particles) {
        int wanted = partitions > 0 ? partitions : 3 * Math.max(1, context.defaultParallelism());
        return Math.max(1, Math.min(wanted, particles));
    }

    @Override
    public String description() {
        return "spark(" + context.master() + ", " + (partitions > 0 ? partitions + " partitions" : "3 partitions per core")
                + ", " + grouping + ")";
    }

    @Override
    public BlockExecutor open(ModelSource source, int particles, int blocks) {
        if (blocks < 0 || blocks > particles) {
            throw new IllegalArgumentException("blocks must be in [0, " + particles + "], was " + blocks);
        }
        if (!source.isPortable()) {
            throw new IllegalArgumentException("the Spark backend needs a model it can rebuild on executors: "
                    + "build it from a run file (model.name or model.class) or implement ModelSource");
        }
        checkSerialisable(source);
        return new SparkBlocks(context, source, source.create().dimension(),
                blocks > 0 ? blocks : partitionsFor(particles), grouping);
    }

    private static void checkSerialisable(ModelSource source) {
        try (ObjectOutputStream out = new ObjectOutputStream(OutputStream.nullOutputStream())) {
            out.writeObject(source);
        } catch (IOException e) {
            throw new IllegalArgumentException("model source " + source.getClass().getName()
                    + " cannot be sent to executors: " + e, e);
        }
    }

    @Override
    public void close() {
        if (ownsContext) {
            context.stop();
        }
    }
}
