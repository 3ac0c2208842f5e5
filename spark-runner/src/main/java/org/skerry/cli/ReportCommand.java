package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.skerry.cli.report.BatchReportWriter;
import org.skerry.cli.report.FolderKind;
import org.skerry.cli.report.ReportWriter;
import org.skerry.cli.report.StudyReportWriter;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code skerry report FOLDER}: an HTML page with figures of a finished run, batch, demo
 * comparison or scaling study, in FOLDER/report/; the folder's files tell which it is.
 */
@Command(name = "report", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Make a report: FOLDER/report/index.html (it opens offline), each figure also as PNG and SVG.",
            "A run folder (summary.json): warnings, the summary table, posterior histograms, a pair plot, the fit "
                + "against the data and per-iteration diagnostics.",
            "A batch folder, or the demo's folder (batch-summary.json): the analyses table with evidence and Bayes "
                + "factors, the Bayes factors with their error zones, the variants' fits side by side, a forest plot "
                + "per parameter and links to each run's report (made where missing).",
            "A study folder (study.conf and scaling.csv): speed-up, efficiency and time per phase with the table.",
            "Reads the folder's files; writes only report/ folders.",
            "Exit codes: 0 written, 1 the files could not be written, 2 bad input (no such folder, a folder of none "
                + "of these kinds, an unfinished run, a file that does not read back)."})
final class ReportCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FOLDER",
            description = "a run, batch, demo or study folder (holds summary.json, batch-summary.json or scaling.csv)")
    Path folder;

    @Override
    public Integer call() {
        Path page;
        try {
            page = switch (FolderKind.of(folder)) {
                case RUN -> ReportWriter.write(folder);
                case BATCH, COMPARISON -> BatchReportWriter.write(folder);
                case STUDY -> StudyReportWriter.write(folder);
            };
        } catch (IOException e) {
            throw new RunEnded(ExitCodes.RUN_FAILURE, "cannot write the report of " + folder + ": " + e.getMessage(), e);
        }
        PrintWriter out = spec.commandLine().getOut();
        out.println("report: " + page);
        out.flush();
        return ExitCodes.SUCCESS;
    }
}
