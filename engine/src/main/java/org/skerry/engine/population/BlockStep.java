package org.skerry.engine.population;

import java.io.Serializable;

/**
 * Work the engine runs on one block where the block lives (a worker thread, a Spark executor),
 * returning a small typed result for the driver. Steps travel to executors, so they capture only
 * serialisable values (plans, proposals, targets, seeds) and never the driver's objects.
 *
 * @param <R> the per-block result (a tally, sums, a count, a few scalars per particle)
 */
@FunctionalInterface
public interface BlockStep<R> extends Serializable {

    /** Works on the block at {@code cursor}. */
    R apply(BlockCursor cursor);

    /** This step, then {@code next} on the same block; the result is {@code next}'s. */
    default <S> BlockStep<S> then(BlockStep<S> next) {
        BlockStep<R> first = this;
        return cursor -> {
            first.apply(cursor);
            return next.apply(cursor);
        };
    }
}
