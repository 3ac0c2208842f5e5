package org.skerry.cli;

import java.io.PrintWriter;
import org.skerry.cli.scaling.ScaleCommand;
import org.skerry.cli.stop.TerminationSignal;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code skerry} command: sequential Monte Carlo calibration of costly models. Subcommands
 * run an analysis, check a run file, report a finished run, list models and run the demo. Exit codes are in
 * {@link ExitCodes}.
 */
@Command(name = "skerry", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "Bayesian calibration of costly models by sequential Monte Carlo: posterior, evidence, diagnostics.",
        subcommands = {RunCommand.class, ResumeCommand.class, BatchCommand.class, ScaleCommand.class,
            StatusCommand.class, ValidateCommand.class, ReportCommand.class, ModelsCommand.class, DemoCommand.class,
            DemoDataCommand.class, CommandLine.HelpCommand.class},
        exitCodeOnInvalidInput = ExitCodes.BAD_INPUT, exitCodeOnExecutionException = ExitCodes.RUN_FAILURE)
public final class SkerryCommand implements Runnable {

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    /** Runs the program with the given arguments and returns its exit code. */
    public static int execute(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine line = new CommandLine(new SkerryCommand());
        line.setOut(out);
        line.setErr(err);
        line.setExecutionExceptionHandler((exception, commandLine, parseResult) -> {
            PrintWriter errors = commandLine.getErr();
            if (TerminationSignal.abandoning()) {
                // The run was abandoned on a signal, which said what is kept and how to continue;
                // this is the shutdown cutting it short (Spark's jobs cancelled), not a failure.
                return ExitCodes.STOPPED_RESUMABLE;
            }
            Ending ending = Ending.of(exception);
            for (String text : ending.lines()) {
                errors.println("skerry: " + text);
            }
            if (ending.trace()) {
                StackTraceElement[] trace = exception.getStackTrace();
                for (int i = 0; i < Math.min(8, trace.length); i++) {
                    errors.println("    at " + trace[i]);
                }
            }
            errors.flush();
            return ending.exitCode();
        });
        return line.execute(args);
    }

    public static void main(String[] args) {
        PrintWriter out = new PrintWriter(System.out, true);
        PrintWriter err = new PrintWriter(System.err, true);
        System.exit(execute(args, out, err));
    }
}
