package org.skerry.cli;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.report.ReportInputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code skerry status RUN_FOLDER}: how a run ended, read from its folder, with the exit code the
 * run itself would have given — for drivers whose exit code is lost (spark-submit in cluster mode
 * exits 0 whatever the driver did).
 */
@Command(name = "status", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Tell how the run in RUN_FOLDER ended, from the files it wrote.",
            "Exit codes: 0 finished, 1 failed (failure.txt), 75 stopped at a checkpoint (stopped.txt; resume it), "
                + "4 no outcome yet (still running, or killed before it could write one), 2 not a run folder."})
final class StatusCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN_FOLDER", description = "the run folder")
    Path folder;

    @Override
    public Integer call() {
        if (!Files.isDirectory(folder)) {
            throw new ReportInputException("no run folder " + folder);
        }
        if (!Files.isRegularFile(folder.resolve(RunConfFile.FILE_NAME))) {
            throw new ReportInputException(folder + " is not a run folder: it has no " + RunConfFile.FILE_NAME);
        }
        RunOutcome.State state = RunOutcome.of(folder);
        String text = RunOutcome.text(folder, state);
        PrintWriter out = spec.commandLine().getOut();
        switch (state) {
            case FINISHED -> out.println("finished: results in " + folder.resolve("summary.json"));
            case FAILED -> out.println("failed: " + (text == null ? "(failure.txt unreadable)" : text));
            case STOPPED -> out.println("stopped at a checkpoint: " + (text == null ? "" : text + " ")
                    + "(continue with: skerry resume " + folder + ")");
            case NO_OUTCOME -> out.println("no outcome yet: the run is still going, or it was killed before it "
                    + "could record one (see its log; skerry resume " + folder + " continues it)");
        }
        out.flush();
        return state.exitCode();
    }
}
