package org.skerry.cli.data;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

class DataTableTest {

    private static final String SOURCE = "run.conf, data.inline";

    @Test
    @DisplayName("inline rows become columns; the table does not share the caller's arrays")
    void fromRows() {
        double[] first = {1, 10};
        List<double[]> rows = new ArrayList<>(List.of(first, new double[] {2, 20}, new double[] {3, 30}));
        DataTable table = DataTable.fromRows(SOURCE, List.of("t", "y"), rows, new int[] {12, 13, 15});
        first[0] = 99;
        rows.clear();
        assertEquals(List.of("t", "y"), table.columns());
        assertEquals(3, table.rowCount());
        assertArrayEquals(new double[] {1, 2, 3}, table.column("t"));
        table.column("y")[0] = -1;
        assertArrayEquals(new double[] {10, 20, 30}, table.column("y"));
        assertEquals(15, table.lineOf(2));
        assertEquals(SOURCE + " line 13", table.where(1));
        assertTrue(table.hasColumn("y"));
        assertFalse(table.hasColumn("z"));
        assertThrows(UnsupportedOperationException.class, () -> table.columns().add("z"));
        assertThrows(IndexOutOfBoundsException.class, () -> table.lineOf(3));
    }

    @Test
    @DisplayName("without lines, rows are named by number")
    void withoutLines() {
        DataTable table = DataTable.fromRows(SOURCE, List.of("y"), List.of(new double[] {1}, new double[] {2}));
        assertEquals(-1, table.lineOf(1));
        assertEquals(SOURCE + " row 2", table.where(1));
    }

    @Test
    @DisplayName("an unknown column is named, with the columns there are")
    void unknownColumn() {
        DataTable table = DataTable.fromRows(SOURCE, List.of("day", "chl"), List.<double[]>of(new double[] {1, 2}));
        DataException e = assertThrows(DataException.class, () -> table.column("depth"));
        assertEquals(SOURCE + ": no column named 'depth'; the columns are day, chl", e.getMessage());
    }

    @Test
    @DisplayName("bad inline rows are refused naming row or line, and column")
    void badRows() {
        List<String> columns = List.of("a", "b");
        assertEquals(SOURCE + ": row 2: expected 2 values (a, b), found 3", assertThrows(DataException.class,
                () -> DataTable.fromRows(SOURCE, columns, List.of(new double[] {1, 2}, new double[] {1, 2, 3})))
                .getMessage());
        DataException nan = assertThrows(DataException.class,
                () -> DataTable.fromRows(SOURCE, columns, List.of(new double[] {1, Double.NaN}), new int[] {7}));
        assertEquals(SOURCE + " line 7, column b: NaN is not finite", nan.getMessage());
        assertEquals(7, nan.line());
        assertEquals("b", nan.column());
        assertEquals(SOURCE + " column a: column name 'a' appears twice (columns 1 and 2)",
                assertThrows(DataException.class, () -> DataTable.fromRows(SOURCE, List.of("a", "a"),
                        List.<double[]>of(new double[] {1, 2}))).getMessage());
        assertEquals(SOURCE + ": no data rows",
                assertThrows(DataException.class, () -> DataTable.fromRows(SOURCE, columns, List.of())).getMessage());
        assertEquals(SOURCE + ": no columns",
                assertThrows(DataException.class, () -> DataTable.fromRows(SOURCE, List.of(), List.of())).getMessage());
    }
}
