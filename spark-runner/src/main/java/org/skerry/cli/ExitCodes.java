package org.skerry.cli;

/** The program's exit codes, for scripts; {@link Ending} decides which one an exception means. */
public final class ExitCodes {

    /** The command did what was asked. */
    public static final int SUCCESS = 0;
    /** The run started but failed (every weight zero, tempering stuck, a model error). */
    public static final int RUN_FAILURE = 1;
    /** Bad input: run file, overrides, data, model choice or output folder; nothing was run. */
    public static final int BAD_INPUT = 2;
    /**
     * {@code skerry batch}: the batch ran, but some of its analyses failed; batch-summary.csv
     * gives each one's status and reason, and the others' results are complete.
     */
    public static final int SOME_FAILED = 3;
    /**
     * {@code skerry status}: the run folder records no outcome yet: the run is still going, or it
     * was killed before it could record one.
     */
    public static final int NO_OUTCOME = 4;
    /**
     * Stopped on request (SIGTERM, wall-time limit) at a checkpoint; resume the run to continue.
     * 75 is EX_TEMPFAIL of sysexits.h: "try again later", which batch scripts requeue on.
     */
    public static final int STOPPED_RESUMABLE = 75;

    private ExitCodes() {
    }
}
