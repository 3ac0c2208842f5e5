package org.skerry.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.skerry.cli.output.AtomicFile;
import org.skerry.cli.output.SummaryJson;

/**
 * How a run in a run folder ended, as files a later reader can trust without the process that ran
 * it: {@code summary.json} (written last) for a finished run, {@code failure.txt} for a failed one,
 * {@code stopped.txt} for a run stopped resumably at a checkpoint. A cluster's submit command
 * often exits 0 whatever the driver did, so these files, read by {@code skerry status}, are the
 * outcome a user or a script checks.
 */
public final class RunOutcome {

    /** Written when a run fails: one line, the reason (the same line a batch records). */
    public static final String FAILURE_FILE = "failure.txt";
    /** Written when a run stops at a checkpoint to be resumed: what is kept and how to continue. */
    public static final String STOPPED_FILE = "stopped.txt";

    /** What a run folder says about its run. */
    public enum State {
        /** summary.json is there. */
        FINISHED(ExitCodes.SUCCESS),
        /** failure.txt is there and no summary. */
        FAILED(ExitCodes.RUN_FAILURE),
        /** stopped.txt is there: resume it. */
        STOPPED(ExitCodes.STOPPED_RESUMABLE),
        /** run.conf but no outcome yet: running, or ended without a chance to say so (killed). */
        NO_OUTCOME(ExitCodes.NO_OUTCOME);

        private final int exitCode;

        State(int exitCode) {
            this.exitCode = exitCode;
        }

        /** The exit code {@code skerry status} gives for this state, as the run itself would have. */
        public int exitCode() {
            return exitCode;
        }
    }

    private RunOutcome() {
    }

    /** The state of the run in {@code runFolder}; the newest outcome wins, since a resume clears the older ones. */
    public static State of(Path runFolder) {
        if (Files.isRegularFile(runFolder.resolve(SummaryJson.FILE_NAME))) {
            return State.FINISHED;
        }
        if (Files.isRegularFile(runFolder.resolve(FAILURE_FILE))) {
            return State.FAILED;
        }
        if (Files.isRegularFile(runFolder.resolve(STOPPED_FILE))) {
            return State.STOPPED;
        }
        return State.NO_OUTCOME;
    }

    /** The text of the outcome file for {@code state}, or null when it has none or it cannot be read. */
    public static String text(Path runFolder, State state) {
        Path file = switch (state) {
            case FAILED -> runFolder.resolve(FAILURE_FILE);
            case STOPPED -> runFolder.resolve(STOPPED_FILE);
            default -> null;
        };
        if (file == null) {
            return null;
        }
        try {
            return Files.readString(file, StandardCharsets.UTF_8).strip();
        } catch (IOException e) {
            return null;
        }
    }

    /** A (re)started run has no outcome yet: removes what an earlier attempt left. */
    static void clear(Path runFolder) {
        try {
            Files.deleteIfExists(runFolder.resolve(FAILURE_FILE));
            Files.deleteIfExists(runFolder.resolve(STOPPED_FILE));
        } catch (IOException e) {
            throw new java.io.UncheckedIOException("cannot remove the outcome of the earlier attempt in " + runFolder, e);
        }
    }

    /** Records how the run ended, if {@code runFolder} still exists (a run refused as bad input removes it). */
    static void record(Path runFolder, Throwable ending) {
        Ending meaning = Ending.of(ending);
        String file = meaning.exitCode() == ExitCodes.STOPPED_RESUMABLE ? STOPPED_FILE : FAILURE_FILE;
        write(runFolder, file, meaning.summary());
    }

    /** Records a stop on a signal whose grace period ran out (the process exits right after). */
    static void recordAbandoned(Path runFolder, String whatIsKept) {
        write(runFolder, STOPPED_FILE, "stopped on a signal; " + whatIsKept);
    }

    private static void write(Path runFolder, String file, String text) {
        if (!Files.isDirectory(runFolder)) {
            return;
        }
        try {
            AtomicFile.writeString(runFolder.resolve(file), text + "\n");
        } catch (IOException | RuntimeException e) {
            // The run's own error is what the user must see; a folder we cannot write to is part of it.
        }
    }
}
