package org.skerry.engine.population.block;

import java.io.IOException;
import java.io.Serializable;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.StoredBlock;

/**
 * Executor side: reads one block of a checkpoint and checks that it is the block the manifest
 * promises — the right particle count and dimension, and a contiguous run of global indices
 * starting where the blocks before it end. A problem is returned as text, never thrown, so one
 * damaged block is reported with the others instead of failing a distributed job.
 */
public final class BlockReading {

    /** A block read back, or what is wrong with it. */
    public record Outcome(ParticleBlock block, String problem) implements Serializable {
    }

    private BlockReading() {
    }

    /**
     * @param firstIndex global index the block's first particle must have: the sum of the
     *                   particle counts of the blocks before it
     */
    public static Outcome read(BlockStore store, StoredBlock stored, long firstIndex, int dimension) {
        ParticleBlock block;
        try {
            block = store.read(stored);
        } catch (IOException e) {
            return new Outcome(null, e.getMessage());
        }
        String where = stored.fileName() + " in " + store.location();
        if (block.size() != stored.particles()) {
            return new Outcome(null, where + " holds " + block.size() + " particles; the manifest says "
                    + stored.particles());
        }
        if (block.dimension() != dimension) {
            return new Outcome(null, where + " holds " + block.dimension() + "-dimensional particles; the model has "
                    + dimension + " parameters");
        }
        for (int i = 0; i < block.size(); i++) {
            if (block.index()[i] != firstIndex + i) {
                return new Outcome(null, where + ": particle " + i + " has global index " + block.index()[i]
                        + ", expected " + (firstIndex + i));
            }
        }
        return new Outcome(block, null);
    }
}
