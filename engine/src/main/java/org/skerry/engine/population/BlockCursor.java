package org.skerry.engine.population;

import org.skerry.engine.model.Model;
import org.skerry.engine.particle.ParticleBlock;

/**
 * One block as a {@link BlockStep} sees it. A step that changes particles asks for
 * {@link #block()} (a backend that caches blocks hands out a private copy, so a block recomputed
 * after a failure is computed from the same inputs) or installs a new block with
 * {@link #replace}; a step that only reads uses {@link #current()} and must not change it.
 */
public interface BlockCursor {

    /** The block's position in the population, from 0. */
    int number();

    /** The block, read only. */
    ParticleBlock current();

    /** The block, to change in place. */
    ParticleBlock block();

    /** Makes {@code replacement} the block (resampling makes a new block of survivors). */
    void replace(ParticleBlock replacement);

    /** The model, built once per worker JVM. */
    Model model();
}
