package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.jsoup.nodes.Element;
import org.skerry.cli.output.JsonTree;
import org.skerry.cli.report.ReportPages;
import org.skerry.engine.Slow;

/** The demo through the real program, in a separate JVM, at small N. */
class DemoEndToEndTest {

    private static final Path DEMO = Path.of("..", "conf", "demo").toAbsolutePath().normalize();
    private static final String[] FILES = {"summary.json", "timing.json", "iterations.csv", "particles.csv", "run.conf"};

    @TempDir
    Path folder;

    private static Process start(Path log, String... args) throws IOException {
        return ProgramProcess.start(log, args);
    }

    @Test
    @Slow
    @DisplayName("skerry demo at small N: both run folders hold all five files, the Bayes factor is printed, and "
            + "the comparison report shows both variants' fits with the data file's values as points")
    void demoWritesEverything() throws Exception {
        Path out = folder.resolve("demo");
        Path log = folder.resolve("log.txt");
        Process process = start(log, "demo", "--demo-folder", DEMO.toString(), "--out", out.toString(),
                "--set", "sampler.particles=60", "--set", "sampler.moves.max-steps=3");
        assertTrue(process.waitFor(170, TimeUnit.SECONDS), "demo finished in time");
        String text = Files.readString(log);
        assertEquals(ExitCodes.SUCCESS, process.exitValue(), text);
        for (String run : new String[] {"buoy-07-saturating", "buoy-07-sigmoidal"}) {
            for (String file : FILES) {
                assertTrue(Files.size(out.resolve(run).resolve(file)) > 0, run + "/" + file);
            }
        }
        assertTrue(text.contains("log Bayes factor, sigmoidal vs saturating"), text);
        assertTrue(text.contains("synthetic"), "the demo says its data are synthetic");
        comparisonReport(out, text);
    }

    /**
     * The demo's comparison report: printed, offline, every figure readable, the two grazing
     * variants' fits side by side with the data file's chlorophyll series as their points, and the
     * Bayes factor of the comparison's summary in its table.
     */
    private static void comparisonReport(Path out, String log) throws Exception {
        Path page = out.resolve("report").resolve("index.html");
        assertTrue(log.contains("report: " + page), log);
        ReportPages.assertOffline(out);
        ReportPages.assertFiguresRead(out);
        assertTrue(ReportPages.page(out).title().startsWith("Comparison report"));
        org.w3c.dom.Element svg = ReportPages.svg(out.resolve("report").resolve("fits-01-buoy-07.svg"));
        assertEquals("saturating sigmoidal", svg.getAttribute("data-variants"));
        List<double[]> rows = new ArrayList<>();
        for (String line : Files.readAllLines(DEMO.resolve("data").resolve("buoy-07.csv"))) {
            if (!line.startsWith("#") && !line.startsWith("day")) {
                String[] fields = line.split(",");
                rows.add(new double[] {Double.parseDouble(fields[0]), Double.parseDouble(fields[1])});
            }
        }
        for (int panel = 1; panel <= 2; panel++) {
            String prefix = "data-panel-" + panel + "-";
            assertArrayEquals(rows.stream().mapToDouble(r -> r[0]).toArray(),
                    ReportPages.numbers(svg.getAttribute(prefix + "positions")), 0.0, "days of the data file");
            assertArrayEquals(rows.stream().mapToDouble(r -> r[1]).toArray(),
                    ReportPages.numbers(svg.getAttribute(prefix + "observed")), 0.0, "chlorophyll of the data file");
        }
        Map<String, Object> summary = JsonTree.read(out.resolve("batch-summary.json"));
        @SuppressWarnings("unchecked")
        Map<String, Object> sigmoidal = ((List<Map<String, Object>>) summary.get("analyses")).get(1);
        assertEquals("sigmoidal", sigmoidal.get("variant"));
        Element cell = ReportPages.page(out).selectFirst("tr[data-variant=sigmoidal] td[data-key=log_bayes_factor]");
        assertEquals(((Number) sigmoidal.get("log_bayes_factor")).doubleValue(), ReportPages.value(cell), 0.0);
    }

    @Test
    @Slow
    @DisplayName("the program's exit code for bad input is 2, from a separate JVM too")
    void exitCodeFromProcess() throws Exception {
        Path log = folder.resolve("log.txt");
        Process process = start(log, "run", folder.resolve("missing.conf").toString());
        assertTrue(process.waitFor(60, TimeUnit.SECONDS));
        assertEquals(ExitCodes.BAD_INPUT, process.exitValue(), Files.readString(log));
    }

    @Test
    @DisplayName("every demo data file says it is synthetic")
    void dataSaysSynthetic() throws IOException {
        try (var files = Files.list(DEMO.resolve("data"))) {
            List<Path> csv = files.filter(p -> p.toString().endsWith(".csv")).toList();
            assertEquals(13, csv.size(), "twelve buoys and the north basin's net tows: " + csv);
            for (Path file : csv) {
                assertTrue(Files.readAllLines(file).get(0).toLowerCase().contains("synthetic"), file.toString());
            }
        }
    }

    @Test
    @DisplayName("generate-demo-data reproduces the committed demo data (values compared after parsing)")
    void committedDataRegenerate() throws IOException {
        Path out = folder.resolve("data");
        CommandRunner.Result result = CommandRunner.run("generate-demo-data", "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        try (var files = Files.list(DEMO.resolve("data"))) {
            for (Path committed : files.filter(p -> p.toString().endsWith(".csv")).toList()) {
                List<String> expected = Files.readAllLines(committed);
                List<String> actual = Files.readAllLines(out.resolve(committed.getFileName()));
                assertEquals(expected.size(), actual.size(), committed.toString());
                for (int i = 0; i < expected.size(); i++) {
                    if (expected.get(i).startsWith("#") || i == 2) {
                        assertEquals(expected.get(i), actual.get(i));
                        continue;
                    }
                    String[] a = expected.get(i).split(",");
                    String[] b = actual.get(i).split(",");
                    for (int k = 0; k < a.length; k++) {
                        assertEquals(Double.parseDouble(a[k]), Double.parseDouble(b[k]), 0.0, committed + " line " + (i + 1));
                    }
                }
            }
        }
    }
}
