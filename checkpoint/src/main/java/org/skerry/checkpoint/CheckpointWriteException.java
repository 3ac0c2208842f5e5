package org.skerry.checkpoint;

/**
 * A checkpoint could not be written (a full or read-only file system, lost permissions). The
 * earlier checkpoint it names is intact, so the run can be resumed from there once the cause is
 * fixed.
 */
public final class CheckpointWriteException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final int iteration;
    private final int lastGood;

    public CheckpointWriteException(int iteration, String location, int lastGood, Throwable cause) {
        super("cannot write the checkpoint of iteration " + iteration + " to " + location + ": " + rootMessage(cause)
                + (lastGood >= 0 ? "; the checkpoint of iteration " + lastGood + " is intact"
                        : "; no earlier checkpoint exists"), cause);
        this.iteration = iteration;
        this.lastGood = lastGood;
    }

    /** The iteration whose checkpoint failed. */
    public int iteration() {
        return iteration;
    }

    /** The newest complete checkpoint's iteration, or −1. */
    public int lastGood() {
        return lastGood;
    }

    /** The innermost cause's message: the file system's own words ("No space left on device"). */
    public static String rootMessage(Throwable error) {
        Throwable root = error;
        while (root.getCause() != null && root.getCause() != root) {
            root = root.getCause();
        }
        return root.getMessage() == null ? root.toString() : root.getMessage();
    }
}
