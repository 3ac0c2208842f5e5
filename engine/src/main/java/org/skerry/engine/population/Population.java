package org.skerry.engine.population;

import java.util.List;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.resample.ResamplingScheme;

/**
 * A population of particles held by a backend, seen from the driver. The sampler loop
 * ({@link org.skerry.engine.sampler.SmcSampler}) is written once against this interface; each
 * backend decides where the blocks live (threads of this JVM, Spark executors) and runs the same
 * block-side code from {@code org.skerry.engine.population.block} on them.
 *
 * <p>Every operation returns only scalars per particle or sums per block; parameter vectors stay
 * with the blocks until {@link #export()}. Results must not depend on how particles are grouped
 * into blocks or on the order in which blocks finish.
 */
public interface Population extends AutoCloseable {

    /** Number of particles N. */
    int size();

    /**
     * Draws the initial particles (from the prior, or from {@code proposal} with importance weights
     * prior / proposal) and evaluates their log-likelihoods.
     */
    EvaluationTally initialise(Prior proposal);

    /** Current log-weights and log-likelihoods of all particles (16 bytes a particle). */
    TemperingInputs temperingInputs();

    /** {@code log w += (toTemperature − fromTemperature)·log L} for every particle. */
    void reweight(double fromTemperature, double toTemperature);

    /**
     * Resamples by normalised weight with the given scheme, gives every survivor weight 1 (log 0),
     * renumbers particles canonically (ancestor order, then copy number) and rebalances the blocks.
     *
     * @param logTotal log of the current weight total, as computed by the driver
     */
    ResamplingReport resample(ResamplingScheme scheme, double logTotal, int iteration);

    /**
     * Island resampling: every block (island) resamples its own particles by their weights within
     * the island, keeps its size and its run of global indices, and gives each survivor the
     * island's mean weight, so the island's total weight — its island weight — is carried on
     * (Vergé, Dubarry, Del Moral &amp; Moulines 2015). No particle changes block.
     */
    ResamplingReport resampleIslands(ResamplingScheme scheme, int iteration);

    /** Weighted moment sums on the unconstrained scale, weights normalised by {@code logTotal}. */
    MomentSums moments(double logTotal);

    /**
     * Metropolis–Hastings steps {@code firstStep … firstStep+steps−1} of every living particle,
     * invariant for the target at {@code temperature}.
     */
    MoveTally move(Proposal proposal, double temperature, int iteration, int firstStep, int steps);

    /**
     * The iteration's last {@link #move}: the same steps, and a hint that the population does not
     * change again before the next {@link #temperingInputs()}, so a distributed backend may gather
     * those inputs with the moves' reports instead of in a pass of its own. The default is
     * {@link #move}.
     */
    default MoveTally moveLast(Proposal proposal, double temperature, int iteration, int firstStep, int steps) {
        return move(proposal, temperature, iteration, firstStep, steps);
    }

    /** All particles in canonical order. Used once, at the end of a run. */
    FinalParticles export();

    /**
     * Writes every block through {@code store}, in parallel where the blocks live, and from then on
     * treats those files as the population's origin: a distributed backend that loses a block
     * reads it back instead of recomputing the run from its start.
     *
     * @return one entry per block, in block order
     * @throws java.io.UncheckedIOException when a block cannot be written
     */
    List<StoredBlock> writeBlocks(BlockStore store);

    /**
     * Replaces the population with the blocks of a checkpoint, in the checkpoint's layout (block
     * count and sizes), whatever the backend's own default layout.
     *
     * @return what is wrong with the checkpoint (one line per damaged or missing block, naming
     *         its file), empty when every block read back; when not empty the population is
     *         unchanged
     */
    List<String> readBlocks(BlockStore store, List<StoredBlock> blocks);

    /** A copy of the population's state, from which {@link #restore} can continue bit for bit. */
    PopulationSnapshot snapshot();

    /** Replaces the population's state with a snapshot taken from a population of the same shape. */
    void restore(PopulationSnapshot snapshot);

    /** Releases the population's resources (cached blocks); the backend stays open. */
    @Override
    void close();
}
