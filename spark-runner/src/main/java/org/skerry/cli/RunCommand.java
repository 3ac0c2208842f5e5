package org.skerry.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code skerry run FILE}: one analysis from a run file. */
@Command(name = "run", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "Run one analysis from a run file and print its run folder and results.")
final class RunCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "FILE", description = "the run file (HOCON)")
    Path file;

    @Option(names = "--set", paramLabel = "KEY=VALUE",
            description = "override one setting of the run file (repeatable), e.g. --set sampler.particles=2000")
    List<String> overrides = new ArrayList<>();

    @Option(names = "--out", paramLabel = "DIR",
            description = "the run folder to write (default: <output.folder>/<name>-<start time>); must be new or empty")
    Path out;

    @Mixin
    WhereOptions where = new WhereOptions();

    @Override
    public Integer call() {
        List<String> all = new ArrayList<>(overrides);
        where.addTo(all);
        RunSpec run = RunSpec.from(RunFile.load(file, all));
        Analysis.Outcome outcome = Analysis.run(run, out, spec.commandLine().getErr());
        PrintWriter stdout = spec.commandLine().getOut();
        ResultTable.print(outcome, stdout);
        stdout.flush();
        return ExitCodes.SUCCESS;
    }
}
