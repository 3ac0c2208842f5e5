package org.skerry.cli;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import org.skerry.cli.output.IterationsCsv;
import org.skerry.cli.output.ParticlesFormat;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.RunEnvironment;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.output.TimingJson;
import org.skerry.engine.sampler.SamplerResult;

/**
 * Writes a run folder in the order that keeps it honest: the resolved settings before the run;
 * after it the particles (streamed during the export, published here), the iteration table, the timing and — last — the summary, whose
 * presence marks a finished run. Each file is written whole or not at all.
 */
final class RunOutputs {

    /** What a finished run leaves to write. */
    record Run(String name, String model, long seed, List<String> parameterNames, SamplerResult result, double wallSeconds,
            double startupSeconds, Instant startedAt, String backend, ParticlesFormat particlesFormat) {
    }


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

    /**
     * Writes the files that follow a run, {@code particles} (which streamed during the export)
     * published first. Export and writing interleave: the seconds spent inside the particle
     * writers while the population streamed count as output, the rest of the sampler's export
     * time (fetching, weights, summaries, evidence error) as export.
     */
    static void writeResults(Path folder, Run run, ParticleOutputs particles) {
        try {
            SamplerResult result = run.result();
            double streamed = particles.writingSeconds();
            long start = System.nanoTime();
            particles.finish();
            IterationsCsv.write(folder, result.iterations(), run.parameterNames());
            double output = streamed + (System.nanoTime() - start) * 1e-9;
            double export = Math.max(0.0, result.exportSeconds() - streamed);
            double sampling = run.wallSeconds() - run.startupSeconds() - result.exportSeconds();
            TimingJson.write(folder, RunEnvironment.current(Version.text(), run.backend(), run.startedAt()),
                    new TimingJson.Stages(run.wallSeconds(), run.startupSeconds(), sampling, export, output),
                    result.iterations());
            SummaryJson.write(folder, run.name(), run.model(), run.seed(), result);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the results into " + folder, e);
        }
    }
}
