package org.skerry.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code skerry resume RUN_FOLDER}: continue a stopped or crashed run from its newest valid checkpoint. */
@Command(name = "resume", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = {"Continue a stopped or crashed run from its newest valid checkpoint, with the settings "
                + "saved in its run.conf. The results are the ones the undisturbed run would have given.",
            "Exit codes: 0 finished, 1 run failure, 2 bad input (including changed settings that alter the answer), "
                + "75 stopped again at a checkpoint (resume once more)."})
final class ResumeCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN_FOLDER", description = "the run folder of the run to continue")
    Path folder;

    @Option(names = "--set", paramLabel = "KEY=VALUE",
            description = "override a setting that does not change the answer (backend, output, checkpoint, limits), "
                    + "e.g. --set backend.master=spark://host:7077")
    List<String> overrides = new ArrayList<>();

    @Mixin
    WhereOptions where = new WhereOptions();

    @Override
    public Integer call() {
        PrintWriter stdout = spec.commandLine().getOut();
        List<String> all = new ArrayList<>(overrides);
        where.addTo(all);
        if (Analysis.finished(folder)) {
            // The overrides are checked as for any resume, so a mistake in them is not passed over in silence.
            Analysis.checkFinishedResume(folder, all);
            stdout.println("the run in " + folder + " has finished; its results are in summary.json (nothing to resume)");
            stdout.flush();
            return ExitCodes.SUCCESS;
        }
        Analysis.Outcome outcome = Analysis.resume(folder, all, spec.commandLine().getErr());
        ResultTable.print(outcome, stdout);
        stdout.flush();
        return ExitCodes.SUCCESS;
    }
}
