package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.skerry.cli.batch.BatchRunner;
import org.skerry.cli.batch.BayesFactors;
import org.skerry.cli.output.BatchSummary;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.sampler.EvidenceEstimate;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code skerry demo}: the Lake Quellmar demo (an invented lake with synthetic data). Calibrates
 * the plankton model of the demo buoy under both grazing variants and compares them by evidence;
 * the comparison is written like a batch of one dataset under two variants (batch-summary.csv and
 * .json beside the two run folders) and, unless {@code output.report = false}, reported in
 * {@code report/index.html} there with both variants' fits side by side.
 */
@Command(name = "demo", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Run the Lake Quellmar demo: the demo buoy's synthetic chlorophyll series under the "
            + "saturating and the sigmoidal grazing variant, compared by their evidence.",
            "The lake, its water board and the data are invented; see conf/demo/README.md."})
final class DemoCommand implements Callable<Integer> {

    /** The demo's two run files, relative to conf/demo; the first is the reference variant. */
    static final List<String> RUN_FILES = List.of("buoy-07-saturating.conf", "buoy-07-sigmoidal.conf");
    /** The grazing variant of each run file, in the same order, as the comparison names them. */
    static final List<String> VARIANTS = List.of("saturating", "sigmoidal");
    /** The demo's dataset, as the comparison names it. */
    static final String DATASET = "buoy-07";

    @Spec
    CommandSpec spec;

    @Option(names = "--out", paramLabel = "DIR", description = "folder for the two run folders (default: runs/demo-<start time>)")
    Path out;

    @Option(names = "--set", paramLabel = "KEY=VALUE", description = "override a setting of both run files, e.g. --set sampler.particles=200")
    List<String> overrides = new ArrayList<>();

    @Option(names = "--demo-folder", paramLabel = "DIR", description = "where the demo run files are (default: <skerry home>/conf/demo)")
    Path demoFolder;

    @Override
    public Integer call() {
        Path folder = demoFolder != null ? demoFolder
                : Path.of(System.getProperty("skerry.home", ".")).resolve("conf").resolve("demo");
        if (!Files.isDirectory(folder)) {
            throw new RunFileException("demo folder " + folder + " not found (set --demo-folder or run bin/skerry from the project)");
        }
        Path base = out != null ? out : Path.of("runs").resolve("demo-"
                + DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss").withZone(ZoneOffset.UTC).format(Instant.now()));
        PrintWriter stdout = spec.commandLine().getOut();
        stdout.println("Lake Quellmar demo (invented lake, synthetic data): buoy-07, two grazing variants");
        stdout.flush();
        List<Analysis.Outcome> outcomes = new ArrayList<>();
        boolean report = true;
        for (String name : RUN_FILES) {
            RunSpec run = RunSpec.from(RunFile.load(folder.resolve(name), overrides));
            report &= run.outputs().report();
            Analysis.Outcome outcome = Analysis.run(run, base.resolve(run.name()), spec.commandLine().getErr());
            ResultTable.print(outcome, stdout);
            stdout.println();
            stdout.flush();
            outcomes.add(outcome);
        }
        EvidenceEstimate first = outcomes.get(0).result().evidence();
        EvidenceEstimate second = outcomes.get(1).result().evidence();
        double logBayes = second.logEvidence() - first.logEvidence();
        double error = Math.sqrt(first.standardError() * first.standardError()
                + second.standardError() * second.standardError());
        stdout.println("log evidence, saturating grazing: " + withError(first.logEvidence(), first.standardError(),
                first.reliable()));
        stdout.println("log evidence, sigmoidal grazing:  " + withError(second.logEvidence(), second.standardError(),
                second.reliable()));
        stdout.println("log Bayes factor, sigmoidal vs saturating: " + withError(logBayes, error,
                first.reliable() && second.reliable()));
        stdout.println("Errors are single-run estimates; before a decision rests on the comparison, re-run with other"
                + " seeds and more particles and check that the Bayes factor is stable (see README).");
        stdout.flush();
        writeComparison(base, outcomes, stdout);
        if (report) {
            BatchCommand.writeReport(base, stdout, spec.commandLine().getErr());
        }
        return ExitCodes.SUCCESS;
    }

    /**
     * The comparison as a batch of one dataset under two variants: batch-summary.csv and .json in
     * the demo's folder, read back from the two run folders as a batch reads its analyses, so the
     * same report (and the same table) serves the demo and a batch.
     */
    private static void writeComparison(Path base, List<Analysis.Outcome> outcomes, PrintWriter stdout) {
        List<BatchSummary.Row> rows = new ArrayList<>();
        try {
            for (int i = 0; i < outcomes.size(); i++) {
                Analysis.Outcome outcome = outcomes.get(i);
                rows.add(BatchRunner.finishedRow(DATASET, VARIANTS.get(i), outcome.spec().sampler().population().seed(),
                        base, outcome.folder()));
            }
            BatchSummary.write(base, VARIANTS.get(0), BayesFactors.add(rows, VARIANTS.get(0)));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the demo's comparison into " + base, e);
        }
        stdout.println("comparison: " + base.resolve(BatchSummary.CSV_NAME));
        stdout.flush();
    }

    /** A value with its error, or a note that the error cannot be trusted: never a misleading ± figure. */
    private static String withError(double value, double error, boolean reliable) {
        return reliable ? String.format(Locale.ROOT, "%10.3f ± %.3f", value, error)
                : String.format(Locale.ROOT, "%10.3f (single-run error unreliable: see the warning above)", value);
    }
}
