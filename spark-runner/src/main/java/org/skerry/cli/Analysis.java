package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.SortedMap;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.progress.ProgressDisplay;
import org.skerry.cli.report.ReportWriter;
import org.skerry.cli.runfile.AnswerSettings;
import org.skerry.cli.runfile.ModelBuilder;
import org.skerry.cli.runfile.ModelSpec;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.cli.runfile.SparkMasters;
import org.skerry.cli.stop.StopRules;
import org.skerry.cli.stop.TerminationSignal;
import org.skerry.engine.sampler.Checkpointer;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.RunStoppedException;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerState;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.sampler.StopCondition;
import org.skerry.spark.SparkBackend;
import org.skerry.checkpoint.CheckpointFileSystem;
import org.skerry.checkpoint.CheckpointFolder;
import org.skerry.checkpoint.CheckpointResumption;
import org.skerry.spark.CheckpointVisibility;
import org.skerry.spark.ProgramStartCheck;
import org.skerry.checkpoint.CheckpointWriteException;
import org.skerry.checkpoint.FileCheckpointer;
import org.skerry.checkpoint.NoUsableCheckpointException;
import org.skerry.checkpoint.SettingsChangedException;

/**
 * Runs one analysis on the driver: builds the model, prepares the run folder (refusing one that
 * already holds files), saves the resolved settings first, runs the sampler with a progress
 * display, checkpoints and the stop rules (signal, wall time), then writes the results — each
 * file written whole or not at all, {@code summary.json} last, so its presence marks a finished
 * run. {@link #resume} continues such a run from its newest valid checkpoint.
 */
public final class Analysis {

    private static final DateTimeFormatter FOLDER_TIME =
            DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss").withZone(ZoneOffset.UTC);

    /** A finished analysis. */
    public record Outcome(Path folder, RunSpec spec, SamplerResult result, double wallSeconds) {
    }

    /**
     * One analysis about to run: its settings and built model, its run folder, when it started
     * (the clock time for the outputs, the nanosecond count for its wall time), and whether it
     * continues from a checkpoint or starts afresh.
     */
    private record Job(RunSpec spec, ModelBuilder.Built built, Path runFolder, Instant started, long startNanos,
            Start start) {

        /** The same job started afresh (a resume that found no checkpoint yet). */
        Job afresh() {
            return new Job(spec, built, runFolder, started, startNanos, Start.AFRESH);
        }
    }

    /** Whether a job starts afresh or continues from its newest valid checkpoint. */
    private enum Start { AFRESH, FROM_CHECKPOINT }

    private Analysis() {
    }

    /**
     * @param folder the run folder, or null for {@code <output.folder>/<name>-<start time>}
     * @param progressOut where progress goes (standard error for the command)
     */
    public static Outcome run(RunSpec spec, Path folder, PrintWriter progressOut) {
        return run(spec, folder, progressOut, IterationListener.NONE);
    }

    /**
     * As {@link #run(RunSpec, Path, PrintWriter)}, also telling {@code observer} about each
     * iteration on the thread that runs the sampler (the scaling study measures the driver there).
     */
    public static Outcome run(RunSpec spec, Path folder, PrintWriter progressOut, IterationListener observer) {
        ModelBuilder.Built built = ModelBuilder.build(spec);
        checkParameterNames(spec, built);
        ModelBuilder.checkStarts(spec, built);
        Instant started = Instant.now();
        Path runFolder = folder != null ? folder
                : spec.outputs().folder().resolve(spec.name() + "-" + FOLDER_TIME.format(started));
        Path created = firstMissing(runFolder);
        prepare(runFolder);
        try {
            RunOutputs.writeSettings(runFolder, forRunFolder(spec).render());
            return execute(new Job(spec, built, runFolder, started, System.nanoTime(), Start.AFRESH), progressOut,
                    observer);
        } catch (RunFileException e) {
            // Bad input found only now (an unreachable master, a model class missing on the
            // executors): nothing ran, so nothing of this run is left behind.
            removeUnstarted(spec, runFolder, created);
            throw e;
        }
    }

    /** The outermost folder of {@code folder}'s path that does not exist yet, or null if it exists. */
    private static Path firstMissing(Path folder) {
        Path missing = null;
        for (Path p = folder.toAbsolutePath().normalize(); p != null && !Files.exists(p); p = p.getParent()) {
            missing = p;
        }
        return missing;
    }

    /**
     * Removes what a fresh run that failed on bad input wrote — the run folder if it made it,
     * else the folder's content (it was empty) — unless a checkpoint was written, which a resume
     * could use.
     */
    private static void removeUnstarted(RunSpec spec, Path runFolder, Path created) {
        try {
            if (!new CheckpointFolder(checkpointFiles(spec, runFolder), spec.checkpoints().keep()).list().isEmpty()) {
                return;
            }
        } catch (IOException | RuntimeException e) {
            // none could be listed, so none can be resumed from
        }
        Path top = created != null ? created : runFolder.toAbsolutePath().normalize();
        try (Stream<Path> paths = Files.walk(top)) {
            paths.sorted(java.util.Comparator.reverseOrder())
                    .filter(p -> created != null || !p.equals(top))
                    .forEach(p -> p.toFile().delete());
        } catch (IOException | java.io.UncheckedIOException e) {
            // best effort: the message already says what went wrong
        }
    }

    /**
     * Continues the run in {@code runFolder} from its newest valid checkpoint, with its saved
     * {@code run.conf} and {@code overrides} (which must not change the answer).
     */
    public static Outcome resume(Path runFolder, List<String> overrides, PrintWriter progressOut) {
        RunSpec spec = savedSpec(runFolder, overrides);
        ModelBuilder.Built built = ModelBuilder.build(spec);
        ModelBuilder.checkStarts(spec, built);
        return execute(new Job(spec, built, runFolder, Instant.now(), System.nanoTime(),
                Start.FROM_CHECKPOINT), progressOut, IterationListener.NONE);
    }

    /** The run folder's saved settings with {@code overrides} on top. */
    private static RunSpec savedSpec(Path runFolder, List<String> overrides) {
        Path conf = runFolder.resolve(RunConfFile.FILE_NAME);
        if (!Files.isDirectory(runFolder)) {
            throw new RunFileException("run folder " + runFolder + " does not exist");
        }
        if (!Files.isRegularFile(conf)) {
            throw new RunFileException(runFolder + " is not a run folder: it has no " + RunConfFile.FILE_NAME);
        }
        return RunSpec.from(RunFile.load(conf, overrides));
    }

    /** Whether there is a checkpoint to resume from (or a damaged one to report): not only unfinished writes. */
    private static boolean hasCheckpoints(CheckpointFolder checkpoints) {
        try {
            return checkpoints.list().stream().anyMatch(found -> !found.unfinished());
        } catch (java.io.IOException e) {
            throw new RunEnded(ExitCodes.RUN_FAILURE, "cannot list the checkpoints in " + checkpoints.files().root()
                    + ": " + e.getMessage(), e);
        }
    }

    /**
     * Checks {@code overrides} for the finished run in {@code runFolder} as a resume would (known
     * keys, valid values, nothing that changes the answer), though there is nothing left to run.
     *
     * @throws RunFileException if an override is bad input or would change the answer
     */
    public static void checkFinishedResume(Path runFolder, List<String> overrides) {
        RunSpec now = savedSpec(runFolder, overrides);
        if (overrides.isEmpty()) {
            return;
        }
        RunSpec saved = savedSpec(runFolder, List.of());
        List<String> differences = AnswerSettings.differences(AnswerSettings.of(saved), AnswerSettings.of(now));
        if (!differences.isEmpty()) {
            throw new RunFileException("the run in " + runFolder + " has finished, and these settings would change "
                    + "its answer: " + String.join("; ", differences) + " (start a new run for that)");
        }
    }

    /** Refuses, before anything is written, parameter names that cannot head the columns of particles.csv. */
    private static void checkParameterNames(RunSpec spec, ModelBuilder.Built built) {
        try {
            ParticlesCsv.checkParameterNames(built.model().parameters().names());
        } catch (IllegalArgumentException e) {
            throw new RunFileException("model " + spec.model().label() + ": " + e.getMessage(), e);
        }
    }

    /** Removes what interrupted checkpoint writes left, newer than {@code after}, and says so. */
    private static void removeUnfinished(CheckpointFolder checkpoints, int after, PrintWriter notices) {
        try {
            List<String> removed = checkpoints.removeUnfinished(after);
            if (!removed.isEmpty()) {
                say(notices, "removed what an interrupted checkpoint write left in " + checkpoints.files().root()
                        + ": " + String.join(", ", removed));
            }
        } catch (java.io.IOException e) {
            // Harmless leftovers: the next write of that iteration replaces its folder.
            say(notices, "could not remove the leftovers of an interrupted checkpoint write in "
                    + checkpoints.files().root() + ": " + e.getMessage());
        }
    }

    /** Whether the run in {@code runFolder} has finished (its summary is written last). */
    public static boolean finished(Path runFolder) {
        return Files.isRegularFile(runFolder.resolve(SummaryJson.FILE_NAME));
    }

    /** The settings as saved in run.conf: paths made absolute, so the run folder works from anywhere. */
    private static RunFile forRunFolder(RunSpec spec) {
        RunFile file = spec.file();
        if (spec.model().dataFile() != null) {
            file = file.withValue("data.file", spec.model().dataFile().toString());
        }
        if (spec.model().program()) {
            // Absolute paths (files, ./ commands), so the run folder resumes from anywhere.
            file = file.withValue(ModelSpec.PROGRAM_KEY, spec.model().settings().root().unwrapped());
        }
        String checkpoints = spec.checkpoints().path();
        if (checkpoints != null && new org.apache.hadoop.fs.Path(checkpoints).toUri().getScheme() == null) {
            file = file.withValue("checkpoint.path", Path.of(checkpoints).toAbsolutePath().normalize().toString());
        }
        return file;
    }

    /** The checkpoint root: checkpoint.path, or the run folder's checkpoints/. */
    static CheckpointFileSystem checkpointFiles(RunSpec spec, Path runFolder) {
        String root = spec.checkpoints().path();
        if (root == null) {
            root = runFolder.resolve("checkpoints").toAbsolutePath().normalize().toUri().toString();
        } else if (new org.apache.hadoop.fs.Path(root).toUri().getScheme() == null) {
            root = Path.of(root).toAbsolutePath().normalize().toUri().toString();
        }
        Map<String, String> hadoop = new TreeMap<>();
        spec.backend().sparkSettings().forEach((key, value) -> {
            if (key.startsWith("spark.hadoop.")) {
                hadoop.put(key.substring("spark.hadoop.".length()), value);
            }
        });
        return new CheckpointFileSystem(root, hadoop);
    }

    private static Outcome execute(Job job, PrintWriter progressOut, IterationListener observer) {
        RunSpec spec = job.spec();
        Path runFolder = job.runFolder();
        RunOutcome.clear(runFolder);
        try {
            return executeRecorded(job, progressOut, observer);
        } catch (RuntimeException | Error e) {
            // In a cluster's driver the exit code may never reach the user: the folder says it.
            RunOutcome.record(runFolder, e);
            throw e;
        }
    }

    private static Outcome executeRecorded(Job job, PrintWriter progressOut, IterationListener observer) {
        RunSpec spec = job.spec();
        Path runFolder = job.runFolder();
        if (spec.outputs().report()) {
            org.skerry.cli.report.ReportWarmup.startInBackground();
        }
        try (TerminationSignal signal = TerminationSignal.install(spec.limits().stopGraceSeconds(), progressOut,
                        ExitCodes.STOPPED_RESUMABLE, TerminationSignal.EXIT, () -> {
                            String kept = whatIsKept(spec, runFolder);
                            RunOutcome.recordAbandoned(runFolder, kept);
                            return kept;
                        });
                Backends.Opened opened = Backends.open(spec, runFolder);
                ProgressDisplay progress = announced(progress(spec, progressOut,
                        job.built().model().parameters().names()), spec, runFolder,
                        job.start() == Start.FROM_CHECKPOINT)) {
            IterationListener shown = progress == null ? IterationListener.NONE : progress;
            IterationListener listener = observer == IterationListener.NONE ? shown : record -> {
                shown.iterationFinished(record);
                observer.iterationFinished(record);
            };
            try {
                return core(job, opened.backend, listener, new StopRules(signal, spec.limits().maxWallTime(), job.startNanos()),
                        progressOut);
            } finally {
                signal.runEnded();
            }
        }
    }

    /** For an abandoned run: the checkpoint it stops on, what is lost, and how to continue. */
    private static String whatIsKept(RunSpec spec, Path runFolder) {
        int last = spec.checkpoints().enabled()
                ? new CheckpointFolder(checkpointFiles(spec, runFolder), spec.checkpoints().keep()).newestComplete() : -1;
        return (last >= 0 ? "The run stops on the checkpoint of iteration " + last
                + "; the work since is lost and will be done again"
                : "No checkpoint was written yet; the run will start again from the beginning")
                + ". Continue with: skerry resume " + runFolder;
    }

    /**
     * Runs one analysis into {@code folder} on a backend the caller opened and keeps open (a batch
     * shares one backend between concurrent analyses), with checkpoints, reporting each iteration
     * to {@code listener} and stopping resumably when {@code stop} says so.
     */
    public static Outcome run(RunSpec spec, Path folder, PopulationBackend backend, IterationListener listener,
            StopCondition stop, PrintWriter notices) {
        ModelBuilder.Built built = ModelBuilder.build(spec);
        checkParameterNames(spec, built);
        ModelBuilder.checkStarts(spec, built);
        Instant started = Instant.now();
        prepare(folder);
        RunOutputs.writeSettings(folder, forRunFolder(spec).render());
        return core(new Job(spec, built, folder, started, System.nanoTime(), Start.AFRESH), backend, listener, stop,
                notices);
    }

    /**
     * Continues the unfinished analysis in {@code folder} from its newest valid checkpoint (or from
     * the start if it has none yet) on a backend the caller keeps open.
     */
    public static Outcome resume(Path folder, PopulationBackend backend, IterationListener listener,
            StopCondition stop, PrintWriter notices) {
        RunSpec spec = savedSpec(folder, List.of());
        ModelBuilder.Built built = ModelBuilder.build(spec);
        ModelBuilder.checkStarts(spec, built);
        return core(new Job(spec, built, folder, Instant.now(), System.nanoTime(),
                Start.FROM_CHECKPOINT), backend, listener, stop, notices);
    }

    /** The run itself, on an open backend: checkpoints, resume, stop rules, results, and what each failure means. */
    private static Outcome core(Job job, PopulationBackend backend, IterationListener listener, StopCondition stop,
            PrintWriter notices) {
        RunSpec spec = job.spec();
        ModelBuilder.Built built = job.built();
        Path runFolder = job.runFolder();
        CheckpointFolder checkpoints = new CheckpointFolder(checkpointFiles(spec, runFolder), spec.checkpoints().keep());
        if (job.start() == Start.FROM_CHECKPOINT && !hasCheckpoints(checkpoints)) {
            // Stopped before its first checkpoint: nothing is lost by starting again, and the seed
            // makes it the same run.
            removeUnfinished(checkpoints, -1, notices);
            say(notices, "no checkpoint in " + runFolder + " yet: running it from the start");
            job = job.afresh();
        }
        SortedMap<String, String> answer = AnswerSettings.of(spec);
        if (spec.checkpoints().enabled()) {
            checkVisible(backend, checkpoints);
        }
        if (spec.model().program()) {
            checkProgramStarts(backend, built);
        }
        Checkpointer checkpointer = spec.checkpoints().enabled()
                ? new FileCheckpointer(checkpoints, spec.checkpoints().everyIterations(), spec.checkpoints().everyMinutes(),
                        answer, state -> RunOutputs.writeIterations(runFolder, state.records()))
                : Checkpointer.NONE;
        SamplerResult result;
        double wall;
        // The particle files stream while the run exports; closing abandons any not finished.
        try (ParticleOutputs particles = ParticleOutputs.open(runFolder, built.model().parameters().names(),
                built.model().dimension(), spec.sampler().population().particles(), spec.outputs().particles())) {
            SmcSampler sampler = new SmcSampler(spec.sampler()).streamingTo(particles);
            double startup = (System.nanoTime() - job.startNanos()) * 1e-9;
            try {
                if (job.start() == Start.FROM_CHECKPOINT) {
                    CheckpointResumption from = new CheckpointResumption(checkpoints, answer);
                    result = sampler.resume(built.source(), backend, listener, checkpointer, stop, population -> {
                        SamplerState restored = from.restore(population);
                        for (String skipped : from.skipped()) {
                            say(notices, "skipped checkpoint " + skipped);
                        }
                        say(notices, "resuming " + runFolder + " after iteration " + restored.iteration()
                                + " (temperature " + restored.temperature() + ")");
                        removeUnfinished(checkpoints, restored.iteration(), notices);
                        return restored;
                    });
                } else {
                    result = sampler.run(built.source(), backend, listener, checkpointer, stop);
                }
            } catch (RunStoppedException e) {
                throw new RunEnded(ExitCodes.STOPPED_RESUMABLE, e.getMessage() + "; its checkpoint is in "
                        + checkpoints.files().root() + ". Continue with: skerry resume " + runFolder, e);
            } catch (CheckpointWriteException e) {
                throw new RunEnded(ExitCodes.RUN_FAILURE, e.getMessage() + ". Fix the cause, then continue with: "
                        + "skerry resume " + runFolder, e);
            } catch (java.io.UncheckedIOException e) {
                throw outputFailed(e, checkpoints, runFolder);
            } catch (SettingsChangedException e) {
                throw new RunFileException(e.getMessage(), e);
            } catch (NoUsableCheckpointException e) {
                throw new RunEnded(ExitCodes.RUN_FAILURE, "cannot resume " + runFolder + ": " + e.getMessage(), e);
            } catch (Exception e) {
                // Spark's job failures are checked exceptions thrown through Scala: a model class
                // missing on the executors is bad input (its jar is not in backend.jars).
                String missing = SparkFailures.missingModelClass(e);
                if (missing != null) {
                    throw new RunFileException(missing, e);
                }
                throw e;
            }
            wall = (System.nanoTime() - job.startNanos()) * 1e-9;
            try {
                RunOutputs.writeResults(runFolder, new RunOutputs.Run(spec.name(), spec.model().label(), spec.sampler().population().seed(),
                        built.model().parameters().names(), result, wall, startup, job.started(), backend.description(),
                        spec.outputs().particles()), particles);
            } catch (java.io.UncheckedIOException e) {
                throw outputFailed(e, checkpoints, runFolder);
            }
        }
        if (spec.outputs().report()) {
            writeReport(runFolder, notices);
        }
        return new Outcome(runFolder, spec, result, wall);
    }

    /**
     * The run's report (report/index.html and its figures). The results are written by now, so a
     * report that cannot be made is a notice, not a failed run: {@code skerry report} can make it later.
     */
    private static void writeReport(Path runFolder, PrintWriter notices) {
        long start = System.nanoTime();
        try {
            Path page = ReportWriter.write(runFolder);
            // Its path, and what it cost: the report must stay a small share of a run's wall time.
            say(notices, String.format(Locale.ROOT, "report: %s (made in %.2f s)", page,
                    (System.nanoTime() - start) * 1e-9));
        } catch (java.io.IOException | RuntimeException e) {
            notices.println("skerry: the run's results are written, but its report could not be: " + e.getMessage()
                    + "; make it later with: skerry report " + runFolder);
            notices.flush();
        }
    }

    /** A run-folder file could not be written (full or read-only disk): say so, and what is kept. */
    private static RunEnded outputFailed(java.io.UncheckedIOException e, CheckpointFolder checkpoints, Path runFolder) {
        int lastGood = checkpoints.newestComplete();
        return new RunEnded(ExitCodes.RUN_FAILURE, e.getMessage() + ": " + CheckpointWriteException.rootMessage(e)
                + (lastGood >= 0 ? "; the checkpoint of iteration " + lastGood + " is intact. Fix the cause, then "
                        + "continue with: skerry resume " + runFolder : ""), e);
    }

    /** On a cluster, executors must see the checkpoint folder; local mode shares the driver's disk. */
    private static void checkVisible(PopulationBackend backend, CheckpointFolder checkpoints) {
        if (!(backend instanceof SparkBackend)) {
            return;
        }
        JavaSparkContext context = ((SparkBackend) backend).context();
        if (SparkMasters.isInProcess(context.master())) {
            return;
        }
        try {
            CheckpointVisibility.check(context, checkpoints);
        } catch (IllegalArgumentException e) {
            throw new RunFileException(e.getMessage(), e);
        } catch (java.io.IOException e) {
            throw new RunEnded(ExitCodes.RUN_FAILURE, "cannot write to the checkpoint folder "
                    + checkpoints.files().root() + ": " + e.getMessage(), e);
        }
    }

    /**
     * On a cluster, every executor must be able to start the model program (the driver's check,
     * {@link ModelBuilder#checkStarts}, covers local mode and the thread backend).
     */
    private static void checkProgramStarts(PopulationBackend backend, ModelBuilder.Built built) {
        if (!(backend instanceof SparkBackend)) {
            return;
        }
        JavaSparkContext context = ((SparkBackend) backend).context();
        if (SparkMasters.isInProcess(context.master())) {
            return;
        }
        try {
            ProgramStartCheck.check(context, built.source());
        } catch (IllegalArgumentException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    private static void say(PrintWriter out, String message) {
        synchronized (out) {
            out.println("skerry: " + message);
            out.flush();
        }
    }

    /**
     * Names the analysis once its backend is up (so that a backend that cannot start leaves its
     * error alone on the screen), before the first iteration, which can take long.
     */
    private static ProgressDisplay announced(ProgressDisplay progress, RunSpec spec, Path runFolder, boolean resume) {
        if (progress != null) {
            progress.announce((resume ? "continuing " : "running ") + spec.name() + ": model " + spec.model().label()
                    + ", " + spec.sampler().population().particles() + " particles, seed " + spec.sampler().population().seed() + "; run folder "
                    + runFolder);
        }
        return progress;
    }

    private static ProgressDisplay progress(RunSpec spec, PrintWriter out, List<String> names) {
        boolean terminal = System.console() != null;
        switch (spec.outputs().progress()) {
            case OFF:
                return null;
            case LIVE:
                return new ProgressDisplay(out, true, Clock.systemUTC(), names, spec.name());
            case LOG:
                return new ProgressDisplay(out, false, Clock.systemUTC(), names, spec.name());
            default:
                return new ProgressDisplay(out, terminal, Clock.systemUTC(), names, spec.name());
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
