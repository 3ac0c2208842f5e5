package org.skerry.cli;

import java.util.ArrayList;
import java.util.List;
import org.skerry.cli.report.ReportInputException;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.abc.DistanceScales;
import org.skerry.engine.sampler.InvalidEvaluationsException;
import org.skerry.engine.sampler.SamplingFailedException;
import org.skerry.engine.settings.SettingsException;

/**
 * What an exception that ends a command or a batch's analysis means, decided in this one place:
 * its {@link ExitCodes exit code}, the one line a batch records for the analysis, and the lines
 * the command prints (without the {@code "skerry: "} prefix). Bad input (a run file, its data, a
 * setting) is exit code 2 and never shows a stack trace; an unexpected error shows the top of its
 * trace.
 *
 * @param exitCode the program's exit code
 * @param summary  one line for a batch's failure record
 * @param lines    what the command prints, one line each
 * @param trace    whether the command prints the top of the stack trace after the lines
 */
public record Ending(int exitCode, String summary, List<String> lines, boolean trace) {

    public Ending {
        lines = List.copyOf(lines);
    }

    /** The meaning of {@code e}. */
    public static Ending of(Throwable e) {
        if (e instanceof RunFileException || e instanceof SettingsException || e instanceof ReportInputException) {
            String line = "bad input: " + e.getMessage();
            return new Ending(ExitCodes.BAD_INPUT, line, List.of(line), false);
        }
        if (e instanceof DistanceScales.ZeroSpreadException) {
            String line = "bad input: " + e.getMessage() + " (sampler.abc.distance-weights)";
            return new Ending(ExitCodes.BAD_INPUT, line, List.of(line), false);
        }
        if (e instanceof RunEnded) {
            return new Ending(((RunEnded) e).exitCode(), e.getMessage(), List.of(e.getMessage()), false);
        }
        if (e instanceof SamplingFailedException) {
            String summary = "the run failed at " + e.getMessage();
            List<String> lines = new ArrayList<>();
            if (e instanceof InvalidEvaluationsException) {
                InvalidEvaluationsException invalid = (InvalidEvaluationsException) e;
                lines.add("the run failed at iteration " + invalid.iteration() + ": "
                        + invalid.explain(RunSpec.MAX_INVALID_FRACTION_KEY));
                String reason = invalid.firstInvalidReason();
                if (reason != null && reason.contains(org.skerry.engine.program.ProgramSimulator.WRONG_COUNT)) {
                    // A program's summary count is known only from its replies; raising the limit would
                    // only hide that every reply is wrong.
                    lines.add("the program replies with another number of summaries than model.program.summaries "
                            + "names: make the two agree (the names, in the order the program writes them), then "
                            + "run again");
                    return new Ending(ExitCodes.RUN_FAILURE, summary, lines, false);
                }
                lines.add("raise " + RunSpec.MAX_INVALID_FRACTION_KEY + " (up to 1) only if the model is "
                        + "known to fail there (the posterior is then conditional on where it works); set "
                        + RunSpec.RETRIES_KEY + " for a model that fails now and then; return -Infinity where the "
                        + "parameters are impossible. The run folder keeps what was written, checkpoints included: "
                        + "skerry resume RUN_FOLDER --set " + RunSpec.MAX_INVALID_FRACTION_KEY + "=… continues it.");
            } else {
                lines.add(summary);
            }
            return new Ending(ExitCodes.RUN_FAILURE, summary, lines, false);
        }
        String hint = SparkFailures.explain(e);
        if (hint != null) {
            String line = "the run failed: " + hint;
            return new Ending(ExitCodes.RUN_FAILURE, line, List.of(line), false);
        }
        String line = "the run failed: " + e;
        return new Ending(ExitCodes.RUN_FAILURE, line, List.of(line), true);
    }
}
