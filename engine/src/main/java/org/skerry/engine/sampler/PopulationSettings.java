package org.skerry.engine.sampler;

import org.skerry.engine.model.Prior;

/**
 * The population: its size N, the seed every random stream is keyed by, where it starts, and how
 * few distinct ancestors (Eve indices) flag the single-run evidence error as unreliable.
 *
 * @param particles           number of particles N (at least 2)
 * @param seed                the run's seed
 * @param startProposal       the user's start distribution q, or {@code null} to start from the prior
 * @param minimumDistinctEves fewer distinct Eve indices than this flag the evidence error (at least 1)
 */
public record PopulationSettings(int particles, long seed, Prior startProposal, int minimumDistinctEves) {

    /** 1000 particles, seed 1, from the prior, 20 distinct Eves. */
    public static final PopulationSettings DEFAULTS = new PopulationSettings(1000, 1, null, 20);

    public PopulationSettings {
        if (particles < 2) {
            throw new IllegalArgumentException("particles must be >= 2, was " + particles);
        }
        if (minimumDistinctEves < 1) {
            throw new IllegalArgumentException("minimumDistinctEves must be >= 1, was " + minimumDistinctEves);
        }
    }
}
