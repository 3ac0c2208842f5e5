package org.skerry.engine.population;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import org.skerry.engine.particle.ParticleBlock;

/**
 * A deep copy of a population's blocks at one moment, enough to continue the run bit for bit.
 * Immutable from the outside: blocks are copied in and out.
 */
public final class PopulationSnapshot {

    private final List<ParticleBlock> blocks;

    public PopulationSnapshot(List<ParticleBlock> blocks) {
        List<ParticleBlock> copies = new ArrayList<>(blocks.size());
        for (ParticleBlock block : blocks) {
            copies.add(block.copy());
        }
        this.blocks = Collections.unmodifiableList(copies);
    }

    /** Fresh copies of the blocks. */
    public List<ParticleBlock> blocks() {
        List<ParticleBlock> copies = new ArrayList<>(blocks.size());
        for (ParticleBlock block : blocks) {
            copies.add(block.copy());
        }
        return copies;
    }

    /** Total number of particles. */
    public int size() {
        int total = 0;
        for (ParticleBlock block : blocks) {
            total += block.size();
        }
        return total;
    }
}
