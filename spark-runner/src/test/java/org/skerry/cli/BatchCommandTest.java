package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.stream.Stream;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.random.DerivedSeed;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/** {@code skerry batch}: closed-form evidences per row, a broken dataset, resuming, seeds. */
class BatchCommandTest {

    private static final double SIGMA = 2.0;
    private static final double PRIOR_MEAN = 0.5;
    private static final double WIDE_SD = 3.0;
    private static final double NARROW_SD = 0.5;

    @TempDir
    Path folder;

    private void dataset(String name, double[][] rows) throws IOException {
        StringBuilder csv = new StringBuilder("# synthetic test data\ny\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", row[0]));
        }
        Files.createDirectories(folder.resolve("data"));
        Files.writeString(folder.resolve("data").resolve(name + ".csv"), csv.toString());
    }

    private void base(String backend) throws IOException {
        Files.writeString(folder.resolve("base.conf"), String.join("\n",
                "model { name = normal-mean, settings { sigma = " + SIGMA + ", prior { mean = " + PRIOR_MEAN
                        + ", sd = " + WIDE_SD + " } } }",
                "sampler { particles = 400 }",
                backend,
                // Reports are BatchReportTest's subject; here they would only cost time (10 batches of 6 runs).
                "output.progress = off", "output.report = false", ""));
    }

    private Path batch(String... lines) throws IOException {
        return Files.writeString(folder.resolve("batch.conf"), String.join("\n", lines) + "\n");
    }

    private static final String TWO_VARIANTS = "variants = [ { name = wide }, { name = narrow, settings { "
            + "model.settings.prior.sd = " + NARROW_SD + " } } ]";

    private static List<CSVRecord> summary(Path batchFolder) throws IOException {
        try (Reader in = Files.newBufferedReader(batchFolder.resolve("batch-summary.csv"));
                CSVParser parser = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get().parse(in)) {
            return parser.getRecords();
        }
    }

    private static double number(CSVRecord r, String column) {
        return Double.parseDouble(r.get(column));
    }

    @Test
    @Slow
    @DisplayName("conjugate batch: every row's log evidence and each dataset's log Bayes factor match the closed form "
            + "(Bishop PRML eq. 2.115; BDA3 §2.5) within 4 standard errors over 10 batch seeds")
    void conjugateEvidencePerRow() throws IOException {
        Map<String, double[][]> data = new HashMap<>();
        data.put("site-a", SyntheticData.normalRows(41, 10, new double[] {1.0}, SIGMA));
        data.put("site-b", SyntheticData.normalRows(42, 20, new double[] {-0.5}, SIGMA));
        data.put("site-c", SyntheticData.normalRows(43, 40, new double[] {2.5}, SIGMA));
        for (Map.Entry<String, double[][]> e : data.entrySet()) {
            dataset(e.getKey(), e.getValue());
        }
        base("backend { kind = threads, threads = 2 }");
        int seeds = 10;
        Map<String, SummaryStatistics> logZ = new HashMap<>();
        Map<String, SummaryStatistics> logB = new HashMap<>();
        for (int s = 0; s < seeds; s++) {
            Path out = folder.resolve("batch-" + s);
            Path file = batch("base = base.conf", "datasets { folder = data, pattern = \"site-*.csv\" }", TWO_VARIANTS,
                    "concurrent = 3", "progress = off", "seed = " + (1000 + s));
            CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", out.toString());
            assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
            List<CSVRecord> rows = summary(out);
            assertEquals(6, rows.size(), "3 datasets x 2 variants");
            Map<String, CSVRecord> wide = new HashMap<>();
            for (CSVRecord r : rows) {
                assertEquals("succeeded", r.get("status"));
                logZ.computeIfAbsent(r.get("dataset") + "/" + r.get("variant"), k -> new SummaryStatistics())
                        .addValue(number(r, "log_evidence"));
                if (r.get("variant").equals("wide")) {
                    wide.put(r.get("dataset"), r);
                    assertEquals("", r.get("log_bayes_factor"), "the reference has no Bayes factor against itself");
                }
            }
            for (CSVRecord r : rows) {
                if (r.get("variant").equals("narrow")) {
                    CSVRecord ref = wide.get(r.get("dataset"));
                    double factor = number(r, "log_bayes_factor");
                    assertEquals(number(r, "log_evidence") - number(ref, "log_evidence"), factor, 0.0);
                    assertEquals(Math.hypot(number(r, "log_evidence_error"), number(ref, "log_evidence_error")),
                            number(r, "log_bayes_factor_error"), 1e-12);
                    logB.computeIfAbsent(r.get("dataset"), k -> new SummaryStatistics()).addValue(factor);
                }
            }
        }
        for (Map.Entry<String, double[][]> e : data.entrySet()) {
            double wideExact = new NormalMeanExact(e.getValue(), SIGMA, PRIOR_MEAN, WIDE_SD).logEvidence();
            double narrowExact = new NormalMeanExact(e.getValue(), SIGMA, PRIOR_MEAN, NARROW_SD).logEvidence();
            SummaryStatistics w = logZ.get(e.getKey() + "/wide");
            SummaryStatistics n = logZ.get(e.getKey() + "/narrow");
            // log Z-hat is biased low by about Var/2; tolerance: 4 standard errors over the seeds.
            checkWithin(e.getKey() + "/wide", wideExact, w.getMean() + 0.5 * w.getVariance(), w, seeds);
            checkWithin(e.getKey() + "/narrow", narrowExact, n.getMean() + 0.5 * n.getVariance(), n, seeds);
            SummaryStatistics b = logB.get(e.getKey());
            checkWithin(e.getKey() + " log B", narrowExact - wideExact,
                    b.getMean() + 0.5 * n.getVariance() - 0.5 * w.getVariance(), b, seeds);
        }
    }

    private static void checkWithin(String what, double exact, double estimate, SummaryStatistics replicates, int seeds) {
        double error = 4 * replicates.getStandardDeviation() / Math.sqrt(seeds);
        assertEquals(exact, estimate, error, what + ": bias-corrected mean over " + seeds + " seeds; 4 SE = " + error);
    }

    @Test
    @Slow
    @DisplayName("Spark batch with a broken dataset: the others succeed, exit code 3, the broken one reported; "
            + "each analysis's run.conf alone gives the same bytes, on Spark and on threads")
    void brokenDatasetAndSingleRuns() throws IOException {
        dataset("good-1", SyntheticData.normalRows(51, 12, new double[] {0.3}, SIGMA));
        dataset("good-2", SyntheticData.normalRows(52, 12, new double[] {1.3}, SIGMA));
        Files.writeString(folder.resolve("data/broken.csv"), "# synthetic test data\ny\n1.0\nabc\n2.0\n");
        base("backend { kind = spark, master = \"local[2]\", partitions = 3 }");
        Path file = batch("base = base.conf", "datasets.files = [data/good-1.csv, data/broken.csv, data/good-2.csv]",
                "seed = 77", "concurrent = 3", "progress = log");
        Path out = folder.resolve("batch");
        CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SOME_FAILED, result.exitCode(), result.err());
        assertTrue(result.err().contains("analyses: 2 done, 0 running, 1 failed, 0 waiting"), result.err());
        List<CSVRecord> rows = summary(out);
        assertEquals(List.of("good-1", "broken", "good-2"), rows.stream().map(r -> r.get("dataset")).toList());
        assertEquals(List.of("succeeded", "failed", "succeeded"), rows.stream().map(r -> r.get("status")).toList());
        String message = rows.get(1).get("message");
        assertTrue(message.contains("broken.csv") && message.contains("line 4"), message);
        assertEquals("", rows.get(1).get("log_evidence"));
        assertTrue(Files.readString(out.resolve("broken/base/failure.txt")).contains("broken.csv"));
        assertFalse(Files.exists(out.resolve("broken/base/summary.json")));
        assertTrue(result.out().contains("broken/base: bad input"), result.out());

        for (String name : List.of("good-1", "good-2")) {
            Path run = out.resolve(name).resolve("base");
            long seed = DerivedSeed.of(77, name, "base");
            assertEquals(Long.toString(seed), rows.get(name.equals("good-1") ? 0 : 2).get("seed"));
            assertEquals(seed, org.skerry.cli.output.JsonTree.read(run.resolve("summary.json")).get("seed"));
            Path alone = folder.resolve("alone-" + name);
            CommandRunner.Result single = CommandRunner.run("run", run.resolve("run.conf").toString(), "--out",
                    alone.toString());
            assertEquals(ExitCodes.SUCCESS, single.exitCode(), single.err());
            Path threads = folder.resolve("threads-" + name);
            assertEquals(ExitCodes.SUCCESS, CommandRunner.run("run", run.resolve("run.conf").toString(), "--out",
                    threads.toString(), "--set", "backend.kind=threads").exitCode());
            for (String f : List.of("summary.json", "particles.csv")) {
                assertArrayEquals(Files.readAllBytes(run.resolve(f)), Files.readAllBytes(alone.resolve(f)), name + " " + f);
                assertArrayEquals(Files.readAllBytes(run.resolve(f)), Files.readAllBytes(threads.resolve(f)), name + " " + f);
            }
        }
    }

    @Test
    @DisplayName("a variant whose every weight becomes zero fails on each dataset; the reference variant's "
            + "analyses succeed; exit code 3")
    void zeroWeightsFailOnlyTheirAnalyses() throws IOException {
        dataset("pond-1", SyntheticData.normalRows(81, 6, new double[] {0.0}, SIGMA));
        dataset("pond-2", SyntheticData.normalRows(82, 6, new double[] {1.0}, SIGMA));
        base("backend { kind = threads, threads = 2 }");
        Path file = batch("base = base.conf", "datasets { folder = data }",
                "variants = [ { name = plain }, { name = impossible, settings { model { name = null, "
                        + "class = \"" + ImpossibleModel.class.getName() + "\", settings = {} } } } ]",
                "concurrent = 2", "progress = off");
        Path out = folder.resolve("batch");
        CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SOME_FAILED, result.exitCode(), result.err());
        List<CSVRecord> rows = summary(out);
        assertEquals(List.of("succeeded", "failed", "succeeded", "failed"), rows.stream().map(r -> r.get("status")).toList());
        for (CSVRecord r : rows) {
            if (r.get("variant").equals("impossible")) {
                assertTrue(r.get("message").startsWith("the run failed at"), r.get("message"));
                assertEquals("", r.get("log_bayes_factor"), "no Bayes factor without an evidence");
                Path run = out.resolve(r.get("folder"));
                assertTrue(Files.isRegularFile(run.resolve("run.conf")), "the run folder keeps what it wrote");
                assertTrue(Files.isRegularFile(run.resolve("failure.txt")));
                assertFalse(Files.exists(run.resolve("summary.json")));
            }
        }
    }

    @Test
    @Slow
    @DisplayName("a resumed batch keeps finished analyses, re-runs the rest, and equals an uninterrupted one byte for "
            + "byte; a changed setting is refused, naming it")
    void resume() throws IOException {
        dataset("lake-1", SyntheticData.normalRows(61, 8, new double[] {0.0}, SIGMA));
        dataset("lake-2", SyntheticData.normalRows(62, 8, new double[] {2.0}, SIGMA));
        base("backend { kind = threads, threads = 2 }");
        Path file = batch("base = base.conf", "datasets { folder = data }", TWO_VARIANTS, "seed = 11",
                "concurrent = 2", "progress = off");
        Path whole = folder.resolve("whole");
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("batch", file.toString(), "--out", whole.toString()).exitCode());

        Path resumed = folder.resolve("resumed");
        copy(whole, resumed);
        // One analysis interrupted after writing some files (no summary.json, a spoilt particles.csv) ...
        Files.delete(resumed.resolve("lake-1/narrow/summary.json"));
        Files.writeString(resumed.resolve("lake-1/narrow/particles.csv"), "partial");
        // ... its last checkpoint lost too, so it continues from the one before, mid-run ...
        Path checkpoints = resumed.resolve("lake-1/narrow/checkpoints");
        List<Path> saved;
        try (java.util.stream.Stream<Path> entries = Files.list(checkpoints)) {
            saved = entries.sorted().toList();
        }
        assertEquals(2, saved.size(), "the newest two checkpoints are kept");
        deleteTree(saved.get(1));
        String resumedAfter = saved.get(0).getFileName().toString().replaceFirst("iteration-0*(\\d)", "$1");
        // ... one never started, and the batch summaries not yet written.
        deleteTree(resumed.resolve("lake-2/wide"));
        Files.delete(resumed.resolve("batch-summary.csv"));
        byte[] keptTiming = Files.readAllBytes(resumed.resolve("lake-1/wide/timing.json"));

        CommandRunner.Result result = CommandRunner.run("batch", file.toString(), "--out", resumed.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("kept 2 analyses"), result.out());
        assertTrue(result.err().contains("resuming " + resumed.resolve("lake-1/narrow") + " after iteration "
                + resumedAfter + " "), result.err());
        assertArrayEquals(keptTiming, Files.readAllBytes(resumed.resolve("lake-1/wide/timing.json")), "kept, not re-run");
        for (String run : List.of("lake-1/wide", "lake-1/narrow", "lake-2/wide", "lake-2/narrow")) {
            for (String f : List.of("summary.json", "particles.csv", "run.conf")) {
                assertArrayEquals(Files.readAllBytes(whole.resolve(run).resolve(f)),
                        Files.readAllBytes(resumed.resolve(run).resolve(f)), run + "/" + f);
            }
        }
        assertEquals(withoutWallTime(summary(whole)), withoutWallTime(summary(resumed)),
                "batch-summary.csv equal but for wall times");

        byte[] before = Files.readAllBytes(resumed.resolve("batch-summary.json"));
        Path changed = batch("base = base.conf", "datasets { folder = data }", TWO_VARIANTS, "seed = 11",
                "concurrent = 2", "progress = off", "settings { sampler.particles = 300 }");
        CommandRunner.Result refused = CommandRunner.run("batch", changed.toString(), "--out", resumed.toString());
        assertEquals(ExitCodes.BAD_INPUT, refused.exitCode(), refused.err());
        String message = refused.err();
        assertTrue(message.contains("lake-1/wide: sampler.particles = 300, was 400"), message);
        assertTrue(message.contains("settings.sampler.particles"), message);
        assertArrayEquals(before, Files.readAllBytes(resumed.resolve("batch-summary.json")), "nothing changed");
    }

    @Test
    @Slow
    @DisplayName("SIGTERM during a batch: the running analysis stops at a checkpoint, exit 75; run again, it equals an uninterrupted batch")
    @SuppressWarnings("restriction")
    void terminatedAndResumed() throws Exception {
        for (int k = 1; k <= 3; k++) {
            dataset("pond-" + k, SyntheticData.normalRows(70 + k, 8, new double[] {0.5 * k}, SIGMA));
        }
        base("backend { kind = threads, threads = 1 }");
        Path file = batch("base = base.conf", "datasets { folder = data }", TWO_VARIANTS, "seed = 5",
                "concurrent = 1", "progress = off");
        Path whole = folder.resolve("whole");
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("batch", file.toString(), "--out", whole.toString()).exitCode());

        Path stopped = folder.resolve("stopped");
        java.util.concurrent.ExecutorService driver = java.util.concurrent.Executors.newSingleThreadExecutor();
        CommandRunner.Result first;
        try {
            java.util.concurrent.Future<CommandRunner.Result> running = driver.submit(
                    () -> CommandRunner.run("batch", file.toString(), "--out", stopped.toString()));
            // The event: the first analysis's checkpoint of iteration 1 (one analysis at a time, six in all).
            Path trigger = stopped.resolve("pond-1/wide/checkpoints/iteration-000001/manifest.txt");
            long deadline = System.nanoTime() + java.util.concurrent.TimeUnit.SECONDS.toNanos(60);
            while (!Files.exists(trigger)) {
                assertFalse(running.isDone(), "the batch ended before the trigger");
                assertTrue(System.nanoTime() < deadline, "no checkpoint 1 within 60 s");
                Thread.sleep(5);
            }
            sun.misc.Signal.raise(new sun.misc.Signal("TERM"));
            first = running.get(60, java.util.concurrent.TimeUnit.SECONDS);
        } finally {
            driver.shutdownNow();
        }
        assertEquals(ExitCodes.STOPPED_RESUMABLE, first.exitCode(), first.err() + first.out());
        assertTrue(first.err().contains("termination signal"), first.err());
        assertFalse(Files.exists(stopped.resolve("pond-3/narrow/summary.json")), "the last analysis never started");

        CommandRunner.Result again = CommandRunner.run("batch", file.toString(), "--out", stopped.toString());
        assertEquals(ExitCodes.SUCCESS, again.exitCode(), again.err());
        for (int k = 1; k <= 3; k++) {
            for (String variant : List.of("wide", "narrow")) {
                String run = "pond-" + k + "/" + variant;
                for (String f : List.of("summary.json", "particles.csv")) {
                    assertArrayEquals(Files.readAllBytes(whole.resolve(run).resolve(f)),
                            Files.readAllBytes(stopped.resolve(run).resolve(f)), run + "/" + f);
                }
            }
        }
        assertEquals(withoutWallTime(summary(whole)), withoutWallTime(summary(stopped)));
    }

    private static List<List<String>> withoutWallTime(List<CSVRecord> rows) {
        List<List<String>> out = new ArrayList<>();
        for (CSVRecord r : rows) {
            Map<String, String> fields = new java.util.LinkedHashMap<>(r.toMap());
            fields.remove("wall_seconds");
            out.add(new ArrayList<>(fields.values()));
        }
        return out;
    }

    @Test
    @DisplayName("bad batch files: exit 2, one message naming file, line and key, with a suggestion")
    void badBatchFiles() throws IOException {
        dataset("one", SyntheticData.normalRows(71, 5, new double[] {0.0}, SIGMA));
        base("backend.kind = threads");
        expectBadInput(batch("base = base.conf", "datasets.files = [data/one.csv]", "concurent = 2"),
                "batch.conf: line 3", "unknown setting 'concurent'", "did you mean 'concurrent'");
        expectBadInput(batch("base = base.conf", "datasets.files = [data/one.csv]",
                "variants = [ { name = v, settings { sampler.partcles = 10 } } ]"),
                "batch.conf: line 3", "sampler.partcles", "did you mean 'sampler.particles'");
        expectBadInput(batch("base = base.conf", "datasets.files = [data/one.csv]",
                "variants = [ { name = v, settings { sampler.seed = 3 } } ]"),
                "batch.conf: line 3", "variants[0].settings.sampler.seed", "the batch sets this itself");
        expectBadInput(batch("base = missing.conf", "datasets.files = [data/one.csv]"), "batch.conf: line 1", "base",
                "no such run file");
        expectBadInput(batch("base = base.conf", "datasets.files = [data/one.csv]", "datasets.settings.onee {}"),
                "batch.conf: line 3", "no dataset is named 'onee'", "did you mean 'one'");
        expectBadInput(batch("base = base.conf", "datasets.files = [data/one.csv]", "concurrent = 0"),
                "batch.conf: line 3", "concurrent = 0", "between 1 and");
    }

    private void expectBadInput(Path file, String... fragments) {
        Path out = folder.resolve("bad-out");
        CommandRunner.assertBadInput(CommandRunner.run("batch", file.toString(), "--out", out.toString()), fragments);
        assertFalse(Files.exists(out), "nothing written");
    }

    private static void copy(Path from, Path to) throws IOException {
        try (Stream<Path> paths = Files.walk(from)) {
            for (Path p : paths.toList()) {
                Files.copy(p, to.resolve(from.relativize(p).toString()));
            }
        }
    }

    private static void deleteTree(Path root) throws IOException {
        try (Stream<Path> paths = Files.walk(root)) {
            for (Path p : paths.sorted(Comparator.reverseOrder()).toList()) {
                Files.delete(p);
            }
        }
    }
}
