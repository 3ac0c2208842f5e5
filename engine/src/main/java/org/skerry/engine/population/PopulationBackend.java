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
     * Opens room for a population of {@code particles} particles of the model {@code source}
     * builds, in exactly {@code blocks} blocks, or as many as the backend prefers when
     * {@code blocks} is 0. Distributed backends send the source to their workers once.
     */
    BlockExecutor open(ModelSource source, int particles, int blocks);

    @Override
    void close();
}
