package org.skerry.engine.program;

/**
 * An evaluation a program could not give: the worker reported an error for the particle, crashed,
 * answered with something that is not a number or does not match the request, or ran past its
 * timeout. The sampler counts it as an invalid evaluation, with this message as the reason (it
 * ends with the program's standard-error tail), and retries it as {@code model.retries} allows.
 */
public final class ProgramFailureException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public ProgramFailureException(String message) {
        super(message, null, false, false);
    }
}
