package org.skerry.engine.program;

import java.nio.file.Path;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.List;

/**
 * The workers of one program model in one JVM: a thread borrows an idle worker for an evaluation
 * and gives it back, and a new worker starts only when none is idle, so there are as many workers
 * as evaluations ever ran at once — one per thread of the thread backend, one per task slot
 * (executor core) on Spark. A broken worker is dropped on return; the next borrow starts a fresh
 * one in its place. Thread-safe.
 */
final class WorkerPool implements AutoCloseable {

    private final ProgramSettings settings;
    private final ArrayDeque<Worker> idle = new ArrayDeque<>();
    private final List<Worker> all = new ArrayList<>();
    private Path root;
    private int started;
    private boolean closed;

    WorkerPool(ProgramSettings settings) {
        this.settings = settings;
    }

    /**
     * An idle worker, or a newly started one.
     *
     * @throws ProgramStartException when a new worker cannot start
     */
    Worker borrow() {
        int number;
        Path folder;
        synchronized (this) {
            if (closed) {
                throw new ProgramFailureException("the model program's workers were stopped (the run is ending)");
            }
            while (!idle.isEmpty()) {
                Worker worker = idle.pop();
                if (worker.usable()) {
                    return worker;
                }
                retire(worker);
            }
            if (root == null) {
                root = ScratchFolders.createRoot(settings.scratch());
            }
            number = ++started;
            folder = ScratchFolders.create(root, "worker-" + number);
        }
        Worker worker = Worker.start(settings, number, folder);
        synchronized (this) {
            if (closed) {
                worker.close();
                throw new ProgramFailureException("the model program's workers were stopped (the run is ending)");
            }
            all.add(worker);
        }
        return worker;
    }

    /** Takes a worker back after an evaluation: idle again if it still works, else ended. */
    void giveBack(Worker worker) {
        synchronized (this) {
            if (!closed && worker.usable()) {
                idle.push(worker);
                return;
            }
            all.remove(worker);
        }
        worker.close();
    }

    private void retire(Worker worker) {
        all.remove(worker);
        worker.close();
    }

    /** How many workers have been started, replacements included (for tests and messages). */
    synchronized int started() {
        return started;
    }

    /** Ends every worker (those in use are killed) and removes the scratch space. */
    @Override
    public void close() {
        List<Worker> ending;
        Path folder;
        synchronized (this) {
            if (closed) {
                return;
            }
            closed = true;
            ending = new ArrayList<>(all);
            all.clear();
            idle.clear();
            folder = root;
        }
        for (Worker worker : ending) {
            worker.close();
        }
        ScratchFolders.remove(folder);
    }
}
