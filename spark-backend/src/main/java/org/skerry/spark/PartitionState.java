package org.skerry.spark;

import java.io.Serializable;
import org.skerry.engine.particle.ParticleBlock;

/**
 * What one partition holds between steps: its particle block, and the typed result of the step
 * that made it, which the driver collects without touching the block. Cached as objects; never
 * mutated once cached — each step makes a new state, from a copy where it changes particles.
 *
 * @param <R> the step's per-block result
 */
final class PartitionState<R> implements Serializable {

    private static final long serialVersionUID = 1L;

    final ParticleBlock block;
    final R report;

    PartitionState(ParticleBlock block, R report) {
        this.block = block;
        this.report = report;
    }
}
