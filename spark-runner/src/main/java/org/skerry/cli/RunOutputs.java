package org.skerry.cli;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import org.skerry.cli.output.IterationsCsv;
import org.skerry.cli.output.ParticleWriter;
import org.skerry.cli.output.ParticlesArrow;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.cli.output.ParticlesFormat;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.RunEnvironment;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.output.TimingJson;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.ParticleRows;
import org.skerry.engine.sampler.SamplerResult;

/**
 * Writes a run folder in the order that keeps it honest: the resolved settings before the run;
 * after it the particles, the iteration table, the timing and — last — the summary, whose
 * presence marks a finished run. Each file is written whole or not at all.
 */
final class RunOutputs {

    /** What a finished run leaves to write. */
    record Run(String name, String model, long seed, List<String> parameterNames, SamplerResult result, double wallSeconds,
            double startupSeconds, Instant startedAt, String backend, ParticlesFormat particlesFormat) {
    }

    /** Rows per {@link ParticleRows} handed to a streaming writer. */
    private static final int CHUNK = 1 << 16;

    private RunOutputs() {
    }

    static void writeSettings(Path folder, String resolvedSettings) {
        try {
            RunConfFile.write(folder, Version.text(), resolvedSettings);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + folder.resolve(RunConfFile.FILE_NAME), e);
        }
    }

    /** Rewrites {@code iterations.csv} with the iterations so far (after each checkpoint). */
    static void writeIterations(Path folder, List<org.skerry.engine.sampler.IterationRecord> records) {
        try {
            IterationsCsv.write(folder, records);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + folder.resolve(IterationsCsv.FILE_NAME), e);
        }
    }

    static void writeResults(Path folder, Run run) {
        try {
            SamplerResult result = run.result();
            long start = System.nanoTime();
            FinalParticles particles = result.particles();
            ParticlesFormat format = run.particlesFormat();
            if (format.writesCsv(particles.size(), particles.dimension())) {
                ParticlesCsv.write(folder, run.parameterNames(), particles, result.normalisedWeights());
            }
            if (format.writesArrow(particles.size(), particles.dimension())) {
                try (ParticleWriter arrow = ParticlesArrow.open(folder, run.parameterNames())) {
                    stream(particles, result.normalisedWeights(), arrow);
                    arrow.finish();
                }
            }
            IterationsCsv.write(folder, result.iterations(), run.parameterNames());
            double output = (System.nanoTime() - start) * 1e-9;
            double sampling = run.wallSeconds() - run.startupSeconds() - result.exportSeconds();
            TimingJson.write(folder, RunEnvironment.current(Version.text(), run.backend(), run.startedAt()),
                    new TimingJson.Stages(run.wallSeconds(), run.startupSeconds(), sampling, result.exportSeconds(),
                            output), result.iterations());
            SummaryJson.write(folder, run.name(), run.model(), run.seed(), result);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the results into " + folder, e);
        }
    }

    /**
     * Hands the final population to {@code writer} in runs of {@link #CHUNK} rows, as the
     * streamed export will (until then the population is whole in the driver).
     */
    private static void stream(FinalParticles particles, double[] weights, ParticleWriter writer) throws IOException {
        int d = particles.dimension();
        int n = particles.size();
        int chunk = Math.max(1, Math.min(CHUNK, n));
        double[] values = new double[chunk * d];
        double[] w = new double[chunk];
        double[] logLikelihood = new double[chunk];
        double[] logPrior = new double[chunk];
        for (int start = 0; start < n; start += chunk) {
            int count = Math.min(chunk, n - start);
            System.arraycopy(particles.values(), start * d, values, 0, count * d);
            System.arraycopy(weights, start, w, 0, count);
            System.arraycopy(particles.logLikelihood(), start, logLikelihood, 0, count);
            System.arraycopy(particles.logPrior(), start, logPrior, 0, count);
            writer.append(new ParticleRows(start, count, d, values, w, logLikelihood, logPrior));
        }
    }
}
