package org.skerry.engine.sampler;

import org.skerry.engine.population.Population;

/**
 * Saves a run between iterations so that it can continue after a crash or a stop. The sampler
 * asks {@link #due} after every completed iteration, writes when told to, and always writes once
 * more when it stops on request or reaches φ = 1. An implementation decides where the files go
 * and how often (every k iterations, every m minutes).
 */
public interface Checkpointer {

    /** Writes nothing. */
    Checkpointer NONE = new Checkpointer() {
        @Override
        public boolean due(int iteration) {
            return false;
        }

        @Override
        public void write(SamplerState state, Population population) {
        }

        @Override
        public boolean enabled() {
            return false;
        }
    };

    /** Whether a checkpoint should be written now that {@code iteration} is complete. */
    boolean due(int iteration);

    /**
     * Writes the driver's state and the population's blocks; the checkpoint must not look
     * complete unless all of it was written.
     *
     * @throws java.io.UncheckedIOException when it cannot be written; earlier checkpoints stay valid
     */
    void write(SamplerState state, Population population);

    /** Whether this checkpointer writes anything at all. */
    default boolean enabled() {
        return true;
    }
}
