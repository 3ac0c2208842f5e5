package org.skerry.cli.scaling;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.skerry.cli.Analysis;
import org.skerry.cli.output.AtomicFile;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.output.TimingJson;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.IterationRecord;

/**
 * Runs a study's grid, one run at a time in this JVM: repeat r of every point before repeat r + 1
 * of any. A run whose folder already holds {@code summary.json} is kept (after checking that it
 * was made with the same settings); an unfinished one is moved aside and run again.
 */
final class StudyRunner {

    /** One run of the study: a point, a repeat, its folder and what was measured. */
    record Run(StudyPoint point, int repeat, Path folder, RunMeasurement measurement, boolean kept) {
    }

    private static final DateTimeFormatter ASIDE_TIME =
            DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss").withZone(ZoneOffset.UTC);

    private StudyRunner() {
    }

    static List<Run> run(StudyFile study, Path studyFolder, PrintWriter out, PrintWriter progress) {
        Path runs = studyFolder.resolve("runs");
        try {
            Files.createDirectories(runs);
            AtomicFile.writeString(studyFolder.resolve("study.conf"), "# resolved study settings\n" + study.render());
        } catch (IOException e) {
            throw new RunFileException("cannot write the study folder " + studyFolder + ": " + e, e);
        }
        List<StudyPoint> points = study.points();
        int total = points.size() * study.repeats();
        List<Run> done = new ArrayList<>();
        int count = 0;
        boolean warmUpPending = study.warmUp();
        for (int repeat = 1; repeat <= study.repeats(); repeat++) {
            for (StudyPoint point : points) {
                count++;
                Path folder = runs.resolve(point.label() + "-r" + repeat);
                Run run;
                if (Files.isRegularFile(folder.resolve(SummaryJson.FILE_NAME))) {
                    checkSameSettings(point, folder);
                    run = new Run(point, repeat, folder, keptMeasurement(point, folder), true);
                } else {
                    moveAsideIfPresent(folder, studyFolder.resolve("unfinished"), out);
                    if (warmUpPending) {
                        warmUp(point, studyFolder.resolve("warm-up"), out, progress);
                        warmUpPending = false;
                    }
                    run = new Run(point, repeat, folder, measure(point, folder, progress), false);
                }
                done.add(run);
                out.printf(Locale.ROOT, "[%d/%d] %s repeat %d: sampler loop %.3f s%s%n", count, total,
                        point.values().isEmpty() ? "base" : point.values().toString(), repeat,
                        run.measurement().loopSeconds(), run.kept() ? " (kept from an earlier run)" : "");
                out.flush();
            }
        }
        return done;
    }

    private static RunMeasurement measure(StudyPoint point, Path folder, PrintWriter progress) {
        double load = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
        DriverClock clock = new DriverClock();
        DriverTraffic.takeNewest();
        Analysis.Outcome outcome = Analysis.run(point.spec(), folder, progress, clock);
        DriverTraffic traffic = point.spec().backend().kind().equals("spark") ? DriverTraffic.takeNewest() : null;
        List<IterationRecord> records = outcome.result().iterations();
        long moved = 0;
        for (IterationRecord record : records) {
            moved += record.particlesMoved();
        }
        RunMeasurement measurement = new RunMeasurement(outcome.result().iterationCount(),
                point.spec().sampler().population().particles(), traffic == null ? -1 : blocks(point, traffic),
                outcome.result().evaluations().evaluations(), outcome.wallSeconds(), RunMeasurement.sum(records), moved,
                traffic == null ? -1 : traffic.loopBytes(), traffic == null ? -1 : traffic.exportBytes(),
                clock.loopCpuSeconds(), load, backendOf(folder));
        try {
            measurement.write(folder);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + folder.resolve(RunMeasurement.FILE_NAME), e);
        }
        return measurement;
    }

    /**
     * The population's blocks: the run file's count, else what Spark's tasks show. A task per block
     * makes one task per block; a task per executor makes one per executor, each of whose cores
     * holds three blocks by default (SparkBackend.partitionsFor); −1 where a set group count hides it.
     */
    private static long blocks(StudyPoint point, DriverTraffic traffic) {
        org.skerry.cli.runfile.BackendSpec backend = point.spec().backend();
        if (backend.partitions() > 0) {
            return Math.min(backend.partitions(), point.spec().sampler().population().particles());
        }
        if (!backend.perExecutor()) {
            return traffic.partitions();
        }
        return backend.taskGroups() > 0 ? -1 : Math.min(3L * backend.taskCores() * traffic.partitions(),
                point.spec().sampler().population().particles());
    }

    private static String backendOf(Path folder) {
        try {
            return ConfigFactory.parseFile(folder.resolve(TimingJson.FILE_NAME).toFile()).getString("backend");
        } catch (ConfigException e) {
            return "";
        }
    }

    /**
     * The measurement of a finished run: from {@code scaling-run.json}, or — for a run the study
     * did not get to measure (stopped right after it finished) — from its {@code timing.json} and
     * {@code summary.json}, with the driver figures unknown (−1).
     */
    private static RunMeasurement keptMeasurement(StudyPoint point, Path folder) {
        RunMeasurement saved = RunMeasurement.read(folder);
        if (saved != null) {
            return saved;
        }
        try {
            Config timing = ConfigFactory.parseFile(folder.resolve(TimingJson.FILE_NAME).toFile());
            Config summary = ConfigFactory.parseFile(folder.resolve(SummaryJson.FILE_NAME).toFile());
            return new RunMeasurement(summary.getInt("iterations"), point.spec().sampler().population().particles(), -1,
                    summary.getLong("likelihood_evaluations"), timing.getDouble("wall_seconds"),
                    RunMeasurement.phases(timing), -1, -1, -1, -1,
                    -1, timing.getString("backend"));
        } catch (ConfigException e) {
            throw new RunFileException("run folder " + folder + " has summary.json but its timing cannot be read ("
                    + e.getMessage() + "); remove the folder to run the point again", e);
        }
    }

    /** One unrecorded run of {@code point}, so JIT compilation and Spark's first job are not measured. */
    private static void warmUp(StudyPoint point, Path folder, PrintWriter out, PrintWriter progress) {
        deleteTree(folder);
        out.println("warm-up run of " + (point.values().isEmpty() ? "the base" : point.values().toString())
                + " (not measured)");
        out.flush();
        Analysis.run(point.spec(), folder, progress);
        DriverTraffic.takeNewest();
        deleteTree(folder);
    }

    private static void deleteTree(Path folder) {
        if (!Files.exists(folder)) {
            return;
        }
        try (java.util.stream.Stream<Path> paths = Files.walk(folder)) {
            for (Path p : (Iterable<Path>) paths.sorted(java.util.Comparator.reverseOrder())::iterator) {
                Files.delete(p);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot remove the warm-up folder " + folder, e);
        }
    }

    /** A kept run must have been made from the settings this point resolves to now. */
    private static void checkSameSettings(StudyPoint point, Path folder) {
        String expected = point.spec().file().render();
        String found;
        try {
            found = Files.readString(folder.resolve(RunConfFile.FILE_NAME));
        } catch (IOException e) {
            throw new RunFileException("run folder " + folder + " has summary.json but no readable run.conf; "
                    + "remove the folder to run the point again", e);
        }
        String body = found.startsWith("#") ? found.substring(found.indexOf('\n') + 1) : found;
        if (!body.strip().equals(expected.strip())) {
            throw new RunFileException("run folder " + folder + " holds a finished run made with other settings than "
                    + "this study now gives the point " + point.values() + " (the study or its base run file changed); "
                    + "use another study folder (--out) or remove that run folder (nothing was overwritten)");
        }
    }

    private static void moveAsideIfPresent(Path folder, Path aside, PrintWriter out) {
        if (!Files.exists(folder)) {
            return;
        }
        Path target = aside.resolve(folder.getFileName() + "-" + ASIDE_TIME.format(Instant.now()));
        try {
            Files.createDirectories(aside);
            Files.move(folder, target);
        } catch (IOException e) {
            throw new RunFileException("cannot move the unfinished run folder " + folder + " aside to " + target
                    + ": " + e, e);
        }
        out.println("moved the unfinished run folder " + folder + " aside to " + target);
    }

    /** CPU time of the thread that runs the sampler, from the end of iteration 0 to the last iteration. */
    private static final class DriverClock implements IterationListener {
        private final ThreadMXBean threads = ManagementFactory.getThreadMXBean();
        private long start = -1;
        private long end = -1;

        @Override
        public void iterationFinished(IterationRecord record) {
            long now = threads.isCurrentThreadCpuTimeSupported() ? threads.getCurrentThreadCpuTime() : -1;
            if (record.iteration() == 0) {
                start = now;
            }
            end = now;
        }

        double loopCpuSeconds() {
            return start < 0 || end < 0 ? -1 : (end - start) * 1e-9;
        }
    }
}
