package org.skerry.engine.population;

import org.skerry.engine.model.ModelSource;

/**
 * Where populations live and are worked on: a thread pool in this JVM, or a Spark cluster.
 * One backend can hold several populations at once (a batch of analyses sharing a cluster).
 */
public interface PopulationBackend extends AutoCloseable {

    /** A short name for logs and outputs, e.g. {@code threads(2)}. */
    String description();

    /**
     * Creates an empty population of {@code particles} particles of the model {@code source}
     * builds, keyed by {@code seed}. Distributed backends send the source to their executors.
     */
    default Population create(ModelSource source, int particles, long seed) {
        return create(source, particles, seed, 0);
    }

    /**
     * As {@link #create(ModelSource, int, long)}, with exactly {@code islands} blocks of
     * ⌊N/K⌋ or ⌈N/K⌉ particles (the first N mod K blocks larger) when {@code islands > 0}: in
     * island mode each block is an island, whatever the number of threads or executors.
     */
    Population create(ModelSource source, int particles, long seed, int islands);

    @Override
    void close();
}
