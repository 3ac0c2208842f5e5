package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.apache.commons.math3.stat.descriptive.rank.Median;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;

/**
 * A scaling study's report, made by {@code skerry scale} at the end of a tiny study (thread
 * backend, 1 and 2 cores, two repeats, the synthetic costly-normal model at no cost): the page
 * stays inside the study folder, its tables hold scaling.csv's numbers (medians computed here with
 * Commons Math), and every figure decodes or parses.
 */
@Slow
class StudyReportTest {

    @TempDir
    static Path root;

    static Path study;

    @BeforeAll
    static void runStudy() throws IOException {
        Files.writeString(root.resolve("base.conf"), String.join("\n", "name = tiny",
                "model { name = costly-normal, settings { dimension = 2, cost-micros = 0 } }",
                "sampler { particles = 120, seed = 5, tempering { rule = fixed, schedule = [0.3, 1.0] }, moves.steps = 1 }",
                "backend { kind = threads }", ""));
        Path file = Files.writeString(root.resolve("tiny-study.conf"), String.join("\n", "base = base.conf",
                "repeats = 2", "warm-up = false", "axes { cores = [1, 2] }", ""));
        study = root.resolve("study");
        CommandRunner.Result result = CommandRunner.run("scale", file.toString(), "--out", study.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("report: " + study.resolve("report").resolve("index.html")), result.out());
    }

    private static List<CSVRecord> table() throws IOException {
        try (Reader in = Files.newBufferedReader(study.resolve("scaling.csv"));
                CSVParser parser = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get().parse(in)) {
            return parser.getRecords();
        }
    }

    @Test
    @DisplayName("every image and link resolves inside the study folder (run reports, scaling.csv); figures read")
    void offline() throws Exception {
        List<Element> addressed = ReportPages.assertOffline(study);
        assertTrue(addressed.stream().anyMatch(e -> e.attr("href").equals("../scaling.csv")));
        assertEquals(4, ReportPages.page(study).select("#runs-table a.run-report").size(), "each run's own report");
        assertEquals(3, ReportPages.assertFiguresRead(study)[0], "speed-up, efficiency, phases");
    }

    @Test
    @DisplayName("the runs table holds scaling.csv's numbers exactly, row by row")
    void runsTable() throws IOException {
        List<CSVRecord> rows = table();
        List<Element> shown = ReportPages.page(study).select("#runs-table tbody tr");
        assertEquals(rows.size(), shown.size());
        for (int i = 0; i < rows.size(); i++) {
            assertEquals(rows.get(i).get("point"), shown.get(i).attr("data-point"));
            assertEquals(rows.get(i).get("repeat"), shown.get(i).attr("data-repeat"));
            for (String key : List.of("wall_seconds", "loop_seconds", "speedup", "efficiency", "load_average")) {
                assertEquals(Double.parseDouble(rows.get(i).get(key)),
                        ReportPages.value(shown.get(i).selectFirst("td[data-key=" + key + "]")), 0.0, key);
            }
        }
    }

    @Test
    @DisplayName("the points table and the speed-up figure hold the medians over repeats (Commons Math's Median)")
    void pointMedians() throws Exception {
        Map<String, List<CSVRecord>> byPoint = new LinkedHashMap<>();
        for (CSVRecord r : table()) {
            byPoint.computeIfAbsent(r.get("point"), p -> new ArrayList<>()).add(r);
        }
        Document page = ReportPages.page(study);
        List<Double> speedups = new ArrayList<>();
        for (Map.Entry<String, List<CSVRecord>> point : byPoint.entrySet()) {
            Element row = page.selectFirst("#points-table tr[data-point='" + point.getKey() + "']");
            for (String key : List.of("loop_seconds", "speedup", "efficiency", "evaluations_per_second")) {
                double[] values = point.getValue().stream().mapToDouble(r -> Double.parseDouble(r.get(key))).toArray();
                double median = new Median().evaluate(values);
                Element cell = row.selectFirst("td[data-key=" + key + "]");
                assertEquals(median, ReportPages.value(cell), 1e-12 * Math.abs(median), key + " of " + point.getKey());
                assertEquals(java.util.Arrays.stream(values).min().getAsDouble(), Double.parseDouble(cell.attr("data-min")), 0.0);
                assertEquals(java.util.Arrays.stream(values).max().getAsDouble(), Double.parseDouble(cell.attr("data-max")), 0.0);
                if (key.equals("speedup")) {
                    speedups.add(median);
                }
            }
        }
        org.w3c.dom.Element svg = ReportPages.svg(study.resolve("report/speedup.svg"));
        assertArrayEquals(new double[] {1, 2}, ReportPages.numbers(svg.getAttribute("data-cores")), 0.0);
        assertArrayEquals(speedups.stream().mapToDouble(Double::doubleValue).toArray(),
                ReportPages.numbers(svg.getAttribute("data-median")), 1e-12);
        assertEquals(1.0, speedups.get(0), 0.0, "the baseline's speed-up is 1 by definition");
    }
}
