package org.skerry.cli.data;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CsvDataReaderTest {

    @TempDir
    Path folder;

    private Path file(String name, String text) throws IOException {
        return Files.write(folder.resolve(name), text.getBytes(StandardCharsets.UTF_8));
    }

    private DataException refused(Path file) {
        return assertThrows(DataException.class, () -> CsvDataReader.read(file));
    }

    private static double decimal(String text) {
        return new BigDecimal(text).doubleValue();
    }

    @Test
    @DisplayName("comments, blank lines, spaces, quotes, CRLF and a byte-order mark; rows keep their lines")
    void happyPath() throws IOException {
        Path data = file("obs.csv", "\uFEFF# chlorophyll survey\r\n"
                + "\r\n"
                + " day , \"chl\",depth\r\n"
                + "1, 0.25 ,10\r\n"
                + "# a comment between rows\r\n"
                + "   \r\n"
                + "2,\"1.5e-3\",-2.5E+2\r\n"
                + "\r\n"
                + "3,.5,7.\r\n"
                + "4,-0,+12");
        DataTable table = CsvDataReader.read(data);
        assertEquals(data.toString(), table.source());
        assertEquals(List.of("day", "chl", "depth"), table.columns());
        assertEquals(4, table.rowCount());
        assertArrayEquals(new double[] {1, 2, 3, 4}, table.column("day"));
        assertArrayEquals(new double[] {decimal("0.25"), decimal("1.5e-3"), decimal("0.5"), -0.0}, table.column("chl"));
        assertArrayEquals(new double[] {10, -250, 7, 12}, table.column("depth"));
        assertEquals(Double.doubleToRawLongBits(-0.0), Double.doubleToRawLongBits(table.column("chl")[3]));
        assertEquals(4, table.lineOf(0));
        assertEquals(7, table.lineOf(1));
        assertEquals(9, table.lineOf(2));
        assertEquals(10, table.lineOf(3));
        assertEquals(data + " line 7", table.where(1));
    }

    @Test
    @DisplayName("a value quoted over two lines: later rows still get their own line numbers")
    void multiLineField() throws IOException {
        Path data = file("multi.csv", "a,\"b\nsecond line of the name\"\n1,2\n\"3\n\",4\n5,6\n");
        DataTable table = CsvDataReader.read(data);
        assertEquals(List.of("a", "b\nsecond line of the name"), table.columns());
        assertArrayEquals(new double[] {1, 3, 5}, table.column("a"));
        assertEquals(3, table.lineOf(0));
        assertEquals(4, table.lineOf(1));
        assertEquals(6, table.lineOf(2));
    }

    @Test
    @DisplayName("a missing file, and a folder, cannot be read")
    void unreadable() throws IOException {
        Path missing = folder.resolve("nope.csv");
        assertEquals("cannot read data file " + missing + ": no such file", refused(missing).getMessage());
        assertEquals("cannot read data file " + folder + ": it is a folder", refused(folder).getMessage());
        assertEquals(missing.toString(), refused(missing).source());
    }

    @Test
    @DisplayName("an empty file, or one with only comments and blank lines, has no header")
    void noHeader() throws IOException {
        for (String text : new String[] {"", "\n\n", "# just a note\n\n# another\n"}) {
            Path data = file("empty.csv", text);
            DataException e = refused(data);
            assertEquals(data + ": no header line (the file is empty or holds only comments and blank lines)",
                    e.getMessage());
            assertEquals(-1, e.line());
        }
    }

    @Test
    @DisplayName("a header without rows is refused, naming the header's line")
    void noRows() throws IOException {
        Path data = file("header.csv", "# note\n\nx,y\n# nothing more\n");
        assertEquals(data + ": no data rows after the header on line 3", refused(data).getMessage());
    }

    @Test
    @DisplayName("a repeated or empty column name")
    void badHeader() throws IOException {
        Path twice = file("twice.csv", "#\nday,chl,depth, chl\n1,2,3,4\n");
        DataException e = refused(twice);
        assertEquals(twice + " line 2, column chl: column name 'chl' appears twice in the header (columns 2 and 4)",
                e.getMessage());
        assertEquals(2, e.line());
        assertEquals("chl", e.column());
        Path blank = file("blank.csv", "day,,depth\n1,2,3\n");
        assertEquals(blank + " line 1: column 2 of the header has no name", refused(blank).getMessage());
    }

    @Test
    @DisplayName("a first line of numbers is taken for forgotten names")
    void headerOfNumbers() throws IOException {
        Path data = file("bare.csv", "# no names\n1,2.5,3\n4,5,6\n");
        assertEquals(data + " line 2: the header holds only numbers (1, 2.5, 3); the first line that is not a comment"
                + " must name the columns", refused(data).getMessage());
        assertEquals(List.of("1", "x"), CsvDataReader.read(file("mixed.csv", "1,x\n2,3\n")).columns());
    }

    @Test
    @DisplayName("a row with the wrong number of fields names its line and the expected columns")
    void wrongFieldCount() throws IOException {
        StringBuilder text = new StringBuilder("# survey\nday, chl, depth\n");
        for (int line = 3; line < 17; line++) {
            text.append(line % 4 == 0 ? "# note\n" : line % 5 == 0 ? "\n" : line + ",0.5,3\n");
        }
        text.append("17,0.5\n18,1,1\n");
        Path data = file("short.csv", text.toString());
        DataException e = refused(data);
        assertEquals(data + " line 17: expected 3 fields (day, chl, depth), found 2", e.getMessage());
        assertEquals(17, e.line());
        assertNull(e.column());
        Path longer = file("long.csv", "a,b\n1,2,3\n");
        assertEquals(longer + " line 2: expected 2 fields (a, b), found 3", refused(longer).getMessage());
    }

    @Test
    @DisplayName("a value that is not a decimal number names line and column")
    void notANumber() throws IOException {
        Path data = file("text.csv", "day,chl,depth\n1,2,3\n\n# c\n2,3,4\n3,4,5\n4,5,6\n\n5,abc,7\n");
        DataException e = refused(data);
        assertEquals(data + " line 9, column chl: 'abc' is not a number", e.getMessage());
        assertEquals(9, e.line());
        assertEquals("chl", e.column());
        for (String value : new String[] {"1d", "0x1p3", "1,5", "1e", "--1", "1 000"}) {
            Path odd = file("odd.csv", "x,y\n\"" + value + "\",1\n");
            assertEquals(odd + " line 2, column x: '" + value + "' is not a number", refused(odd).getMessage());
        }
    }

    @Test
    @DisplayName("an empty field is a missing value")
    void missingValue() throws IOException {
        Path data = file("gap.csv", "day,chl,depth\n1,2,3\n2, ,4\n");
        assertEquals(data + " line 3, column chl: missing value", refused(data).getMessage());
        Path last = file("gap2.csv", "day,chl,depth\n1,2,\n");
        assertEquals(last + " line 2, column depth: missing value", refused(last).getMessage());
    }

    @Test
    @DisplayName("NaN and infinities are refused by default, read when allowed; overflow always refused")
    void nonFinite() throws IOException {
        Path data = file("nan.csv", "x,y\n1,2\n2,NaN\n");
        assertEquals(data + " line 3, column y: 'NaN' is not a finite number (NaN and infinite values are refused)",
                refused(data).getMessage());
        Path inf = file("inf.csv", "x,y\n-Infinity,2\n");
        assertEquals(inf + " line 2, column x: '-Infinity' is not a finite number (NaN and infinite values are refused)",
                refused(inf).getMessage());

        Path all = file("all.csv", "x\nNaN\nnan\nInfinity\n+inf\n-Infinity\n-INF\n2\n");
        double[] x = CsvDataReader.read(all, NonFiniteValues.ALLOW).column("x");
        assertArrayEquals(new double[] {Double.NaN, Double.NaN, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY,
            Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, 2}, x);

        Path huge = file("huge.csv", "x\n1e999\n");
        assertEquals(huge + " line 2, column x: '1e999' is too large for a double",
                assertThrows(DataException.class, () -> CsvDataReader.read(huge, NonFiniteValues.ALLOW)).getMessage());
    }

    @Test
    @DisplayName("a file that is not UTF-8 names the line of the first bad byte")
    void notUtf8() throws IOException {
        byte[] head = "x,y\n1,2\n".getBytes(StandardCharsets.US_ASCII);
        byte[] bytes = new byte[head.length + 5];
        System.arraycopy(head, 0, bytes, 0, head.length);
        bytes[head.length] = '3';
        bytes[head.length + 1] = ',';
        bytes[head.length + 2] = (byte) 0xB5; // µ in ISO-8859-1, a stray continuation byte in UTF-8
        bytes[head.length + 3] = '4';
        bytes[head.length + 4] = '\n';
        Path data = Files.write(folder.resolve("latin1.csv"), bytes);
        assertEquals(data + " line 3: not UTF-8 text (byte 11 of the file); save the file as UTF-8",
                refused(data).getMessage());
    }

    @Test
    @DisplayName("an unterminated quote names the line where the field began")
    void unterminatedQuote() throws IOException {
        Path data = file("quote.csv", "x,y\n1,2\n\n\"3,4\n5,6\n");
        DataException e = refused(data);
        assertEquals(4, e.line(), e.getMessage());
        assertEquals(data + " line 4: malformed CSV: a quoted value is not closed before the end of the file",
                e.getMessage());
    }
}
