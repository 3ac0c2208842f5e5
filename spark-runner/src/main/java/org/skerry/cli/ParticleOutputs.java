package org.skerry.cli;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.skerry.cli.output.ParticleWriter;
import org.skerry.cli.output.ParticlesArrow;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.cli.output.ParticlesFormat;
import org.skerry.engine.population.ParticleRows;
import org.skerry.engine.population.ParticleSink;

/**
 * A run's files of the final population, open while it streams from the blocks: each run of
 * rows goes to every writer as it arrives, and the time spent in the writers is kept apart, so
 * that timing.json can split the interleaved export (fetching, summaries) from the output
 * writing. The files are opened at the first rows and get their names only at {@link #finish};
 * {@link #close} before that leaves nothing behind.
 */
final class ParticleOutputs implements ParticleSink, AutoCloseable {

    private final Path folder;
    private final List<String> parameterNames;
    private final int dimension;
    private final long size;
    private final ParticlesFormat format;
    private final List<ParticleWriter> writers = new ArrayList<>();
    private boolean opened;
    private long writingNanos;

    private ParticleOutputs(Path folder, List<String> parameterNames, int dimension, long size,
            ParticlesFormat format) {
        this.folder = folder;
        this.parameterNames = List.copyOf(parameterNames);
        this.dimension = dimension;
        this.size = size;
        this.format = format;
    }

    /**
     * The run's particle files in {@code folder}, opened when the first rows arrive: a run that
     * is killed while it samples leaves no temporary file behind, as before the export streamed.
     */
    static ParticleOutputs open(Path folder, List<String> parameterNames, int dimension, long size,
            ParticlesFormat format) {
        ParticlesCsv.checkParameterNames(parameterNames);
        return new ParticleOutputs(folder, parameterNames, dimension, size, format);
    }

    private void openWriters() throws IOException {
        opened = true;
        // output.particles-format: which files this population gets (auto: by its count of numbers).
        if (format.writesCsv(size, dimension)) {
            writers.add(ParticlesCsv.open(folder, parameterNames, dimension));
        }
        if (format.writesArrow(size, dimension)) {
            writers.add(ParticlesArrow.open(folder, parameterNames));
        }
    }

    @Override
    public void accept(ParticleRows rows) {
        long start = System.nanoTime();
        try {
            if (!opened) {
                openWriters();
            }
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
            if (!opened) {
                openWriters();
            }
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
