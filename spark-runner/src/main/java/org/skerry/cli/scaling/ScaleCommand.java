package org.skerry.cli.scaling;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.lang.management.ManagementFactory;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.Version;
import org.skerry.cli.report.StudyReportWriter;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code skerry scale STUDY_FILE}: a scaling study — runs a grid of runs and tabulates and plots how they scale. */
@Command(name = "scale", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Run a scaling study: every point of the study file's grid, repeated; resume a half-finished one.",
            "Writes scaling.csv (one row per run), speed-up, efficiency and phase plots (PNG and SVG), summary.md and, "
                + "unless the study's settings say output.report = false, report/index.html.",
            "Study file keys and defaults: study-defaults.conf in the jar (spark-runner/src/main/resources)."})
public final class ScaleCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "STUDY_FILE", description = "the study file (HOCON)")
    Path file;

    @Option(names = "--out", paramLabel = "DIR",
            description = "the study folder (default: <output.folder>/<name> of the study file); an existing one is resumed")
    Path out;

    @Option(names = "--check", description = "check the study file and every run it describes, list the points, run nothing")
    boolean checkOnly;

    @Override
    public Integer call() {
        PrintWriter stdout = spec.commandLine().getOut();
        StudyFile study = StudyFile.load(file);
        Path folder = out != null ? out : study.defaultFolder();
        if (checkOnly) {
            stdout.println(study.path() + ": " + study.points().size() + " point(s) x " + study.repeats()
                    + " repeat(s); study folder " + folder);
            for (StudyPoint point : study.points()) {
                stdout.println("  " + point.label() + ": " + String.join(" ", point.overrides()));
            }
            stdout.flush();
            return ExitCodes.SUCCESS;
        }
        double loadBefore = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
        List<StudyRunner.Run> runs = StudyRunner.run(study, folder, stdout, spec.commandLine().getErr());
        ScalingTable table = new ScalingTable(study, runs);
        try {
            Path csv = table.writeCsv(folder, folder);
            List<Path> plots = ScalingCharts.write(table, folder);
            double loadAfter = ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
            Path summary = ScalingSummary.write(table, folder, loadBefore, loadAfter);
            stdout.println("study folder: " + folder);
            stdout.println("  " + csv.getFileName() + ", " + summary.getFileName() + ", "
                    + String.join(", ", plots.stream().map(p -> p.getFileName().toString()).toList()));
            if (study.points().get(0).spec().outputs().report()) {
                writeReport(folder, stdout, spec.commandLine().getErr());
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the study's results into " + folder, e);
        }
        stdout.flush();
        return ExitCodes.SUCCESS;
    }

    /**
     * The study's report (report/index.html). The table and plots are written by now, so a report
     * that cannot be made is a notice, not a failed study: {@code skerry report} can make it later.
     */
    private static void writeReport(Path folder, PrintWriter stdout, PrintWriter notices) {
        try {
            stdout.println("  report: " + StudyReportWriter.write(folder));
        } catch (IOException | RuntimeException e) {
            notices.println("skerry: the study's results are written, but its report could not be: " + e.getMessage()
                    + "; make it later with: skerry report " + folder);
            notices.flush();
        }
    }
}
