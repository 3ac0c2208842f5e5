package org.skerry.cli.data;

/**
 * A problem with input data, with where it is: the source (a file name, or where inline data was
 * written), the line (1-based, or −1 when not known) and the column name (or null). The message
 * reads {@code <source> line <n>, column <name>: <problem>}, leaving out what is not known.
 */
public final class DataException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final String source;
    private final int line;
    private final String column;

    /**
     * @param source  the file or other origin of the data
     * @param line    the 1-based line, or −1 when the problem has no line
     * @param column  the column's name, or null when the problem has no one column
     * @param problem what is wrong, without the location
     */
    public DataException(String source, int line, String column, String problem) {
        this(source, line, column, problem, null);
    }

    /** As {@link #DataException(String, int, String, String)}, with the exception behind it. */
    public DataException(String source, int line, String column, String problem, Throwable cause) {
        this(location(source, line, column) + ": " + problem, source, line, column, cause);
    }

    private DataException(String message, String source, int line, String column, Throwable cause) {
        super(message, cause);
        this.source = source;
        this.line = line;
        this.column = column;
    }

    /** The same problem with {@code more} added to its message (a hint at the likely cause). */
    public DataException withHint(String more) {
        return new DataException(getMessage() + more, source, line, column, getCause());
    }

    /** The file {@code file} cannot be read at all: {@code cannot read data file <file>: <reason>}. */
    public static DataException unreadable(String file, String reason, Throwable cause) {
        return new DataException("cannot read data file " + file + ": " + reason, file, -1, null, cause);
    }

    /** {@code <source> line <n>, column <name>}, leaving out the parts that are unknown. */
    public static String location(String source, int line, String column) {
        StringBuilder text = new StringBuilder(String.valueOf(source));
        if (line > 0) {
            text.append(" line ").append(line);
        }
        if (column != null) {
            text.append(line > 0 ? ", column " : " column ").append(column);
        }
        return text.toString();
    }

    /** The file or other origin of the data. */
    public String source() {
        return source;
    }

    /** The 1-based line of the problem, or −1. */
    public int line() {
        return line;
    }

    /** The name of the column of the problem, or null. */
    public String column() {
        return column;
    }
}
