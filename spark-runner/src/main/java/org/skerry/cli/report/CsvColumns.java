package org.skerry.cli.report;

import com.fasterxml.jackson.core.io.NumberInput;
import java.io.IOException;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Numeric columns of a CSV file a run wrote, read by name with Commons CSV: numbers as the
 * writers spell them ({@code NaN}, {@code Infinity} and {@code -Infinity} included), {@code
 * true}/{@code false} as 1/0, an empty field as NaN. A missing column or a field that is not a
 * number is bad input naming the file, line and column.
 *
 * @param header  every column of the file, in order
 * @param columns the columns asked for, each one value per data row
 */
record CsvColumns(Path file, List<String> header, Map<String, double[]> columns, int rows) {

    private static final CSVFormat FORMAT = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get();

    CsvColumns {
        header = List.copyOf(header);
        columns = Map.copyOf(columns);
    }

    /** The column {@code name}, one value per row. */
    double[] column(String name) {
        double[] values = columns.get(name);
        if (values == null) {
            throw new IllegalArgumentException("column " + name + " was not read from " + file);
        }
        return values;
    }

    /** Reads the columns {@code wanted} of {@code file}; {@code null} reads every column. */
    static CsvColumns read(Path file, List<String> wanted) {
        try (Reader reader = Files.newBufferedReader(file, StandardCharsets.UTF_8);
                CSVParser parser = CSVParser.builder().setReader(reader).setFormat(FORMAT).get()) {
            List<String> header = parser.getHeaderNames();
            List<String> names = wanted == null ? header : wanted;
            int[] index = new int[names.size()];
            for (int i = 0; i < index.length; i++) {
                index[i] = header.indexOf(names.get(i));
                if (index[i] < 0) {
                    throw new ReportInputException(file + " line 1: no column " + names.get(i) + " (columns: "
                            + String.join(",", header) + ")");
                }
            }
            double[][] values = new double[names.size()][1024];
            int capacity = 1024;
            int rows = 0;
            for (CSVRecord record : parser) {
                if (record.size() != header.size()) {
                    throw new ReportInputException(file + " line " + (record.getRecordNumber() + 1) + ": "
                            + record.size() + " fields, the header has " + header.size());
                }
                if (rows == capacity) {
                    capacity *= 2;
                    for (int c = 0; c < values.length; c++) {
                        values[c] = Arrays.copyOf(values[c], capacity);
                    }
                }
                for (int c = 0; c < index.length; c++) {
                    values[c][rows] = number(record.get(index[c]), file, record.getRecordNumber() + 1, names.get(c));
                }
                rows++;
            }
            Map<String, double[]> columns = new LinkedHashMap<>();
            for (int c = 0; c < names.size(); c++) {
                columns.put(names.get(c), Arrays.copyOf(values[c], rows));
            }
            return new CsvColumns(file, header, columns, rows);
        } catch (UncheckedIOException e) {
            throw new ReportInputException(file + ": not a readable CSV file: " + e.getCause().getMessage(), e);
        } catch (IOException e) {
            throw new ReportInputException("cannot read " + file + ": " + e.getMessage(), e);
        } catch (IllegalArgumentException | IllegalStateException e) {
            // Commons CSV's own complaints (a duplicate or empty header name, a broken quote).
            throw new ReportInputException(file + ": not a readable CSV file: " + e.getMessage(), e);
        }
    }

    private static double number(String text, Path file, long line, String column) {
        switch (text) {
            case "" -> {
                return Double.NaN;
            }
            case "true" -> {
                return 1;
            }
            case "false" -> {
                return 0;
            }
            default -> {
                try {
                    // Jackson's bundled fast parser (Lemire's method), correctly rounded like
                    // parseDouble but several times faster on 17-digit numbers: a report of 10⁵
                    // particles spent half its time here.
                    return NumberInput.parseDouble(text, true);
                } catch (NumberFormatException e) {
                    throw new ReportInputException(file + " line " + line + " column " + column + ": '" + text
                            + "' is not a number");
                }
            }
        }
    }
}
