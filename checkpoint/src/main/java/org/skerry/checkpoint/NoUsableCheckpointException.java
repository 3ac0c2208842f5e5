package org.skerry.checkpoint;

/**
 * A resume found nothing to continue from: no checkpoint folder could be listed, or every
 * checkpoint in it is damaged or unfinished (the message says why for each).
 */
public final class NoUsableCheckpointException extends IllegalStateException {

    private static final long serialVersionUID = 1L;

    public NoUsableCheckpointException(String message, Throwable cause) {
        super(message, cause);
    }
}
