package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.skerry.cli.report.ReportWriter;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code skerry report RUN_FOLDER}: an HTML page with figures of a finished run, in RUN_FOLDER/report/. */
@Command(name = "report", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Make a report of a finished run: RUN_FOLDER/report/index.html (it opens offline) with "
                + "warnings, the summary table, posterior histograms, a pair plot and per-iteration diagnostics, "
                + "each figure also as PNG and SVG. Reads summary.json, iterations.csv, particles.csv and run.conf; "
                + "changes nothing else.",
            "Exit codes: 0 written, 1 the files could not be written, 2 bad input (no such folder, an unfinished "
                + "run, a file that does not read back)."})
final class ReportCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN_FOLDER", description = "the folder of a finished run (holds summary.json)")
    Path folder;

    @Override
    public Integer call() {
        Path page;
        try {
            page = ReportWriter.write(folder);
        } catch (IOException e) {
            throw new RunEnded(ExitCodes.RUN_FAILURE, "cannot write the report of " + folder + ": " + e.getMessage(), e);
        }
        PrintWriter out = spec.commandLine().getOut();
        out.println("report: " + page);
        out.flush();
        return ExitCodes.SUCCESS;
    }
}
