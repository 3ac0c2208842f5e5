package org.skerry.engine.population;

import java.util.List;
import java.util.function.Consumer;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.resample.Redistribution;

/**
 * Where one population's blocks live and are worked on: the only thing a backend implements.
 * It runs steps over every block and gathers their results in block order, moves runs of
 * particles between blocks by a plan, and writes and reads blocks; it knows nothing of the
 * algorithm, which {@link Population} composes from these operations.
 *
 * <p>Results must not depend on where blocks run or in which order they finish. A backend may
 * defer {@link #exchange} until the next step that touches the blocks, to save a round trip.
 */
public interface BlockExecutor extends AutoCloseable {

    /** Number of blocks. */
    int blockCount();

    /**
     * Makes the blocks: block {@code b} holds particles {@code first[b] … first[b]+sizes[b]−1}
     * (global indices set, everything else zero), then runs {@code step} on each.
     */
    <R> List<R> create(long[] first, int[] sizes, BlockStep<R> step);

    /** Runs {@code step}, which may change blocks, on every block; results in block order. */
    <R> List<R> update(BlockStep<R> step);

    /** Runs {@code query}, which changes nothing, on every block; results in block order. */
    <R> List<R> read(BlockStep<R> query);

    /** Moves the runs of particles {@code plan} names between blocks. */
    void exchange(Redistribution plan);

    /**
     * Hands every particle to {@code sink} in block order, a bounded number in memory at a time:
     * whole blocks, or a block as consecutive runs of its particles where it is large.
     */
    void forEachBlock(Consumer<ParticleBlock> sink);

    /**
     * Writes every block through {@code store}, in parallel where the blocks live, and from then
     * on treats those files as the blocks' origin (a lost block is read back, not recomputed).
     *
     * @return one entry per block, in block order
     * @throws java.io.UncheckedIOException when a block cannot be written
     */
    List<StoredBlock> write(BlockStore store);

    /**
     * Replaces the blocks with those of a checkpoint (their count may differ from today's).
     *
     * @param reader reads block {@code b} of {@code stored} and checks it
     * @return what is wrong, one line per damaged or missing block; empty when every block read
     *         back, and only then are the blocks replaced
     */
    List<String> read(List<StoredBlock> stored, BlockReader reader);

    /** Releases the blocks; the backend stays open. */
    @Override
    void close();

    /** Reads one stored block where blocks live. */
    @FunctionalInterface
    interface BlockReader extends java.io.Serializable {
        /** Block {@code number} of the checkpoint, or what is wrong with it. */
        org.skerry.engine.population.block.BlockReading.Outcome read(int number, StoredBlock stored);
    }
}
