package org.skerry.engine.sampler;

import org.skerry.engine.population.Population;

/**
 * Where a resumed run starts from: fills a fresh population with a checkpoint's blocks and
 * returns the driver state saved with them. An implementation may try several checkpoints,
 * newest first, and report the damaged ones it skipped.
 */
@FunctionalInterface
public interface Resumption {

    /**
     * @throws IllegalStateException when no usable checkpoint exists (the message says why)
     */
    SamplerState restore(Population population);
}
