package org.skerry.cli.runfile;

/**
 * Bad input in a run file, its overrides or its data: the message names the file, line, key and
 * value that are wrong. The command-line program turns it into exit code 2.
 */
public final class RunFileException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public RunFileException(String message) {
        super(message);
    }

    public RunFileException(String message, Throwable cause) {
        super(message, cause);
    }
}
