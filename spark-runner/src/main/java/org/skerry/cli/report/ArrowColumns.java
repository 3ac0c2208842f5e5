package org.skerry.cli.report;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.arrow.memory.RootAllocator;
import org.apache.arrow.vector.FieldVector;
import org.apache.arrow.vector.Float8Vector;
import org.apache.arrow.vector.VectorSchemaRoot;
import org.apache.arrow.vector.ipc.ArrowFileReader;
import org.apache.arrow.vector.types.pojo.Field;

/**
 * Numeric columns of an Arrow IPC file a run wrote ({@code particles.arrow}), read by name with
 * Arrow's Java reader into the same shape as {@link CsvColumns}, so that a report reads either
 * file alike. A missing column, one that is not 64-bit float, a null, or a file Arrow cannot read
 * is bad input naming the file (and the column and row).
 */
final class ArrowColumns {

    private ArrowColumns() {
    }

    /** Reads the columns {@code wanted} of {@code file}. */
    static CsvColumns read(Path file, List<String> wanted) {
        try (RootAllocator allocator = new RootAllocator();
                FileChannel channel = FileChannel.open(file, StandardOpenOption.READ);
                ArrowFileReader reader = new ArrowFileReader(channel, allocator)) {
            VectorSchemaRoot root = reader.getVectorSchemaRoot();
            List<String> header = new ArrayList<>();
            for (Field field : root.getSchema().getFields()) {
                header.add(field.getName());
            }
            int[] index = new int[wanted.size()];
            for (int c = 0; c < index.length; c++) {
                index[c] = header.indexOf(wanted.get(c));
                if (index[c] < 0) {
                    throw new ReportInputException(file + ": no column " + wanted.get(c) + " (columns: "
                            + String.join(",", header) + ")");
                }
                if (!(root.getVector(index[c]) instanceof Float8Vector)) {
                    throw new ReportInputException(file + " column " + wanted.get(c) + ": "
                            + root.getVector(index[c]).getField().getType() + ", not 64-bit floats");
                }
            }
            double[][] values = new double[index.length][1024];
            int rows = 0;
            while (reader.loadNextBatch()) {
                int count = root.getRowCount();
                if ((long) rows + count > Integer.MAX_VALUE - 8) {
                    throw new ReportInputException(file + ": more rows than a report can read");
                }
                for (int c = 0; c < index.length; c++) {
                    if (values[c].length < rows + count) {
                        values[c] = Arrays.copyOf(values[c], Math.max(rows + count, values[c].length * 2));
                    }
                    FieldVector vector = root.getVector(index[c]);
                    Float8Vector column = (Float8Vector) vector;
                    for (int i = 0; i < count; i++) {
                        if (column.isNull(i)) {
                            throw new ReportInputException(file + " row " + (rows + i + 1) + " column "
                                    + wanted.get(c) + ": no value (null)");
                        }
                        values[c][rows + i] = column.get(i);
                    }
                }
                rows += count;
            }
            Map<String, double[]> columns = new HashMap<>();
            for (int c = 0; c < index.length; c++) {
                columns.put(wanted.get(c), Arrays.copyOf(values[c], rows));
            }
            return new CsvColumns(file, header, columns, rows);
        } catch (IOException | RuntimeException e) {
            if (e instanceof ReportInputException) {
                throw (ReportInputException) e;
            }
            throw new ReportInputException(file + ": not a readable Arrow IPC file (" + e.getMessage() + ")", e);
        }
    }
}
