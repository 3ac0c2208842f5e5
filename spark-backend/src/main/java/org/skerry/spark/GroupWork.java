package org.skerry.spark;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.IntConsumer;

/**
 * Executor side: a task's work over the blocks of its group, on several threads that each take the
 * next unstarted block when they finish one (a shared counter: a slow block holds up one thread,
 * not the others). The task's own thread works too; the helpers are daemon threads kept by this
 * JVM between tasks. The first failure stops further blocks being started and is thrown on the
 * task's thread.
 */
final class GroupWork {

    private static final AtomicInteger NAMES = new AtomicInteger();
    private static final ExecutorService HELPERS = Executors.newCachedThreadPool(work -> {
        Thread thread = new Thread(work, "skerry-group-worker-" + NAMES.incrementAndGet());
        thread.setDaemon(true);
        return thread;
    });

    private GroupWork() {
    }

    /** Runs {@code work} for every {@code i} in {@code [0, count)} on at most {@code threads} threads. */
    static void run(int count, int threads, IntConsumer work) {
        int workers = Math.min(threads, count);
        if (workers <= 1) {
            for (int i = 0; i < count; i++) {
                work.accept(i);
            }
            return;
        }
        AtomicInteger next = new AtomicInteger();
        AtomicReference<Throwable> failure = new AtomicReference<>();
        Runnable worker = () -> {
            int i;
            while (failure.get() == null && (i = next.getAndIncrement()) < count) {
                try {
                    work.accept(i);
                } catch (Throwable e) {
                    failure.compareAndSet(null, e);
                }
            }
        };
        List<Future<?>> helpers = new ArrayList<>(workers - 1);
        for (int h = 1; h < workers; h++) {
            helpers.add(HELPERS.submit(worker));
        }
        worker.run();
        for (Future<?> helper : helpers) {
            try {
                helper.get();
            } catch (InterruptedException e) {
                // Spark is killing the task: start no more blocks and let the helpers finish theirs.
                failure.compareAndSet(null, e);
                Thread.currentThread().interrupt();
                throw new IllegalStateException("task interrupted while its group's blocks were worked on", e);
            } catch (ExecutionException e) {
                failure.compareAndSet(null, e.getCause());
            }
        }
        Throwable first = failure.get();
        if (first instanceof RuntimeException) {
            throw (RuntimeException) first;
        }
        if (first instanceof Error) {
            throw (Error) first;
        }
        if (first != null) {
            throw new IllegalStateException(first);
        }
    }
}
