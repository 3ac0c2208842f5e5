package org.skerry.cli;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.skerry.cli.output.ParticleWriter;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.engine.population.ParticleRows;
import org.skerry.engine.population.ParticleSink;

/**
 * A run's files of the final population, open while it streams from the blocks: each run of
 * rows goes to every writer as it arrives, and the time spent in the writers is kept apart, so
 * that timing.json can split the interleaved export (fetching, summaries) from the output
 * writing. The files get their names only at {@link #finish}; {@link #close} before that leaves
 * nothing behind.
 */
final class ParticleOutputs implements ParticleSink, AutoCloseable {

    private final Path folder;
    private final List<ParticleWriter> writers;
    private long writingNanos;

    private ParticleOutputs(Path folder, List<ParticleWriter> writers) {
        this.folder = folder;
        this.writers = writers;
    }

    /** Opens the run's particle files in {@code folder}. */
    static ParticleOutputs open(Path folder, List<String> parameterNames, int dimension) {
        List<ParticleWriter> writers = new ArrayList<>();
        try {
            writers.add(ParticlesCsv.open(folder, parameterNames, dimension));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the results into " + folder, e);
        }
        return new ParticleOutputs(folder, writers);
    }

    @Override
    public void accept(ParticleRows rows) {
        long start = System.nanoTime();
        try {
            for (ParticleWriter writer : writers) {
                writer.append(rows);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the results into " + folder, e);
        } finally {
            writingNanos += System.nanoTime() - start;
        }
    }

    /** Seconds spent in the writers so far (appending and finishing). */
    double writingSeconds() {
        return writingNanos * 1e-9;
    }

    /** Publishes every file. */
    void finish() throws IOException {
        long start = System.nanoTime();
        try {
            for (ParticleWriter writer : writers) {
                writer.finish();
            }
        } finally {
            writingNanos += System.nanoTime() - start;
        }
    }

    /** Abandons the files not yet published. */
    @Override
    public void close() {
        for (ParticleWriter writer : writers) {
            try {
                writer.close();
            } catch (IOException e) {
                // Only an abandoned temporary can be left; the run's outcome is already decided.
            }
        }
    }
}
