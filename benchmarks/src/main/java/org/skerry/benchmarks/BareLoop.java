package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Future;
import org.skerry.engine.model.builtin.BusyWork;

/**
 * The floor every overhead is measured against: the likelihood's busy work alone, with no
 * sampler around it — the same {@link BusyWork} the {@code costly-normal} model does per
 * evaluation, split evenly over tasks of a pool.
 */
final class BareLoop {

    private BareLoop() {
    }

    /** {@code evaluations} evaluations' worth of {@code costMicros} work over {@code threads} tasks. */
    static long run(ExecutorService pool, int threads, long evaluations, long costMicros) throws Exception {
        long units = BusyWork.unitsFor(costMicros);
        List<Future<Long>> parts = new ArrayList<>();
        for (int t = 0; t < threads; t++) {
            long share = evaluations / threads + (t < evaluations % threads ? 1 : 0);
            parts.add(pool.submit(() -> {
                long sink = 0;
                for (long i = 0; i < share; i++) {
                    sink += BusyWork.work(units);
                }
                return sink;
            }));
        }
        long sink = 0;
        for (Future<Long> part : parts) {
            sink += part.get();
        }
        return sink;
    }
}
