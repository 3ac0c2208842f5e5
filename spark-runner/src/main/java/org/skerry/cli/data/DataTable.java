package org.skerry.cli.data;

import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Immutable named columns of numbers, read from a data file or written inline in a run file.
 * Columns keep the order of their source; every column has {@link #rowCount()} values; each row
 * remembers the line it came from, for messages.
 */
public final class DataTable {

    private final String source;
    private final List<String> columns;
    private final Map<String, Integer> index;
    private final double[][] values;
    private final int[] lines;

    /** Takes ownership of the arrays; callers have checked them. */
    DataTable(String source, List<String> columns, double[][] values, int[] lines) {
        this.source = source;
        this.columns = Collections.unmodifiableList(new ArrayList<>(columns));
        this.index = new HashMap<>();
        for (int k = 0; k < columns.size(); k++) {
            index.put(columns.get(k), k);
        }
        this.values = values;
        this.lines = lines;
    }

    /**
     * A table from rows whose lines are unknown, such as inline data.
     *
     * @see #fromRows(String, List, List, int[])
     */
    public static DataTable fromRows(String source, List<String> columns, List<double[]> rows) {
        return fromRows(source, columns, rows, null);
    }

    /**
     * A table from rows of values, one value per column in each row.
     *
     * @param source  where the data come from, for messages ({@code "run.conf, data.inline"})
     * @param columns distinct, non-empty column names
     * @param rows    at least one row; every value finite
     * @param lines   the 1-based line of each row, or null when unknown
     * @throws DataException naming the source, the row's line (when known) and the column, if a
     *     name is empty or repeated, there are no rows, a row has the wrong length, or a value is
     *     not finite
     */
    public static DataTable fromRows(String source, List<String> columns, List<double[]> rows, int[] lines) {
        if (source == null) {
            throw new IllegalArgumentException("source must not be null");
        }
        if (columns == null || columns.isEmpty()) {
            throw new DataException(source, -1, null, "no columns");
        }
        if (rows == null || rows.isEmpty()) {
            throw new DataException(source, -1, null, "no data rows");
        }
        if (lines != null && lines.length != rows.size()) {
            throw new IllegalArgumentException("lines must hold one line per row (" + rows.size() + "), got "
                    + lines.length);
        }
        for (int k = 0; k < columns.size(); k++) {
            String name = columns.get(k);
            if (name == null || name.isBlank()) {
                throw new DataException(source, -1, null, "column " + (k + 1) + " has an empty name");
            }
            int earlier = columns.subList(0, k).indexOf(name);
            if (earlier >= 0) {
                throw new DataException(source, -1, name, "column name '" + name + "' appears twice (columns "
                        + (earlier + 1) + " and " + (k + 1) + ")");
            }
        }
        int width = columns.size();
        double[][] values = new double[width][rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            double[] row = rows.get(i);
            int line = lines == null ? -1 : lines[i];
            String where = line > 0 ? "" : "row " + (i + 1) + ": ";
            if (row == null || row.length != width) {
                throw new DataException(source, line, null, where + "expected " + width + " values "
                        + listed(columns) + ", found " + (row == null ? 0 : row.length));
            }
            for (int k = 0; k < width; k++) {
                if (!Double.isFinite(row[k])) {
                    throw new DataException(source, line, columns.get(k), where + row[k] + " is not finite");
                }
                values[k][i] = row[k];
            }
        }
        return new DataTable(source, columns, values, lines == null ? null : lines.clone());
    }

    /** Names in parentheses, the first ten of a long list. */
    static String listed(List<String> names) {
        int shown = Math.min(names.size(), 10);
        String list = String.join(", ", names.subList(0, shown));
        return "(" + list + (names.size() > shown ? ", … " + (names.size() - shown) + " more" : "") + ")";
    }

    /** Where the data come from: the file name as given, or the origin of inline data. */
    public String source() {
        return source;
    }

    /** Column names in source order. */
    public List<String> columns() {
        return columns;
    }

    public boolean hasColumn(String name) {
        return index.containsKey(name);
    }

    /**
     * The values of the named column, a fresh array.
     *
     * @throws DataException naming the source and the columns it has, if there is no such column
     */
    public double[] column(String name) {
        Integer k = index.get(name);
        if (k == null) {
            throw new DataException(source, -1, null, "no column named '" + name + "'; the columns are "
                    + String.join(", ", columns));
        }
        return values[k].clone();
    }

    public int rowCount() {
        return values[0].length;
    }

    /** The 1-based line of row {@code row} (0-based) in the source, or −1 when not known. */
    public int lineOf(int row) {
        if (row < 0 || row >= rowCount()) {
            throw new IndexOutOfBoundsException("row must be in [0, " + rowCount() + "), was " + row);
        }
        return lines == null ? -1 : lines[row];
    }

    /** Where row {@code row} is, for messages: {@code "data.csv line 17"}, or {@code "<source> row 4"}. */
    public String where(int row) {
        int line = lineOf(row);
        return line > 0 ? source + " line " + line : source + " row " + (row + 1);
    }

    @Override
    public String toString() {
        return "DataTable(" + source + ", " + rowCount() + " rows, columns " + columns + ")";
    }
}
