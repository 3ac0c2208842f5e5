package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;
import org.skerry.engine.population.ParticleRows;

/**
 * One output file of the final population, written as the population streams past in canonical
 * order: {@link #append} for each run of rows, then {@link #finish} publishes the file atomically.
 * {@link #close} without {@code finish} abandons it and leaves nothing behind, so that a failed
 * export never leaves a partial file in the run folder.
 */
public interface ParticleWriter extends AutoCloseable {

    /** Writes the next rows; their {@code firstIndex} follows the previous call's last row. */
    void append(ParticleRows rows) throws IOException;

    /** Publishes the file (an atomic move into place) and returns its path. */
    Path finish() throws IOException;

    /** Releases resources; removes the temporary file when {@link #finish} was not reached. */
    @Override
    void close() throws IOException;
}
