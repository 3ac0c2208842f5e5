package org.skerry.cli.batch;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.apache.spark.api.java.JavaSparkContext;
import org.skerry.cli.Analysis;
import org.skerry.cli.Backends;
import org.skerry.cli.Ending;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.RunEnded;
import org.skerry.cli.output.AtomicFile;
import org.skerry.cli.output.BatchSummary;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.RunSummaryReader;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.progress.BatchProgress;
import org.skerry.cli.runfile.BatchSpec;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.cli.runfile.OutputSpec;
import org.skerry.cli.stop.StopRules;
import org.skerry.cli.stop.TerminationSignal;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.StopCondition;
import org.skerry.spark.SparkBackend;

/**
 * Runs every analysis of a batch on one backend: on Spark one context, the analyses on driver
 * threads as concurrent jobs, each in its own fair-scheduler pool so that a long analysis does
 * not hold back short ones; on threads one shared pool. At most {@code concurrent} run at once.
 * An analysis that fails is reported (its run folder keeps what it wrote, plus
 * {@code failure.txt}) and the others go on. On an existing batch folder the batch resumes:
 * finished analyses are kept, interrupted ones continue, failed ones run again, after
 * {@link ResumeCheck} has made sure nothing that alters answers has changed.
 * {@code batch-summary.csv/json} are rewritten after each analysis ends.
 */
public final class BatchRunner {

    /** Written into an analysis's run folder when it fails, with the reason. */
    public static final String FAILURE_FILE = "failure.txt";

    /** Status of an analysis in the batch summary. */
    public static final String SUCCEEDED = "succeeded";
    public static final String FAILED = "failed";
    static final String WAITING = "waiting";
    static final String RUNNING = "running";

    /**
     * What a batch did: the summary rows in batch order, how many analyses failed, ran and were
     * kept, and whether it stopped on a termination signal or Ctrl-C (its unfinished analyses resumable).
     */
    public record Result(List<BatchSummary.Row> rows, int failed, int ran, int kept, boolean stopped) {
    }

    private final BatchSpec spec;
    private final Map<String, String> failures = new ConcurrentHashMap<>();
    private final Set<String> running = ConcurrentHashMap.newKeySet();
    private volatile TerminationSignal signal;
    private volatile StopRules stop;
    private PrintWriter notices;

    private BatchRunner(BatchSpec spec) {
        this.spec = spec;
    }

    /** Runs (or resumes) the batch; progress goes to {@code progressOut}. */
    public static Result run(BatchSpec spec, PrintWriter progressOut) {
        return new BatchRunner(spec).run(progressOut);
    }

    /** The run folder of an analysis: {@code <batch folder>/<dataset>/<variant>}. */
    public static Path runFolder(Path batchFolder, BatchSpec.Planned analysis) {
        return batchFolder.resolve(analysis.dataset().name()).resolve(analysis.variant().name());
    }

    private Path runFolder(BatchSpec.Planned analysis) {
        return runFolder(spec.folder(), analysis);
    }

    private Result run(PrintWriter progressOut) {
        Path folder = spec.folder();
        Path stateFile = folder.resolve(BatchState.FILE_NAME);
        BatchState now = BatchState.of(spec);
        List<BatchSpec.Planned> kept = new ArrayList<>();
        List<BatchSpec.Planned> interrupted = new ArrayList<>();
        List<BatchSpec.Planned> toRun = new ArrayList<>();
        for (BatchSpec.Planned p : spec.analyses()) {
            Path run = runFolder(p);
            if (Files.isRegularFile(run.resolve(SummaryJson.FILE_NAME))) {
                kept.add(p);
            } else {
                toRun.add(p);
                if (Files.isRegularFile(run.resolve(RunConfFile.FILE_NAME)) && !Files.exists(run.resolve(FAILURE_FILE))) {
                    interrupted.add(p);
                }
            }
        }
        if (Files.isRegularFile(stateFile)) {
            BatchState saved;
            try {
                saved = BatchState.read(stateFile);
            } catch (IOException e) {
                throw new RunFileException("cannot read " + stateFile + " to resume the batch: " + e.getMessage(), e);
            }
            List<BatchSpec.Planned> previous = new ArrayList<>(kept);
            previous.addAll(interrupted);
            ResumeCheck.verify(folder, saved, now, previous, this::runFolder);
        } else if (holdsFiles(folder)) {
            throw new RunFileException("batch folder " + folder + " already holds files but no " + BatchState.FILE_NAME
                    + ", so it is not a batch to resume; choose another folder (--out) or remove it (nothing was overwritten)");
        }
        try {
            Files.createDirectories(folder);
            now.write(stateFile);
        } catch (IOException e) {
            throw new RunFileException("cannot write the batch folder " + folder + ": " + e.getMessage(), e);
        }
        writeSummary();
        if (!toRun.isEmpty()) {
            runAll(toRun, interrupted, kept.size(), progressOut);
        }
        List<BatchSummary.Row> rows = writeSummary();
        boolean stopped = signal != null && signal.received();
        return new Result(rows, failures.size(), toRun.size(), kept.size(), stopped);
    }

    private void runAll(List<BatchSpec.Planned> toRun, List<BatchSpec.Planned> interrupted, int kept,
            PrintWriter progressOut) {
        BatchSpec.Planned first = toRun.get(0);
        notices = progressOut;
        // FAIR shares the executors between concurrent analyses instead of letting the first
        // submitted job take every core until it ends (Spark's default, FIFO).
        // One handler for the whole batch: on SIGTERM or Ctrl-C every running analysis stops at its next
        // iteration boundary on a checkpoint, and no waiting analysis starts.
        try (TerminationSignal batchSignal = TerminationSignal.install(first.run().limits().stopGraceSeconds(), progressOut,
                        ExitCodes.STOPPED_RESUMABLE, TerminationSignal.EXIT, () -> "The running analyses stop on their "
                                + "last checkpoints; the work since is lost and will be done again. Continue by running "
                                + "the same skerry batch command again");
                Backends.Opened opened = Backends.open(first.run(), spec.folder(), Map.of("spark.scheduler.mode", "FAIR"));
                BatchProgress progress = new BatchProgress(spec.progress() == OutputSpec.Progress.OFF
                        ? new PrintWriter(Writer.nullWriter()) : progressOut, interactive(), toRun.size(), kept,
                        Clock.systemUTC())) {
            signal = batchSignal;
            stop = new StopRules(batchSignal, null, System.nanoTime());
            PopulationBackend backend = opened.backend();
            int threads = Math.min(spec.concurrent(), toRun.size());
            AtomicInteger counter = new AtomicInteger();
            ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
                Thread t = new Thread(r, "skerry-analysis-" + counter.incrementAndGet());
                t.setDaemon(true);
                return t;
            });
            try {
                List<Future<?>> futures = new ArrayList<>();
                for (BatchSpec.Planned p : toRun) {
                    boolean resume = interrupted.contains(p);
                    futures.add(pool.submit(() -> runOne(p, resume, backend, progress)));
                }
                for (Future<?> f : futures) {
                    f.get();
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for the batch's analyses", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("an analysis thread failed: " + e.getCause(), e.getCause());
            } finally {
                pool.shutdownNow();
                batchSignal.runEnded();
            }
        }
    }

    private void runOne(BatchSpec.Planned p, boolean resume, PopulationBackend backend, BatchProgress progress) {
        String label = p.label();
        Path folder = runFolder(p);
        if (signal.received()) {
            return; // stopping: it stays waiting, and a resumed batch runs it
        }
        JavaSparkContext context = backend instanceof SparkBackend ? ((SparkBackend) backend).context() : null;
        if (context != null) {
            // Pools not named in an allocation file are made on first use, weight 1 each.
            context.setLocalProperty("spark.scheduler.pool", label);
        }
        progress.started(label);
        running.add(label);
        try {
            Analysis.Outcome outcome = resume ? continueUnfinished(folder, backend, stop, notices)
                    : startAfresh(p, folder, backend, stop, notices);
            progress.finished(label, outcome.wallSeconds());
        } catch (RuntimeException | LinkageError | StackOverflowError e) {
            if (TerminationSignal.abandoning()) {
                // The batch was abandoned on a signal and the process is exiting: what fails now is
                // the shutdown (Spark's jobs cancelled), not the analysis, which stays resumable.
                return;
            }
            recordEnd(label, folder, e, progress);
        } finally {
            running.remove(label);
            if (context != null) {
                context.setLocalProperty("spark.scheduler.pool", null);
            }
        }
        if (!TerminationSignal.abandoning()) {
            writeSummary();
        }
    }

    private void recordEnd(String label, Path folder, Throwable e, BatchProgress progress) {
        Ending ending = Ending.of(e);
        if (e instanceof RunEnded && ending.exitCode() == ExitCodes.STOPPED_RESUMABLE) {
            progress.stopped(label);
            return;
        }
        failures.put(label, ending.summary());
        recordFailure(folder, ending.summary());
        progress.failed(label, ending.summary());
    }

    private static Analysis.Outcome startAfresh(BatchSpec.Planned p, Path folder, PopulationBackend backend,
            StopCondition stop, PrintWriter notices) {
        clear(folder);
        return Analysis.run(p.run(), folder, backend, IterationListener.NONE, stop, notices);
    }

    /**
     * Continues an analysis that an earlier run of the batch left unfinished (a {@code run.conf}
     * but no {@code summary.json}) from its newest valid checkpoint, as {@code skerry resume}
     * would; with no checkpoint yet it runs from the start. Either way the same settings and seed
     * give the answer an uninterrupted batch gives.
     */
    static Analysis.Outcome continueUnfinished(Path runFolder, PopulationBackend backend, StopCondition stop,
            PrintWriter notices) {
        return Analysis.resume(runFolder, backend, IterationListener.NONE, stop, notices);
    }

    private static void recordFailure(Path folder, String message) {
        try {
            Files.createDirectories(folder);
            AtomicFile.writeString(folder.resolve(FAILURE_FILE), message + "\n");
        } catch (IOException e) {
            // the summary still reports the failure
        }
    }

    /**
     * Rewrites both summary files from the run folders as they are now. Rows are read back from
     * each finished run's {@code summary.json}, so a kept analysis and one run now give the same
     * row.
     */
    private synchronized List<BatchSummary.Row> writeSummary() {
        List<BatchSummary.Row> rows = new ArrayList<>();
        for (BatchSpec.Planned p : spec.analyses()) {
            rows.add(row(p));
        }
        List<BatchSummary.Row> withFactors = BayesFactors.add(rows, spec.variants().get(0).name());
        try {
            BatchSummary.write(spec.folder(), spec.variants().get(0).name(), withFactors);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the batch summary into " + spec.folder(), e);
        }
        return withFactors;
    }

    private BatchSummary.Row row(BatchSpec.Planned p) {
        Path folder = runFolder(p);
        String relative = spec.folder().relativize(folder).toString().replace('\\', '/');
        if (Files.isRegularFile(folder.resolve(SummaryJson.FILE_NAME))) {
            try {
                return finishedRow(p.dataset().name(), p.variant().name(), p.seed(), spec.folder(), folder);
            } catch (IOException e) {
                return failedRow(p, relative, "cannot read its summary.json: " + e.getMessage());
            }
        }
        String failure = failures.get(p.label());
        if (failure != null) {
            return failedRow(p, relative, failure);
        }
        return new BatchSummary.Row(p.dataset().name(), p.variant().name(),
                running.contains(p.label()) ? RUNNING : WAITING, Double.NaN, Double.NaN,
                Double.NaN, Double.NaN, -1, -1, Double.NaN, -1, Map.of(), p.seed(), relative, Double.NaN, null);
    }

    /**
     * The summary row of a finished analysis, read back from the files of its run folder (the
     * Bayes factor left NaN for {@link BayesFactors#add}); the demo's comparison uses it too.
     */
    public static BatchSummary.Row finishedRow(String dataset, String variant, long seed, Path batchFolder,
            Path runFolder) throws IOException {
        RunSummaryReader.RunSummary s = RunSummaryReader.read(runFolder);
        String relative = batchFolder.relativize(runFolder).toString().replace('\\', '/');
        return new BatchSummary.Row(dataset, variant, SUCCEEDED, s.logEvidence(), s.logEvidenceError(), Double.NaN,
                Double.NaN, s.iterations(), s.likelihoodEvaluations(), s.finalTolerance(), s.simulations(),
                s.parameters(), seed, relative,
                RunSummaryReader.wallSeconds(runFolder), null);
    }

    private static BatchSummary.Row failedRow(BatchSpec.Planned p, String folder, String message) {
        return new BatchSummary.Row(p.dataset().name(), p.variant().name(), FAILED, Double.NaN, Double.NaN, Double.NaN,
                Double.NaN, -1, -1, Double.NaN, -1, Map.of(), p.seed(), folder, Double.NaN, message);
    }

    private boolean interactive() {
        switch (spec.progress()) {
            case LIVE:
                return true;
            case AUTO:
                return System.console() != null;
            default:
                return false;
        }
    }

    private static boolean holdsFiles(Path folder) {
        if (!Files.isDirectory(folder)) {
            if (Files.exists(folder)) {
                throw new RunFileException("batch folder " + folder + " exists and is not a folder");
            }
            return false;
        }
        try (Stream<Path> entries = Files.list(folder)) {
            return entries.findAny().isPresent();
        } catch (IOException e) {
            throw new RunFileException("cannot read batch folder " + folder + ": " + e, e);
        }
    }

    /** Empties a run folder (keeping the folder itself), so nothing of an earlier attempt remains. */
    private static void clear(Path folder) {
        if (!Files.isDirectory(folder)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(folder)) {
            for (Path p : paths.sorted(Comparator.reverseOrder()).toList()) {
                if (!p.equals(folder)) {
                    Files.delete(p);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot clear the run folder " + folder + " of an earlier attempt", e);
        }
    }
}
