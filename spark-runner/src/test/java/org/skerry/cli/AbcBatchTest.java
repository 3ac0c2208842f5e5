package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Reader;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.JsonTree;
import org.skerry.cli.report.ReportPages;
import org.skerry.engine.Slow;

/**
 * {@code skerry batch} and {@code skerry scale} over ABC runs: batch-summary's
 * {@code final_tolerance} and {@code simulations} against each run's {@code summary.json}, no
 * evidence or Bayes factor, a batch report that never shows an ABC run's missing evidence as a
 * likelihood evidence (Robert, Cornuet, Marin &amp; Pillai 2011, PNAS 108(37)), an analysis's
 * run file alone giving the same bytes on Spark, and a scaling study whose runs agree byte for byte.
 * Data synthetic.
 */
@Slow
@SuppressWarnings("unchecked")
class AbcBatchTest {

    @TempDir
    static Path root;

    static Path batch;

    @BeforeAll
    static void runBatch() throws IOException {
        Path data = Files.createDirectories(root.resolve("data"));
        Files.writeString(data.resolve("pond-a.csv"), "# synthetic test data\ny\n1.2\n0.7\n2.5\n1.9\n");
        Files.writeString(data.resolve("pond-b.csv"), "# synthetic test data\ny\n-0.3\n0.1\n-1.0\n0.4\n0.2\n");
        Files.writeString(root.resolve("base.conf"), String.join("\n",
                "model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }",
                "sampler { particles = 200, sequence = abc",
                "  abc { final-tolerance = 0.1, distance-weights { mean = 1 } } }",
                "backend { kind = threads, threads = 2 }", "output.progress = off", ""));
        Path file = Files.writeString(root.resolve("batch.conf"), String.join("\n", "base = base.conf",
                "datasets.files = [data/pond-a.csv, data/pond-b.csv]",
                "variants = [ { name = wide }, { name = narrow, settings { model.settings.prior.sd = 1 } } ]",
                "seed = 11", "concurrent = 2", "progress = off", ""));
        batch = root.resolve("batch");
        CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", batch.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
    }

    private static List<CSVRecord> csv(Path file) throws IOException {
        try (Reader in = Files.newBufferedReader(file);
                CSVParser parser = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get().parse(in)) {
            return parser.getRecords();
        }
    }

    @Test
    @DisplayName("batch-summary.csv and .json: final_tolerance and simulations as in each run's summary.json; "
            + "evidence and Bayes factor empty")
    void summaryColumns() throws IOException {
        List<CSVRecord> rows = csv(batch.resolve("batch-summary.csv"));
        List<Map<String, Object>> analyses = (List<Map<String, Object>>) JsonTree.read(
                batch.resolve("batch-summary.json")).get("analyses");
        assertEquals(4, rows.size());
        for (int i = 0; i < rows.size(); i++) {
            CSVRecord row = rows.get(i);
            Map<String, Object> abc = (Map<String, Object>) JsonTree.read(
                    batch.resolve(row.get("folder")).resolve("summary.json")).get("abc");
            assertEquals(0.1, Double.parseDouble(row.get("final_tolerance")), 0.0, "reached: " + row);
            assertEquals(((Number) abc.get("final_tolerance")).doubleValue(),
                    Double.parseDouble(row.get("final_tolerance")), 0.0);
            assertEquals(((Number) abc.get("simulations")).longValue(), Long.parseLong(row.get("simulations")));
            for (String column : List.of("log_evidence", "log_evidence_error", "log_bayes_factor",
                    "log_bayes_factor_error")) {
                assertEquals("", row.get(column), column + " of " + row);
                assertNull(analyses.get(i).get(column), column);
            }
            assertEquals(((Number) abc.get("simulations")).longValue(),
                    ((Number) analyses.get(i).get("simulations")).longValue());
            assertEquals(0.1, ((Number) analyses.get(i).get("final_tolerance")).doubleValue(), 0.0);
        }
    }

    @Test
    @DisplayName("the batch report: ABC tolerance and simulations in the table, evidence cells 'none (ABC)' and "
            + "never 'unreliable', an ABC warning per analysis citing Robert et al. 2011, no Bayes factor figure")
    void report() throws IOException {
        Document page = ReportPages.page(batch);
        List<Element> rows = page.select("#analyses-table tbody tr");
        assertEquals(4, rows.size());
        List<CSVRecord> expected = csv(batch.resolve("batch-summary.csv"));
        for (int i = 0; i < rows.size(); i++) {
            Element row = rows.get(i);
            assertEquals(Double.parseDouble(expected.get(i).get("final_tolerance")),
                    ReportPages.value(row.selectFirst("td[data-key=final_tolerance]")), 0.0);
            assertEquals(Double.parseDouble(expected.get(i).get("simulations")),
                    ReportPages.value(row.selectFirst("td[data-key=simulations]")), 0.0);
            for (String key : List.of("log_evidence", "log_evidence_error", "log_bayes_factor",
                    "log_bayes_factor_error")) {
                assertEquals("none (ABC)", row.selectFirst("td[data-key=" + key + "]").text(), key);
            }
        }
        assertFalse(page.select("#analyses-table").text().contains("unreliable"));
        List<Element> warnings = page.select("#warnings li");
        assertEquals(4, warnings.stream().filter(w -> w.text().contains("is an ABC run")
                && w.text().contains("Robert, Cornuet, Marin & Pillai 2011")).count(), warnings.toString());
        assertTrue(page.select("#bayes-factors figure").isEmpty(), "no Bayes factor figure");
        assertTrue(page.selectFirst("#bayes-factors").text().contains("ABC runs have none"));
    }

    @Test
    @DisplayName("an analysis's run.conf alone, on Spark local mode with 3 partitions: the batch's bytes")
    void sameBytesOnSpark() throws IOException {
        Path run = batch.resolve("pond-b/narrow");
        Path alone = root.resolve("alone");
        CommandRunner.Result result = CommandRunner.run("run", run.resolve("run.conf").toString(), "--out",
                alone.toString(), "--set", "backend.kind=spark", "--set", "backend.master=local[2]", "--set",
                "backend.partitions=3", "--set", "output.report=false");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(run.resolve(file)), Files.readAllBytes(alone.resolve(file)), file);
        }
    }

    @Test
    @DisplayName("skerry scale over an ABC run file (threads, 1 and 2 cores): both runs the same bytes, evaluations "
            + "as in their summary.json")
    void scale() throws Exception {
        Files.writeString(root.resolve("abc-base.conf"), Files.readString(root.resolve("base.conf"))
                + "data.inline { columns = [\"y\"], rows = [[0.4], [1.9], [1.1]] }\nsampler.seed = 3\n"
                + "output.report = false\n");
        Path study = Files.writeString(root.resolve("study.conf"), String.join("\n", "base = abc-base.conf",
                "repeats = 1", "warm-up = false", "axes { cores = [1, 2] }", ""));
        Path out = root.resolve("study");
        StringWriter stdout = new StringWriter();
        StringWriter stderr = new StringWriter();
        int code = SkerryCommand.execute(new String[] {"scale", study.toString(), "--out", out.toString()},
                new PrintWriter(stdout, true), new PrintWriter(stderr, true));
        assertEquals(ExitCodes.SUCCESS, code, stderr.toString());
        List<CSVRecord> rows = csv(out.resolve("scaling.csv"));
        assertEquals(2, rows.size());
        for (CSVRecord row : rows) {
            Map<String, Object> summary = JsonTree.read(out.resolve(row.get("run_folder")).resolve("summary.json"));
            assertEquals(((Number) summary.get("likelihood_evaluations")).longValue(),
                    Long.parseLong(row.get("evaluations")));
            assertEquals(0.1, ((Number) ((Map<String, Object>) summary.get("abc")).get("final_tolerance"))
                    .doubleValue(), 0.0);
        }
        assertArrayEquals(Files.readAllBytes(out.resolve(rows.get(0).get("run_folder")).resolve("summary.json")),
                Files.readAllBytes(out.resolve(rows.get(1).get("run_folder")).resolve("summary.json")));
    }
}
