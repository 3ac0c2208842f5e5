package org.skerry.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.skerry.cli.batch.BatchRunner;
import org.skerry.cli.output.BatchSummary;
import org.skerry.cli.report.BatchReportWriter;
import org.skerry.cli.runfile.BatchSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code skerry batch FILE}: every dataset under every model variant, one summary. */
@Command(name = "batch", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Run one analysis per dataset and model variant from a batch file, several at once, and write "
            + "batch-summary.csv and batch-summary.json with evidence, Bayes factors and posterior summaries.",
            "On an existing batch folder it resumes: finished analyses are kept, the rest run.",
            "Exit codes: 0 all analyses succeeded, 3 some failed (the summary says which and why), 2 bad input, "
                + "75 stopped on SIGTERM at checkpoints (run the same command again to resume)."})
final class BatchCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "BATCH_FILE", description = "the batch file (HOCON)")
    Path file;

    @Option(names = "--out", paramLabel = "DIR", description = "the batch folder (default: the batch file's folder key)")
    Path out;

    @Override
    public Integer call() {
        BatchSpec batch = BatchSpec.load(file, out);
        PrintWriter stdout = spec.commandLine().getOut();
        stdout.println("batch " + file + ": " + batch.datasets().size() + " datasets x " + batch.variants().size()
                + " variants = " + batch.analyses().size() + " analyses, up to " + batch.concurrent()
                + " at once, into " + batch.folder());
        stdout.flush();
        BatchRunner.Result result = BatchRunner.run(batch, spec.commandLine().getErr());
        if (result.kept() > 0) {
            stdout.println("kept " + result.kept() + " analyses finished by an earlier run of this batch");
        }
        stdout.println(String.format(Locale.ROOT, "%-16s %-14s %-9s %22s %22s", "dataset", "variant", "status",
                "log evidence", "log Bayes factor"));
        for (BatchSummary.Row r : result.rows()) {
            stdout.println(String.format(Locale.ROOT, "%-16s %-14s %-9s %22s %22s", r.dataset(), r.variant(), r.status(),
                    plusMinus(r.logEvidence(), r.logEvidenceError()), plusMinus(r.logBayesFactor(), r.logBayesFactorError())));
        }
        for (BatchSummary.Row r : result.rows()) {
            if (r.message() != null) {
                stdout.println(r.dataset() + "/" + r.variant() + ": " + r.message());
            }
        }
        stdout.println("log Bayes factors are against the reference variant '" + batch.variants().get(0).name()
                + "'; errors are single-run estimates (see README before a decision rests on them)");
        stdout.println("summary: " + batch.folder().resolve(BatchSummary.CSV_NAME) + ", "
                + batch.folder().resolve(BatchSummary.JSON_NAME));
        stdout.flush();
        if (!result.stopped() && batch.analyses().get(0).run().outputs().report()) {
            writeReport(batch.folder(), stdout, spec.commandLine().getErr());
        }
        if (result.stopped()) {
            stdout.println("stopped on a termination signal or Ctrl-C: unfinished analyses stopped at checkpoints; run the same "
                    + "command again to resume the batch");
            stdout.flush();
            return ExitCodes.STOPPED_RESUMABLE;
        }
        return result.failed() > 0 ? ExitCodes.SOME_FAILED : ExitCodes.SUCCESS;
    }

    /**
     * The batch's report (report/index.html). The summary is written by now, so a report that
     * cannot be made is a notice, not a failed batch: {@code skerry report} can make it later.
     */
    static void writeReport(Path folder, PrintWriter stdout, PrintWriter notices) {
        try {
            long start = System.nanoTime();
            Path page = BatchReportWriter.write(folder);
            stdout.println(String.format(Locale.ROOT, "report: %s (made in %.2f s)", page,
                    (System.nanoTime() - start) * 1e-9));
            stdout.flush();
        } catch (java.io.IOException | RuntimeException e) {
            notices.println("skerry: the results are written, but their report could not be: " + e.getMessage()
                    + "; make it later with: skerry report " + folder);
            notices.flush();
        }
    }

    private static String plusMinus(double value, double error) {
        if (Double.isNaN(value)) {
            return "-";
        }
        if (Double.isNaN(error)) {
            return String.format(Locale.ROOT, "%.3f (error unreliable)", value);
        }
        return String.format(Locale.ROOT, "%.3f ± %.3f", value, error);
    }
}
