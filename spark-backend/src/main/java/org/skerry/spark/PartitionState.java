package org.skerry.spark;

import java.io.Serializable;
import org.skerry.engine.particle.ParticleBlock;

/**
 * What one partition holds between steps: its group of consecutive blocks (one block when each
 * block is a task), and the typed result of the step that made each, which the driver collects
 * without touching the blocks. Cached as objects; never mutated once cached — each step makes a
 * new state, from copies where it changes particles. A block marked fresh is an object no cache
 * holds (an exchange joined it), so the next step may change it in place.
 */
final class PartitionState implements Serializable {

    private static final long serialVersionUID = 2L;

    final ParticleBlock[] blocks;
    final Object[] reports;
    /** Per block, whether no cached state holds it; null when none is fresh. */
    final boolean[] fresh;

    PartitionState(ParticleBlock[] blocks, Object[] reports) {
        this(blocks, reports, null);
    }

    PartitionState(ParticleBlock[] blocks, Object[] reports, boolean[] fresh) {
        this.blocks = blocks;
        this.reports = reports;
        this.fresh = fresh;
    }

    boolean fresh(int i) {
        return fresh != null && fresh[i];
    }
}
