package org.skerry.engine.sampler;

/** Told about each finished iteration (progress display, logging, checkpoints). Called on the driver. */
@FunctionalInterface
public interface IterationListener {

    /** Called once per iteration, after it completes; iteration 0 is the initial draw. */
    void iterationFinished(IterationRecord record);

    /** A listener that ignores everything. */
    IterationListener NONE = record -> { };
}
