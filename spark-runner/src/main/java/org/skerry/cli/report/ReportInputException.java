package org.skerry.cli.report;

/**
 * A run folder the report cannot be made from: missing, unfinished, or holding a file that does
 * not read back. The message names the folder or file (and line or key) that is wrong; the
 * program turns it into exit code 2, and nothing has been written.
 */
public final class ReportInputException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public ReportInputException(String message) {
        super(message);
    }

    public ReportInputException(String message, Throwable cause) {
        super(message, cause);
    }
}
