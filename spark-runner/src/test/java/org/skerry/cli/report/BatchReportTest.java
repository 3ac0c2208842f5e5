package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.output.JsonTree;
import org.skerry.engine.Slow;

/**
 * A batch's report, made by {@code skerry batch} itself at the end of a small batch with one
 * dataset that fails (a field that is not a number): the page parsed with jsoup stays inside the
 * batch folder and links to each run's report, its tables hold the numbers of batch-summary.json
 * and each run's summary.json, the failures are shown with the reasons of their failure.txt, the
 * side-by-side fits plot the data file's values, and every figure decodes or parses.
 */
@Slow
class BatchReportTest {

    @TempDir
    static Path root;

    static Path batch;

    /** The two good datasets' values, in file order (synthetic). */
    static final Map<String, double[]> DATA = Map.of("site-a", new double[] {1.2, 0.7, 2.5, 1.9},
            "site-b", new double[] {-0.3, 0.1, -1.0, 0.4, 0.2});

    @BeforeAll
    static void runBatch() throws IOException {
        Path data = Files.createDirectories(root.resolve("data"));
        for (Map.Entry<String, double[]> e : DATA.entrySet()) {
            StringBuilder csv = new StringBuilder("# synthetic test data\ny\n");
            for (double v : e.getValue()) {
                csv.append(v).append('\n');
            }
            Files.writeString(data.resolve(e.getKey() + ".csv"), csv.toString());
        }
        Files.writeString(data.resolve("broken.csv"), "# synthetic test data\ny\n1.0\nabc\n");
        Files.writeString(root.resolve("base.conf"), String.join("\n",
                "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0.5, sd = 3 } } }",
                "sampler { particles = 150 }", "backend { kind = threads, threads = 2 }", "output.progress = off", ""));
        Path file = Files.writeString(root.resolve("batch.conf"), String.join("\n", "base = base.conf",
                "datasets.files = [data/site-a.csv, data/broken.csv, data/site-b.csv]",
                "variants = [ { name = wide }, { name = narrow, settings { model.settings.prior.sd = 0.5 } } ]",
                "seed = 7", "concurrent = 2", "progress = off", ""));
        batch = root.resolve("batch");
        CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", batch.toString());
        assertEquals(ExitCodes.SOME_FAILED, result.exitCode(), result.err());
        assertTrue(result.out().contains("report: " + batch.resolve("report").resolve("index.html")), result.out());
    }

    @SuppressWarnings("unchecked")
    private static List<Map<String, Object>> analyses() throws IOException {
        return (List<Map<String, Object>>) JsonTree.read(batch.resolve("batch-summary.json")).get("analyses");
    }

    private static double json(Map<String, Object> object, String key) {
        Object value = object.get(key);
        return value == null ? Double.NaN : ((Number) value).doubleValue();
    }

    @Test
    @DisplayName("every image and link resolves inside the batch folder, no network address; each succeeded "
            + "analysis's row links to its run's report, which exists")
    void offlineAndLinked() throws Exception {
        ReportPages.assertOffline(batch);
        Document page = ReportPages.page(batch);
        List<Element> links = page.select("#analyses-table a.run-report");
        assertEquals(4, links.size(), "four analyses succeeded");
        for (Element link : links) {
            Element row = link.closest("tr");
            Path target = batch.resolve("report").resolve(link.attr("href")).normalize();
            assertEquals(batch.resolve(row.attr("data-dataset")).resolve(row.attr("data-variant"))
                    .resolve("report/index.html").normalize(), target);
            assertTrue(Files.readString(target).contains("<h1>Run report"), target.toString());
        }
        int[] counts = ReportPages.assertFiguresRead(batch);
        // Bayes factors, two side-by-side fits (site-a, site-b), one forest plot (mu).
        assertEquals(4, counts[0]);
    }

    @Test
    @DisplayName("the analyses table holds batch-summary.json's numbers exactly (data-value), row by row")
    void analysesTable() throws IOException {
        List<Map<String, Object>> expected = analyses();
        List<Element> rows = ReportPages.page(batch).select("#analyses-table tbody tr");
        assertEquals(expected.size(), rows.size());
        for (int i = 0; i < rows.size(); i++) {
            Element row = rows.get(i);
            Map<String, Object> a = expected.get(i);
            assertEquals(a.get("dataset"), row.attr("data-dataset"));
            assertEquals(a.get("variant"), row.attr("data-variant"));
            assertEquals(a.get("status"), row.attr("data-status"));
            for (String key : List.of("log_evidence", "log_evidence_error", "log_bayes_factor",
                    "log_bayes_factor_error", "iterations", "likelihood_evaluations")) {
                double shown = ReportPages.value(row.selectFirst("td[data-key=" + key + "]"));
                assertEquals(json(a, key), shown, 0.0, key + " of row " + i);
                if (!Double.isNaN(shown) && !key.equals("iterations") && !key.equals("likelihood_evaluations")) {
                    // Four significant digits on screen (Readable): within half a unit of the fourth.
                    double text = Double.parseDouble(row.selectFirst("td[data-key=" + key + "]").text());
                    assertEquals(shown, text, Math.abs(shown) * 5e-4, key);
                }
            }
        }
        // Two variants on two good datasets: two Bayes factors, none for the failed dataset.
        assertEquals(2, expected.stream().filter(a -> a.get("log_bayes_factor") != null).count());
    }

    @Test
    @DisplayName("the failed analyses still render: marked failed, their reason from failure.txt in the table "
            + "and in the warnings, empty rows in the forest plot")
    void failureShown() throws IOException {
        Document page = ReportPages.page(batch);
        List<Element> failed = page.select("#analyses-table tr.failed");
        assertEquals(2, failed.size(), "broken under both variants");
        for (Element row : failed) {
            assertEquals("broken", row.attr("data-dataset"));
            String reason = Files.readString(batch.resolve("broken").resolve(row.attr("data-variant"))
                    .resolve("failure.txt")).strip();
            assertTrue(reason.contains("broken.csv") && reason.contains("line 4"), reason);
            assertEquals(reason, row.selectFirst("td.reason").text());
            assertTrue(page.select("#warnings li.warning").eachText().stream()
                    .anyMatch(w -> w.contains("broken/" + row.attr("data-variant") + " failed") && w.contains(reason)));
        }
        for (Element table : page.select("table.forest-table")) {
            assertEquals("failed", table.selectFirst("tr[data-dataset=broken] td").text());
        }
    }

    @Test
    @DisplayName("each forest table and its SVG hold every run's summary.json: mean, median, 2.5 % and 97.5 %")
    void forestAgainstSummaries() throws Exception {
        Document page = ReportPages.page(batch);
        List<Element> tables = page.select("table.forest-table");
        assertEquals(1, tables.size(), "normal-mean has one parameter");
        Element table = tables.get(0);
        String parameter = table.attr("data-parameter");
        assertEquals("mu", parameter);
        org.w3c.dom.Element svg = ReportPages.svg(batch.resolve("report/forest-01-mu.svg"));
        List<Map<String, Object>> expected = analyses();
        List<String> keys = List.of("mean", "q50", "q2_5", "q97_5");
        List<double[]> fromSvg = new ArrayList<>();
        for (String attribute : List.of("data-mean", "data-q50", "data-q2-5", "data-q97-5")) {
            fromSvg.add(ReportPages.numbers(svg.getAttribute(attribute)));
        }
        for (int i = 0; i < expected.size(); i++) {
            Map<String, Object> a = expected.get(i);
            Element row = table.select("tbody tr").get(i);
            assertEquals(a.get("dataset") + "/" + a.get("variant"), row.attr("data-dataset") + "/" + row.attr("data-variant"));
            if (!"succeeded".equals(a.get("status"))) {
                for (double[] column : fromSvg) {
                    assertTrue(Double.isNaN(column[i]), "no value for a failed analysis");
                }
                continue;
            }
            @SuppressWarnings("unchecked")
            Map<String, Object> mu = (Map<String, Object>) ((Map<String, Object>) JsonTree.read(
                    batch.resolve((String) a.get("folder")).resolve("summary.json")).get("parameters")).get(parameter);
            for (int k = 0; k < keys.size(); k++) {
                double value = ((Number) mu.get(keys.get(k))).doubleValue();
                assertEquals(value, ReportPages.value(row.selectFirst("td[data-key=" + keys.get(k) + "]")), 0.0);
                assertEquals(value, fromSvg.get(k)[i], 0.0, keys.get(k) + " in the SVG");
            }
        }
    }

    @Test
    @DisplayName("the Bayes-factor figure holds batch-summary.json's factors and errors; its zone is ± 2 errors")
    void bayesFactorFigure() throws Exception {
        org.w3c.dom.Element svg = ReportPages.svg(batch.resolve("report/bayes-factors.svg"));
        assertEquals("wide", svg.getAttribute("data-reference"));
        List<Map<String, Object>> withFactor = analyses().stream().filter(a -> a.get("log_bayes_factor") != null).toList();
        assertEquals(withFactor.stream().map(a -> a.get("dataset") + "/" + a.get("variant")).toList(),
                List.of(svg.getAttribute("data-analyses").split(" ")));
        assertArrayEquals(withFactor.stream().mapToDouble(a -> json(a, "log_bayes_factor")).toArray(),
                ReportPages.numbers(svg.getAttribute("data-log-bayes-factor")), 0.0);
        assertArrayEquals(withFactor.stream().mapToDouble(a -> json(a, "log_bayes_factor_error")).toArray(),
                ReportPages.numbers(svg.getAttribute("data-error")), 0.0);
        assertArrayEquals(new double[] {2.0}, ReportPages.numbers(svg.getAttribute("data-zone-errors")), 0.0);
        assertTrue(ReportPages.page(batch).selectFirst("#bayes-factors").text().contains("not a preference"));
    }

    @Test
    @DisplayName("side-by-side fits: every panel's points are its data file's values, and its predictive is the "
            + "one of that variant's own run report (same draws)")
    void fitsSideBySide() throws Exception {
        for (Map.Entry<String, double[]> dataset : DATA.entrySet()) {
            Path file;
            try (Stream<Path> files = Files.list(batch.resolve("report"))) {
                file = files.filter(p -> p.getFileName().toString().matches("fits-\\d\\d-" + dataset.getKey() + "\\.svg"))
                        .findFirst().orElse(null);
            }
            assertNotNull(file, "fit figure of " + dataset.getKey());
            org.w3c.dom.Element svg = ReportPages.svg(file);
            List<String> variants = List.of(svg.getAttribute("data-variants").split(" "));
            assertEquals(List.of("wide", "narrow"), variants);
            for (int k = 0; k < variants.size(); k++) {
                String prefix = "data-panel-" + (k + 1) + "-";
                assertArrayEquals(dataset.getValue(), ReportPages.numbers(svg.getAttribute(prefix + "observed")), 0.0,
                        "the points are the data file's values, in its order");
                org.w3c.dom.Element single = ReportPages.svg(batch.resolve(dataset.getKey()).resolve(variants.get(k))
                        .resolve("report/fit-data.svg"));
                for (String key : List.of("positions", "predictive-mean", "predictive-sd", "q2-5", "q97-5")) {
                    assertEquals(single.getAttribute("data-" + key), svg.getAttribute(prefix + key), key);
                }
            }
        }
    }

    @Test
    @DisplayName("skerry report on the batch folder makes a missing run report again and gives the same page")
    void reportCommandRemakesRunReports() throws IOException {
        String before = Files.readString(batch.resolve("report/index.html"));
        Path runReport = batch.resolve("site-b/narrow/report");
        try (Stream<Path> files = Files.walk(runReport)) {
            for (Path p : files.sorted(Comparator.reverseOrder()).toList()) {
                Files.delete(p);
            }
        }
        CommandRunner.Result result = CommandRunner.run("report", batch.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(Files.isRegularFile(runReport.resolve("index.html")));
        assertEquals(before, Files.readString(batch.resolve("report/index.html")));
        assertFalse(result.err().contains("Exception"), result.err());
    }
}
