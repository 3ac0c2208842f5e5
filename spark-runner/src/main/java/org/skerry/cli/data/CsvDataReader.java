package org.skerry.cli.data;

import java.io.IOException;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Reads a numeric data file: UTF-8, comma-separated, RFC 4180 quoting (a row that does not read
 * in a file that looks separated by semicolons or tabs gets a hint saying so). Lines starting with
 * {@code #} are comments and blank lines are skipped, anywhere; the first other line is the
 * header of column names; every later line is a row with one number per column. Values and
 * names are trimmed. Numbers are decimal ({@code 12}, {@code -0.5}, {@code 1.5e-3}); nothing else
 * Java would parse ({@code 1d}, {@code 0x1p3}) is accepted.
 *
 * <p>Every problem is a {@link DataException} naming the file, the line and, where there is one,
 * the column.
 */
public final class CsvDataReader {

    private static final Pattern DECIMAL = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");
    private static final Pattern NON_FINITE = Pattern.compile("[+-]?(nan|inf|infinity)");
    private static final Pattern PARSER_LINE = Pattern.compile("^\\(startline \\d+\\)\\s*");

    private static final CSVFormat FORMAT = CSVFormat.RFC4180.builder()
            .setCommentMarker('#')
            .setIgnoreEmptyLines(true)
            .setIgnoreSurroundingSpaces(true)
            .setTrim(true)
            .get();

    private CsvDataReader() {
    }

    /** Reads {@code file}, refusing NaN and infinite values. */
    public static DataTable read(Path file) {
        return read(file, NonFiniteValues.REFUSE);
    }

    /**
     * Reads {@code file}.
     *
     * @throws DataException if the file cannot be read, has no header or no rows, repeats or
     *     leaves out a column name, has a row of the wrong length, or holds a value that is
     *     missing, not a number, or (unless allowed) not finite
     */
    public static DataTable read(Path file, NonFiniteValues nonFinite) {
        if (file == null) {
            throw new IllegalArgumentException("file must not be null");
        }
        if (nonFinite == null) {
            throw new IllegalArgumentException("nonFinite must not be null");
        }
        String source = file.toString();
        String text = readText(file);
        return new Reading(source, text, nonFinite).table();
    }

    private static String readText(Path file) {
        byte[] bytes;
        try {
            bytes = Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw cannotRead(file, "no such file", e);
        } catch (AccessDeniedException e) {
            throw cannotRead(file, "permission denied", e);
        } catch (IOException e) {
            throw cannotRead(file, Files.isDirectory(file) ? "it is a folder" : String.valueOf(e.getMessage()), e);
        }
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes);
        CharBuffer out = CharBuffer.allocate(bytes.length);
        CoderResult result = decoder.decode(in, out, true);
        if (result.isError()) {
            int offset = in.position();
            int line = 1;
            for (int i = 0; i < offset; i++) {
                line += bytes[i] == '\n' ? 1 : 0;
            }
            throw new DataException(file.toString(), line, null, "not UTF-8 text (byte " + (offset + 1)
                    + " of the file); save the file as UTF-8");
        }
        decoder.flush(out);
        out.flip();
        String text = out.toString();
        // A byte-order mark would otherwise become part of the first column's name.
        return text.startsWith("\uFEFF") ? text.substring(1) : text;
    }

    private static DataException cannotRead(Path file, String reason, Exception cause) {
        return DataException.unreadable(file.toString(), reason, cause);
    }

    /** One pass over one file's text. */
    private static final class Reading {
        private final String source;
        private final String text;
        private final NonFiniteValues nonFinite;
        private final int[] lineStarts;

        Reading(String source, String text, NonFiniteValues nonFinite) {
            this.source = source;
            this.text = text;
            this.nonFinite = nonFinite;
            this.lineStarts = lineStarts(text);
        }

        DataTable table() {
            List<String> header = null;
            int headerLine = -1;
            List<double[]> rows = new ArrayList<>();
            List<Integer> lines = new ArrayList<>();
            long nextStart = 0;
            try (CSVParser parser = CSVParser.parse(new StringReader(text), FORMAT)) {
                Iterator<CSVRecord> records = parser.iterator();
                while (true) {
                    CSVRecord record;
                    try {
                        if (!records.hasNext()) {
                            break;
                        }
                        record = records.next();
                    } catch (UncheckedIOException | IllegalStateException e) {
                        String why = e.getCause() != null && e.getCause().getMessage() != null
                                ? e.getCause().getMessage() : String.valueOf(e.getMessage());
                        throw new DataException(source, contentLine(nextStart), null, malformed(why), e);
                    }
                    nextStart = parser.getCurrentLineNumber() < lineStarts.length
                            ? lineStarts[(int) parser.getCurrentLineNumber()] : text.length();
                    if (isBlank(record)) {
                        continue;
                    }
                    int line = contentLine(record.getCharacterPosition());
                    if (header == null) {
                        header = header(record, line);
                        headerLine = line;
                    } else {
                        rows.add(row(record, line, header));
                        lines.add(line);
                    }
                }
            } catch (IOException e) {
                throw new DataException(source, -1, null, "cannot parse: " + e.getMessage(), e);
            }
            if (header == null) {
                throw new DataException(source, -1, null,
                        "no header line (the file is empty or holds only comments and blank lines)");
            }
            if (rows.isEmpty()) {
                throw new DataException(source, -1, null, "no data rows after the header on line " + headerLine);
            }
            double[][] columns = new double[header.size()][rows.size()];
            int[] lineArray = new int[rows.size()];
            for (int i = 0; i < rows.size(); i++) {
                double[] row = rows.get(i);
                for (int k = 0; k < row.length; k++) {
                    columns[k][i] = row[k];
                }
                lineArray[i] = lines.get(i);
            }
            return new DataTable(source, header, columns, lineArray);
        }

        private static String malformed(String parserMessage) {
            if (parserMessage.contains("EOF reached before encapsulated token finished")) {
                return "malformed CSV: a quoted value is not closed before the end of the file";
            }
            return "malformed CSV: " + PARSER_LINE.matcher(parserMessage).replaceFirst("");
        }

        private List<String> header(CSVRecord record, int line) {
            List<String> names = record.toList();
            if (names.stream().allMatch(name -> DECIMAL.matcher(name).matches())) {
                throw new DataException(source, line, null, "the header holds only numbers "
                        + DataTable.listed(names) + "; the first line that is not a comment must name the columns");
            }
            for (int k = 0; k < names.size(); k++) {
                String name = names.get(k);
                if (name.isEmpty()) {
                    throw new DataException(source, line, null, "column " + (k + 1) + " of the header has no name");
                }
                int earlier = names.subList(0, k).indexOf(name);
                if (earlier >= 0) {
                    throw new DataException(source, line, name, "column name '" + name
                            + "' appears twice in the header (columns " + (earlier + 1) + " and " + (k + 1) + ")");
                }
            }
            return names;
        }

        private double[] row(CSVRecord record, int line, List<String> header) {
            try {
                return values(record, line, header);
            } catch (DataException e) {
                List<String> seen = new ArrayList<>(header);
                seen.addAll(record.toList());
                String hint = separatorHint(seen);
                throw hint == null ? e : e.withHint(hint);
            }
        }

        /**
         * Why a row might not read: the file looks separated by semicolons or tabs (as spreadsheets
         * set to a decimal comma write it), or null when it does not.
         */
        private static String separatorHint(List<String> values) {
            String separator = values.stream().anyMatch(v -> v.contains(";")) ? "semicolons (;)"
                    : values.stream().anyMatch(v -> v.contains("\t")) ? "tabs" : null;
            return separator == null ? null : "; the file looks separated by " + separator + ", but skerry reads "
                    + "comma-separated values: save it as CSV with commas between values and decimal points";
        }

        private double[] values(CSVRecord record, int line, List<String> header) {
            if (record.size() != header.size()) {
                throw new DataException(source, line, null, "expected " + header.size() + " fields "
                        + DataTable.listed(header) + ", found " + record.size());
            }
            double[] row = new double[header.size()];
            for (int k = 0; k < row.length; k++) {
                row[k] = number(record.get(k), line, header.get(k));
            }
            return row;
        }

        private double number(String value, int line, String column) {
            if (value.isEmpty()) {
                throw new DataException(source, line, column, "missing value");
            }
            if (DECIMAL.matcher(value).matches()) {
                double x = Double.parseDouble(value);
                if (Double.isInfinite(x)) {
                    throw new DataException(source, line, column, "'" + value + "' is too large for a double");
                }
                return x;
            }
            String lower = value.toLowerCase(Locale.ROOT);
            if (NON_FINITE.matcher(lower).matches()) {
                if (nonFinite == NonFiniteValues.REFUSE) {
                    throw new DataException(source, line, column, "'" + value
                            + "' is not a finite number (NaN and infinite values are refused)");
                }
                if (lower.endsWith("nan")) {
                    return Double.NaN;
                }
                return lower.startsWith("-") ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
            }
            throw new DataException(source, line, column, "'" + value + "' is not a number");
        }

        private static boolean isBlank(CSVRecord record) {
            return record.size() == 0 || (record.size() == 1 && record.get(0).isEmpty());
        }

        /**
         * The 1-based line on which a record starting at {@code position} has its first value: the
         * parser counts the comments and blank lines before a record as part of it.
         */
        private int contentLine(long position) {
            int line = lineIndex(position);
            while (line + 1 < lineStarts.length && isSkipped(line)) {
                line++;
            }
            return line + 1;
        }

        private boolean isSkipped(int line) {
            int start = lineStarts[line];
            int end = line + 1 < lineStarts.length ? lineStarts[line + 1] : text.length();
            String content = text.substring(start, end);
            return content.startsWith("#") || content.isBlank();
        }

        private int lineIndex(long position) {
            int found = Arrays.binarySearch(lineStarts, (int) Math.min(position, Integer.MAX_VALUE));
            return found >= 0 ? found : -found - 2;
        }

        private static int[] lineStarts(String text) {
            List<Integer> starts = new ArrayList<>();
            starts.add(0);
            for (int i = 0; i < text.length(); i++) {
                char c = text.charAt(i);
                if (c == '\n' || (c == '\r' && (i + 1 >= text.length() || text.charAt(i + 1) != '\n'))) {
                    if (i + 1 < text.length()) {
                        starts.add(i + 1);
                    }
                }
            }
            int[] array = new int[starts.size()];
            for (int i = 0; i < array.length; i++) {
                array[i] = starts.get(i);
            }
            return array;
        }
    }
}
