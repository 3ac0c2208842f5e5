package org.skerry.engine.population;

/**
 * Receives the final population as it streams from the blocks in canonical order, one
 * {@link ParticleRows} at a time, so that no receiver needs the whole population at once. An
 * output that cannot be written throws {@link java.io.UncheckedIOException}, which ends the run's
 * export.
 */
@FunctionalInterface
public interface ParticleSink {

    /** The next rows; their {@code firstIndex} follows the previous call's last row. */
    void accept(ParticleRows rows);
}
