package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.DoubleText;

/**
 * The report reads numbers with a fast parser; the reference is the JDK's {@link Double#parseDouble},
 * correctly rounded by its specification: every value must come back with the same bits.
 */
class CsvColumnsTest {

    @TempDir
    Path folder;

    @Test
    void everyNumberReadsBackToTheBitsTheJdkParserGives() throws IOException {
        SplittableRandom random = new SplittableRandom(20261202);
        int rows = 20_000;
        double[] written = new double[rows];
        StringBuilder csv = new StringBuilder("x\n");
        for (int i = 0; i < rows; i++) {
            double x = switch (i % 5) {
                case 0 -> Double.longBitsToDouble(random.nextLong());             // any bit pattern
                case 1 -> Double.longBitsToDouble(random.nextLong(1L, 1L << 52)); // subnormal
                case 2 -> random.nextGaussian();
                case 3 -> (random.nextBoolean() ? 1 : -1) * (random.nextBoolean() ? Double.MAX_VALUE : Double.MIN_NORMAL)
                        * (1 - random.nextDouble() * 1e-15);                      // near the extremes
                default -> random.nextDouble() * Math.pow(10, random.nextInt(-30, 30));
            };
            String text = DoubleText.format(x);
            written[i] = Double.parseDouble(text);
            csv.append(text).append('\n');
        }
        Path file = Files.writeString(folder.resolve("numbers.csv"), csv);
        double[] read = CsvColumns.read(file, List.of("x")).column("x");
        assertEquals(rows, read.length);
        for (int i = 0; i < rows; i++) {
            if (Double.doubleToRawLongBits(read[i]) != Double.doubleToRawLongBits(written[i])) {
                throw new AssertionError("row " + (i + 2) + ": read " + read[i] + ", the JDK reads " + written[i]);
            }
        }
    }

    @Test
    void notANumberNamesTheFileLineAndColumn() throws IOException {
        Path file = Files.writeString(folder.resolve("bad.csv"), "a,b\n1.0,2.0\n3.0,x1\n");
        ReportInputException e = assertThrows(ReportInputException.class, () -> CsvColumns.read(file, null));
        assertTrue(e.getMessage().contains("bad.csv line 3 column b: 'x1' is not a number"), e.getMessage());
    }
}
