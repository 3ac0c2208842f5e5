package org.skerry.spark;

import java.io.Serializable;
import org.skerry.engine.particle.ParticleBlock;

/**
 * What one partition holds between steps: its particle block, and the small report (a tally,
 * sums, a count) of the step that made it, which the driver collects without touching the block.
 * Cached as objects; never mutated once cached — each step makes a new state from a copy.
 */
final class PartitionState implements Serializable {

    private static final long serialVersionUID = 1L;

    final ParticleBlock block;
    final Object report;

    PartitionState(ParticleBlock block, Object report) {
        this.block = block;
        this.report = report;
    }
}
