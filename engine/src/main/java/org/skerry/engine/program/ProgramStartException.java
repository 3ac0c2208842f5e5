package org.skerry.engine.program;

/**
 * A program that cannot become a worker at all: the program or its interpreter is missing, it
 * exits or fails before it says it is ready (an import error), or it speaks another protocol
 * version. Found before the run starts, so the run is refused as bad input with the program's
 * standard error in the message.
 */
public final class ProgramStartException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public ProgramStartException(String message) {
        super(message, null, false, false);
    }
}
