package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.apache.arrow.memory.RootAllocator;
import org.apache.arrow.vector.Float8Vector;
import org.apache.arrow.vector.VectorSchemaRoot;
import org.apache.arrow.vector.ipc.ArrowFileReader;
import org.apache.arrow.vector.types.FloatingPointPrecision;
import org.apache.arrow.vector.types.pojo.ArrowType;
import org.apache.arrow.vector.types.pojo.Field;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.population.ParticleRows;

/**
 * particles.arrow read back with Arrow's own Java reader. The check against a reader that is not
 * ours nor Arrow Java's is {@code ArrowIndependentReaderTest} (JavaScript's apache-arrow).
 */
class ParticlesArrowTest {

    @TempDir
    Path folder;

    /** A population of {@code n} particles of dimension {@code d} from {@link DoubleSamples}. */
    private static ParticleRows population(int n, int d, long seed) {
        DoubleSamples samples = new DoubleSamples(seed);
        double[] values = new double[n * d];
        double[] w = new double[n];
        double[] ll = new double[n];
        double[] lp = new double[n];
        for (int i = 0; i < values.length; i++) {
            values[i] = samples.next();
        }
        for (int i = 0; i < n; i++) {
            w[i] = samples.next();
            ll[i] = i % 7 == 3 ? Double.NEGATIVE_INFINITY : samples.next();
            lp[i] = i % 11 == 5 ? -0.0 : samples.next();
        }
        return new ParticleRows(0, n, d, values, w, ll, lp);
    }

    /** Appends {@code all} in runs of random lengths, as blocks of unequal sizes would arrive. */
    private static Path write(Path folder, List<String> names, ParticleRows all, int batchRows, long seed)
            throws IOException {
        SplittableRandom random = new SplittableRandom(seed);
        int d = all.dimension();
        try (ParticlesArrow writer = ParticlesArrow.open(folder, names, batchRows)) {
            int start = 0;
            while (start < all.count()) {
                int count = Math.min(all.count() - start, random.nextInt(0, 40));
                double[] v = new double[count * d];
                System.arraycopy(all.values(), start * d, v, 0, count * d);
                double[] w = new double[count];
                double[] ll = new double[count];
                double[] lp = new double[count];
                System.arraycopy(all.weights(), start, w, 0, count);
                System.arraycopy(all.logLikelihood(), start, ll, 0, count);
                System.arraycopy(all.logPrior(), start, lp, 0, count);
                writer.append(new ParticleRows(start, count, d, v, w, ll, lp));
                start += count;
            }
            return writer.finish();
        }
    }

    /** Every column of {@code file} as raw bits, column by column, and the number of batches. */
    private static List<long[]> readBits(Path file, List<String> expectedNames, int[] batches) throws IOException {
        try (RootAllocator allocator = new RootAllocator();
                FileChannel channel = FileChannel.open(file, StandardOpenOption.READ);
                ArrowFileReader reader = new ArrowFileReader(channel, allocator)) {
            VectorSchemaRoot root = reader.getVectorSchemaRoot();
            List<Field> fields = root.getSchema().getFields();
            List<String> names = new ArrayList<>();
            for (Field field : fields) {
                names.add(field.getName());
                assertEquals(new ArrowType.FloatingPoint(FloatingPointPrecision.DOUBLE), field.getType(), field.getName());
                assertFalse(field.isNullable(), field.getName());
            }
            assertEquals(expectedNames, names);
            List<List<Long>> columns = new ArrayList<>();
            names.forEach(n -> columns.add(new ArrayList<>()));
            batches[0] = reader.getRecordBlocks().size();
            while (reader.loadNextBatch()) {
                for (int c = 0; c < names.size(); c++) {
                    Float8Vector vector = (Float8Vector) root.getVector(c);
                    for (int i = 0; i < root.getRowCount(); i++) {
                        columns.get(c).add(Double.doubleToRawLongBits(vector.get(i)));
                    }
                }
            }
            List<long[]> bits = new ArrayList<>();
            columns.forEach(c -> bits.add(c.stream().mapToLong(Long::longValue).toArray()));
            return bits;
        }
    }

    @Test
    @DisplayName("particles.arrow reads back with Arrow Java to the same bits, columns and order as particles.csv")
    void readsBackExactly() throws IOException {
        int n = 1000;
        int d = 3;
        ParticleRows all = population(n, d, 17);
        List<String> names = List.of("depth_m", "mu \"b\", second", "k");
        Path file = write(folder, names, all, 128, 5);
        assertEquals(folder.resolve(ParticlesArrow.FILE_NAME), file);
        int[] batches = new int[1];
        List<long[]> bits = readBits(file, List.of("depth_m", "mu \"b\", second", "k", "weight", "log_likelihood",
                "log_prior"), batches);
        assertEquals((n + 127) / 128, batches[0], "record batches of 128 rows");
        for (int c = 0; c < d + 3; c++) {
            assertEquals(n, bits.get(c).length, "rows of column " + c);
        }
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < d; k++) {
                assertEquals(Double.doubleToRawLongBits(all.value(i, k)), bits.get(k)[i], "row " + i + " column " + k);
            }
            assertEquals(Double.doubleToRawLongBits(all.weights()[i]), bits.get(d)[i], "weight of row " + i);
            assertEquals(Double.doubleToRawLongBits(all.logLikelihood()[i]), bits.get(d + 1)[i], "log_likelihood " + i);
            assertEquals(Double.doubleToRawLongBits(all.logPrior()[i]), bits.get(d + 2)[i], "log_prior " + i);
        }
    }

    @Test
    @DisplayName("the same rows give the same bytes however they are cut into appends")
    void sameBytesWhateverTheRuns() throws IOException {
        ParticleRows all = population(700, 2, 3);
        Path a = Files.createDirectory(folder.resolve("a"));
        Path b = Files.createDirectory(folder.resolve("b"));
        Path c = Files.createDirectory(folder.resolve("c"));
        write(a, List.of("x", "y"), all, 64, 1);
        write(b, List.of("x", "y"), all, 64, 2);
        try (ParticlesArrow whole = ParticlesArrow.open(c, List.of("x", "y"), 64)) {
            whole.append(all);
            whole.finish();
        }
        byte[] bytes = Files.readAllBytes(a.resolve(ParticlesArrow.FILE_NAME));
        assertArrayEquals(bytes, Files.readAllBytes(b.resolve(ParticlesArrow.FILE_NAME)));
        assertArrayEquals(bytes, Files.readAllBytes(c.resolve(ParticlesArrow.FILE_NAME)));
    }

    @Test
    @DisplayName("closed without finish: nothing left in the folder, an older particles.arrow untouched")
    void abandonedLeavesNothing() throws IOException {
        Path older = folder.resolve(ParticlesArrow.FILE_NAME);
        Files.writeString(older, "older");
        ParticleRows all = population(300, 2, 9);
        try (ParticlesArrow writer = ParticlesArrow.open(folder, List.of("x", "y"), 64)) {
            writer.append(all);
        }
        try (Stream<Path> files = Files.list(folder)) {
            assertEquals(List.of(older), files.toList());
        }
        assertEquals("older", Files.readString(older));
    }

    @Test
    @DisplayName("rows out of order, of the wrong dimension, or clashing names are refused")
    void refusesBadRows() throws IOException {
        ParticleRows two = population(5, 2, 1);
        try (ParticlesArrow writer = ParticlesArrow.open(folder, List.of("x", "y"))) {
            writer.append(two);
            IllegalArgumentException gap = assertThrows(IllegalArgumentException.class,
                    () -> writer.append(new ParticleRows(6, 1, 2, new double[2], new double[1], new double[1],
                            new double[1])));
            assertTrue(gap.getMessage().contains("expected 5"), gap.getMessage());
            assertThrows(IllegalArgumentException.class, () -> writer.append(population(1, 3, 1)));
        }
        IllegalArgumentException clash = assertThrows(IllegalArgumentException.class,
                () -> ParticlesArrow.open(folder, List.of("x", "weight")));
        assertTrue(clash.getMessage().contains("weight"), clash.getMessage());
        try (Stream<Path> files = Files.list(folder)) {
            assertEquals(0, files.count(), "nothing written");
        }
    }
}
