package org.skerry.engine.population.threads;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.ThreadFactory;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Function;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.PopulationBackend;

/**
 * The reference backend: populations held in this JVM as blocks, worked on by a fixed pool of
 * threads, one block per task. Used for embedded runs and tests, and as the yardstick the Spark
 * backend must match bit for bit.
 */
public final class ThreadPoolBackend implements PopulationBackend {

    private final int threads;
    private final int blockSize;
    private final ExecutorService pool;

    /**
     * @param threads   worker threads (at least 1)
     * @param blockSize particles per block, or 0 to choose about four blocks per thread
     */
    public ThreadPoolBackend(int threads, int blockSize) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads must be >= 1, was " + threads);
        }
        if (blockSize < 0) {
            throw new IllegalArgumentException("blockSize must be >= 0, was " + blockSize);
        }
        this.threads = threads;
        this.blockSize = blockSize;
        AtomicInteger counter = new AtomicInteger();
        ThreadFactory factory = runnable -> {
            Thread thread = new Thread(runnable, "skerry-worker-" + counter.incrementAndGet());
            thread.setDaemon(true);
            return thread;
        };
        this.pool = Executors.newFixedThreadPool(threads, factory);
    }

    /** A backend with one thread per available processor and automatic block size. */
    public static ThreadPoolBackend ofAvailableProcessors() {
        return new ThreadPoolBackend(Runtime.getRuntime().availableProcessors(), 0);
    }

    public int threads() {
        return threads;
    }

    @Override
    public String description() {
        return "threads(" + threads + (blockSize > 0 ? ", block size " + blockSize : "") + ")";
    }

    @Override
    public BlockExecutor open(ModelSource source, int particles, int blocks) {
        if (blocks < 0 || blocks > particles) {
            throw new IllegalArgumentException("blocks must be in [0, " + particles + "], was " + blocks);
        }
        int size = blockSize > 0 ? blockSize : Math.max(1, (particles + 4 * threads - 1) / (4 * threads));
        return new ThreadBlocks(this, source.create(), blocks > 0 ? blocks : (particles + size - 1) / size);
    }

    /** Applies {@code task} to every item on the pool and returns the results in item order. */
    <T, R> List<R> map(List<T> items, Function<T, R> task) {
        List<Future<R>> futures = new ArrayList<>(items.size());
        for (T item : items) {
            futures.add(pool.submit(() -> task.apply(item)));
        }
        List<R> results = new ArrayList<>(items.size());
        RuntimeException failure = null;
        for (Future<R> future : futures) {
            try {
                results.add(future.get());
            } catch (ExecutionException e) {
                Throwable cause = e.getCause();
                if (failure == null) {
                    failure = cause instanceof RuntimeException ? (RuntimeException) cause
                            : new IllegalStateException("block task failed", cause);
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for block tasks", e);
            }
        }
        if (failure != null) {
            throw failure;
        }
        return results;
    }

    @Override
    public void close() {
        pool.shutdownNow();
    }
}
