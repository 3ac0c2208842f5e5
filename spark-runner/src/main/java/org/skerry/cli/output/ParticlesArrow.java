package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.arrow.memory.BufferAllocator;
import org.apache.arrow.memory.RootAllocator;
import org.apache.arrow.vector.Float8Vector;
import org.apache.arrow.vector.VectorSchemaRoot;
import org.apache.arrow.vector.ipc.ArrowFileWriter;
import org.apache.arrow.vector.types.FloatingPointPrecision;
import org.apache.arrow.vector.types.pojo.ArrowType;
import org.apache.arrow.vector.types.pojo.Field;
import org.apache.arrow.vector.types.pojo.FieldType;
import org.apache.arrow.vector.types.pojo.Schema;
import org.skerry.engine.population.ParticleRows;

/**
 * Writes {@code particles.arrow}: the final population in the Apache Arrow IPC file format, with
 * the columns of {@code particles.csv} in the same order (one 64-bit float column per parameter,
 * then {@code weight}, {@code log_likelihood}, {@code log_prior}), the values' own bits, no text.
 * Rows are cut into record batches of {@link #BATCH_ROWS} by global index, not by how they
 * arrive, so every backend and partitioning writes the same bytes; each batch is written as soon
 * as it is full, so the writer holds one batch, never the population.
 */
public final class ParticlesArrow implements ParticleWriter {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "particles.arrow";

    /**
     * Rows per record batch: 64 Ki rows is 0.5 MiB per column, large enough that the per-batch
     * framing is negligible and small enough that the writer's memory stays flat in N.
     */
    public static final int BATCH_ROWS = 1 << 16;

    private final StagedFile file;
    private final BufferAllocator allocator;
    private final VectorSchemaRoot root;
    private final Float8Vector[] columns;
    private final ArrowFileWriter writer;
    private final int dimension;
    private final int batchRows;
    private long nextIndex;
    private int filled;
    private boolean finished;

    private ParticlesArrow(StagedFile file, BufferAllocator allocator, VectorSchemaRoot root, ArrowFileWriter writer,
            int dimension, int batchRows) {
        this.file = file;
        this.allocator = allocator;
        this.root = root;
        this.writer = writer;
        this.dimension = dimension;
        this.batchRows = batchRows;
        this.columns = new Float8Vector[dimension + ParticlesCsv.FIXED_COLUMNS.size()];
        for (int c = 0; c < columns.length; c++) {
            columns[c] = (Float8Vector) root.getVector(c);
        }
    }

    /**
     * Starts {@code particles.arrow} in {@code folder}; nothing appears under its name before
     * {@link #finish}.
     *
     * @param parameterNames one distinct name per parameter, in parameter order (as for the CSV)
     */
    public static ParticlesArrow open(Path folder, List<String> parameterNames) throws IOException {
        return open(folder, parameterNames, BATCH_ROWS);
    }

    /** As {@link #open(Path, List)} with another batch size (tests: many batches from few rows). */
    static ParticlesArrow open(Path folder, List<String> parameterNames, int batchRows) throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (batchRows < 1) {
            throw new IllegalArgumentException("batchRows must be >= 1, got " + batchRows);
        }
        ParticlesCsv.checkParameterNames(parameterNames);
        List<Field> fields = new ArrayList<>();
        FieldType float64 = FieldType.notNullable(new ArrowType.FloatingPoint(FloatingPointPrecision.DOUBLE));
        for (String name : parameterNames) {
            fields.add(new Field(name, float64, null));
        }
        for (String name : ParticlesCsv.FIXED_COLUMNS) {
            fields.add(new Field(name, float64, null));
        }
        StagedFile file = StagedFile.open(folder.resolve(FILE_NAME));
        BufferAllocator allocator = null;
        VectorSchemaRoot root = null;
        try {
            allocator = new RootAllocator();
            root = VectorSchemaRoot.create(new Schema(fields), allocator);
            for (int c = 0; c < fields.size(); c++) {
                ((Float8Vector) root.getVector(c)).allocateNew(batchRows);
            }
            ArrowFileWriter writer = new ArrowFileWriter(root, null, file.channel());
            writer.start();
            return new ParticlesArrow(file, allocator, root, writer, parameterNames.size(), batchRows);
        } catch (IOException e) {
            release(e, root, allocator, file);
            throw new IOException("cannot write " + file.target() + ": " + AtomicFile.reason(e), e);
        } catch (RuntimeException e) {
            release(e, root, allocator, file);
            throw e;
        }
    }

    @Override
    public void append(ParticleRows rows) throws IOException {
        if (finished) {
            throw new IllegalStateException(FILE_NAME + " is already finished");
        }
        if (rows.dimension() != dimension) {
            throw new IllegalArgumentException("rows of dimension " + rows.dimension() + ", the file has "
                    + dimension + " parameters");
        }
        if (rows.firstIndex() != nextIndex) {
            throw new IllegalArgumentException("rows start at particle " + rows.firstIndex() + ", expected "
                    + nextIndex);
        }
        double[] values = rows.values();
        int d = dimension;
        int i = 0;
        while (i < rows.count()) {
            int take = Math.min(rows.count() - i, batchRows - filled);
            for (int k = 0; k < d; k++) {
                Float8Vector column = columns[k];
                for (int j = 0; j < take; j++) {
                    column.set(filled + j, values[(i + j) * d + k]);
                }
            }
            copy(columns[d], rows.weights(), i, take);
            copy(columns[d + 1], rows.logLikelihood(), i, take);
            copy(columns[d + 2], rows.logPrior(), i, take);
            filled += take;
            i += take;
            if (filled == batchRows) {
                writeBatch();
            }
        }
        nextIndex += rows.count();
    }

    private void copy(Float8Vector column, double[] from, int start, int count) {
        for (int j = 0; j < count; j++) {
            column.set(filled + j, from[start + j]);
        }
    }

    private void writeBatch() throws IOException {
        root.setRowCount(filled);
        try {
            writer.writeBatch();
        } catch (UnsupportedOperationException e) {
            // Arrow hands its off-heap buffers to the channel as direct ByteBuffers, which on
            // Java 17 needs java.nio opened to it; bin/skerry, spark-submit and the tests do that.
            throw new IOException("cannot write " + FILE_NAME + ": Arrow needs the JVM option "
                    + "--add-opens=java.base/java.nio=ALL-UNNAMED (bin/skerry passes it): " + e.getMessage(), e);
        }
        filled = 0;
    }

    @Override
    public Path finish() throws IOException {
        if (finished) {
            throw new IllegalStateException(FILE_NAME + " is already finished");
        }
        try {
            if (filled > 0) {
                writeBatch();
            }
            writer.end();
        } catch (IOException e) {
            throw new IOException("cannot write " + file.target() + ": " + AtomicFile.reason(e), e);
        }
        Path published = file.publish();
        finished = true;
        return published;
    }

    @Override
    public void close() throws IOException {
        try {
            writer.close();
        } finally {
            release(null, root, allocator, file);
        }
    }

    /** Frees the vectors and the allocator and drops the temporary (if not yet published). */
    private static void release(Throwable failure, VectorSchemaRoot root, BufferAllocator allocator, StagedFile file)
            throws IOException {
        try {
            if (root != null) {
                root.close();
            }
            if (allocator != null) {
                allocator.close();
            }
        } catch (RuntimeException e) {
            if (failure == null) {
                throw e;
            }
            failure.addSuppressed(e);
        } finally {
            file.close();
        }
    }
}
