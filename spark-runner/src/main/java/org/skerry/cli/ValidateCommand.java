package org.skerry.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.skerry.cli.runfile.ModelBuilder;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.program.ProgramModel;
import org.skerry.engine.program.ProgramSettings;
import org.skerry.engine.program.WorkerProtocol;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code skerry validate FILE}: check a run file and its data without running; a program model is
 * started and its handshake completed, as a run would before iteration 0.
 */
@Command(name = "validate", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "Check a run file, its data and its model settings without running the analysis; a "
                + "program model's program is started once, to check that it answers.")
final class ValidateCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FILE", description = "the run file (HOCON)")
    Path file;

    @Option(names = "--set", paramLabel = "KEY=VALUE", description = "override one setting (repeatable)")
    List<String> overrides = new ArrayList<>();

    @Override
    public Integer call() {
        RunSpec run = RunSpec.from(RunFile.load(file, overrides));
        ModelBuilder.Built built = ModelBuilder.build(run);
        // A program that cannot start is the commonest mistake in a program model; a run would
        // refuse it before iteration 0, so validate starts it and completes the handshake too.
        ModelBuilder.checkStarts(run, built);
        PrintWriter out = spec.commandLine().getOut();
        out.println(file + ": ok");
        out.println("  model:      " + run.model().label() + " with parameters " + built.model().parameters().names());
        out.println("  data:       " + (built.data() == null ? "none"
                : built.data().rowCount() + " rows from " + built.data().source()));
        if (built.model() instanceof ProgramModel) {
            out.println("  program:    " + programCheck(run, (ProgramModel) built.model()));
        }
        out.println("  particles:  " + run.sampler().population().particles() + ", seed " + run.sampler().population().seed());
        out.flush();
        return ExitCodes.SUCCESS;
    }

    private static String programCheck(RunSpec run, ProgramModel model) {
        if (!ModelBuilder.startsHere(run)) {
            return "not started here: on a cluster every executor starts it when the run begins";
        }
        return model.settings().mode() == ProgramSettings.Mode.FILE
                ? "found (file mode: it runs once per evaluation)"
                : "started, and said it was ready (protocol " + WorkerProtocol.VERSION + ")";
    }
}
