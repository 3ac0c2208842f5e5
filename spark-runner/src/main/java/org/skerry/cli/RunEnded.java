package org.skerry.cli;

/**
 * A run that ended without results but in a known way — stopped resumably, or failed in a way
 * the message explains (a checkpoint that cannot be written, no usable checkpoint to resume
 * from). The command prints the message and exits with the code.
 */
public final class RunEnded extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final int exitCode;

    RunEnded(int exitCode, String message, Throwable cause) {
        super(message, cause);
        this.exitCode = exitCode;
    }

    /** The exit code the command ends with. */
    public int exitCode() {
        return exitCode;
    }
}
