package org.skerry.cli.scaling;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Every column of scaling.csv is snake_case and explained, in summary.md and in the README alike. */
class ScalingColumnsDocumentedTest {

    @TempDir
    Path dir;

    @Test
    @DisplayName("scaling.csv: every column snake_case and in the column table; the README holds that table verbatim")
    void columnsDocumented() throws Exception {
        Files.writeString(dir.resolve("base.conf"), String.join("\n", "name = tiny",
                "model { name = costly-normal, settings { dimension = 2, cost-micros = 0 } }", ""));
        Files.writeString(dir.resolve("study.conf"), "base = base.conf\naxes { cores = [1, 2] }\n");
        StudyFile study = StudyFile.load(dir.resolve("study.conf"));
        List<String> columns = new ScalingTable(study, List.of()).columns();
        for (String column : columns) {
            assertTrue(column.matches("[a-z][a-z0-9_]*"), "snake_case: " + column);
            assertTrue(ScalingSummary.COLUMNS.contains("`" + column + "`"), "explained: " + column);
        }
        String readme = Files.readString(Path.of("..", "README.md"));
        for (String row : ScalingSummary.COLUMNS.split("\n")) {
            assertTrue(readme.contains(row + "\n"), "README's scaling.csv table lacks: " + row);
        }
    }
}
