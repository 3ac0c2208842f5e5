package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.stream.Stream;
import org.skerry.cli.progress.ProgressDisplay;
import org.skerry.cli.runfile.ModelBuilder;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SmcSampler;

/**
 * Runs one analysis on the driver: builds the model, prepares the run folder (refusing one that
 * already holds files), saves the resolved settings first, runs the sampler with a progress
 * display, then writes the results — each file written whole or not at all, {@code summary.json}
 * last, so its presence marks a finished run.
 */
public final class Analysis {

    private static final DateTimeFormatter FOLDER_TIME =
            DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss").withZone(ZoneOffset.UTC);

    /** A finished analysis. */
    public record Outcome(Path folder, RunSpec spec, SamplerResult result, double wallSeconds) {
    }

    private Analysis() {
    }

    /**
     * @param folder the run folder, or null for {@code <output.folder>/<name>-<start time>}
     * @param progressOut where progress goes (standard error for the command)
     */
    public static Outcome run(RunSpec spec, Path folder, PrintWriter progressOut) {
        ModelBuilder.Built built = ModelBuilder.build(spec);
        Instant started = Instant.now();
        Path runFolder = folder != null ? folder : spec.outputFolder().resolve(spec.name() + "-" + FOLDER_TIME.format(started));
        prepare(runFolder);
        RunOutputs.writeSettings(runFolder, spec.file().render());

        long start = System.nanoTime();
        SamplerResult result;
        try (Backends.Opened opened = Backends.open(spec, runFolder);
                ProgressDisplay progress = progress(spec, progressOut)) {
            IterationListener listener = progress == null ? IterationListener.NONE : progress;
            result = new SmcSampler(spec.sampler()).run(built.source(), opened.backend, listener);
            double wall = (System.nanoTime() - start) * 1e-9;
            RunOutputs.writeResults(runFolder, new RunOutputs.Run(spec.modelLabel(), spec.sampler().seed(),
                    built.model().parameters().names(), result, wall, started, opened.backend.description()));
            return new Outcome(runFolder, spec, result, wall);
        }
    }

    /**
     * Runs one analysis into {@code folder} on a backend the caller opened and keeps open (a batch
     * shares one backend between concurrent analyses), reporting each iteration to
     * {@code listener}.
     */
    public static Outcome run(RunSpec spec, Path folder, PopulationBackend backend, IterationListener listener) {
        ModelBuilder.Built built = ModelBuilder.build(spec);
        Instant started = Instant.now();
        prepare(folder);
        RunOutputs.writeSettings(folder, spec.file().render());
        long start = System.nanoTime();
        SamplerResult result = new SmcSampler(spec.sampler()).run(built.source(), backend, listener);
        double wall = (System.nanoTime() - start) * 1e-9;
        RunOutputs.writeResults(folder, new RunOutputs.Run(spec.modelLabel(), spec.sampler().seed(),
                built.model().parameters().names(), result, wall, started, backend.description()));
        return new Outcome(folder, spec, result, wall);
    }

    private static ProgressDisplay progress(RunSpec spec, PrintWriter out) {
        boolean terminal = System.console() != null;
        switch (spec.progress()) {
            case OFF:
                return null;
            case LIVE:
                return new ProgressDisplay(out, true);
            case LOG:
                return new ProgressDisplay(out, false);
            default:
                return new ProgressDisplay(out, terminal);
        }
    }

    /** Creates the run folder, or accepts an empty one; anything else is bad input. */
    static void prepare(Path folder) {
        try {
            if (Files.exists(folder)) {
                if (!Files.isDirectory(folder)) {
                    throw new RunFileException("run folder " + folder + " exists and is not a folder");
                }
                try (Stream<Path> entries = Files.list(folder)) {
                    if (entries.findAny().isPresent()) {
                        throw new RunFileException("run folder " + folder
                                + " already holds files; choose another --out or remove it (nothing was overwritten)");
                    }
                }
            }
            Files.createDirectories(folder);
            if (!Files.isWritable(folder)) {
                throw new RunFileException("cannot write run folder " + folder + ": permission denied");
            }
        } catch (IOException e) {
            throw new RunFileException("cannot create run folder " + folder + ": " + e, e);
        }
    }
}
