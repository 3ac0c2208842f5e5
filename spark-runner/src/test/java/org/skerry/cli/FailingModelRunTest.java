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
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.skerry.cli.output.JsonTree;
import org.skerry.engine.Slow;

/**
 * Failing models through the command: what a user sees in iterations.csv, summary.json and the
 * log, the stop on too many invalid evaluations (exit 1, the run folder kept), checked run-file
 * values, and Spark in local mode bit for bit equal to threads with failures present.
 */
class FailingModelRunTest {

    @TempDir
    Path folder;

    private Path runFile(String settings, String... more) throws IOException {
        List<String> lines = new ArrayList<>(List.of(
                "name = failing",
                "model { class = \"" + FailingTestModel.class.getName() + "\", settings { " + settings + " } }",
                "sampler { particles = 400, seed = 5 }",
                "backend { kind = threads, threads = 2 }",
                "output.progress = log"));
        lines.addAll(List.of(more));
        lines.add("");
        return Files.writeString(folder.resolve("run.conf"), String.join("\n", lines));
    }

    private static List<CSVRecord> rows(Path file) throws IOException {
        try (Reader in = Files.newBufferedReader(file);
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180.builder().setHeader().setSkipHeaderRecord(true).get())) {
            return parser.getRecords();
        }
    }

    @ParameterizedTest
    @ValueSource(strings = {"above = 2.5", "nan-below = -2.5"})
    @DisplayName("a model failing in part of the prior: the run finishes; iterations.csv, summary.json and the log "
            + "report the failures with the first particle's values")
    void failuresReported(String settings) throws IOException {
        // Either region holds about 11 % of the prior N(0, 2²): above the default limit of 10 %.
        Path run = runFile(settings, "sampler.max-invalid-fraction = 0.5");
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        boolean above = settings.startsWith("above");

        List<CSVRecord> rows = rows(out.resolve("iterations.csv"));
        long invalid = 0;
        List<CSVRecord> failing = new ArrayList<>();
        for (CSVRecord row : rows) {
            long count = Long.parseLong(row.get("invalid"));
            invalid += count;
            assertEquals("0", row.get("retried"));
            assertEquals("0", row.get("failed_after_retries"));
            if (count > 0) {
                failing.add(row);
                String pair = row.get("first_invalid_parameters");
                assertTrue(pair.startsWith("theta="), pair);
                double theta = Double.parseDouble(pair.substring("theta=".length()));
                assertTrue(above ? theta > 2.5 : theta < -2.5, pair);
                assertTrue(row.get("first_invalid_reason").contains(above ? FailingTestModel.REASON : "NaN"));
            } else {
                assertEquals("", row.get("first_invalid_parameters"));
            }
        }
        assertTrue(failing.size() > 0 && failing.get(0).get("iteration").equals("0"));

        Map<String, Object> summary = JsonTree.read(out.resolve("summary.json"));
        assertEquals(invalid, summary.get("invalid_evaluations"));
        assertEquals(0L, summary.get("retried_evaluations"));
        @SuppressWarnings("unchecked")
        Map<String, Object> first = (Map<String, Object>) summary.get("first_invalid");
        assertEquals(0L, first.get("iteration"));
        assertEquals(Long.parseLong(failing.get(0).get("first_invalid_particle")), first.get("particle"));
        @SuppressWarnings("unchecked")
        Map<String, Object> at = (Map<String, Object>) first.get("parameters");
        assertEquals(failing.get(0).get("first_invalid_parameters"), "theta=" + at.get("theta"));

        List<String> warnings = result.err().lines().filter(l -> l.contains(" warning: ")).toList();
        assertEquals(failing.size(), warnings.size(), result.err());
        for (int k = 0; k < warnings.size(); k++) {
            CSVRecord row = failing.get(k);
            String expected = "warning: iter " + row.get("iteration") + ": " + row.get("invalid") + " of "
                    + row.get("evaluations") + " likelihood evaluations invalid";
            assertTrue(warnings.get(k).contains(expected), warnings.get(k));
            assertTrue(warnings.get(k).contains("first: particle " + row.get("first_invalid_particle") + " at "
                    + row.get("first_invalid_parameters") + ": " + row.get("first_invalid_reason")), warnings.get(k));
        }
    }

    @Test
    @DisplayName("a model failing everywhere: exit 1, a message naming iteration, count, limit key and first particle; "
            + "run.conf kept")
    void failsEverywhere() throws IOException {
        Path run = runFile("everywhere = true");
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        assertEquals(ExitCodes.RUN_FAILURE, result.exitCode(), result.err());
        String err = result.err();
        for (String part : List.of("skerry: the run failed at iteration 0: 400 of 400 likelihood evaluations were "
                + "invalid (100.0 %), more than the limit of 0.1 (sampler.max-invalid-fraction); the first, particle 0 "
                + "at theta=", FailingTestModel.REASON, "model.retries", " warning: ") ) {
            if (part.equals(" warning: ")) {
                assertFalse(err.contains(part), "the stop comes before the iteration's progress line: " + err);
            } else {
                assertTrue(err.contains(part), "'" + part + "' in: " + err);
            }
        }
        assertTrue(Files.isRegularFile(out.resolve("run.conf")), "the resolved settings written before the run stay");
        assertTrue(Files.readString(out.resolve("run.conf")).contains("everywhere"));
        assertFalse(Files.exists(out.resolve("summary.json")));
    }

    @Test
    @DisplayName("model.retries and sampler.max-invalid-fraction out of range: exit 2 naming file, line, key and value")
    void badValues() throws IOException {
        Path run = runFile("above = 2.5", "model.retries = -1");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", folder.resolve("a").toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("run.conf: line 6") && result.err().contains("model.retries = -1")
                && result.err().contains("between 0 and 100"), result.err());
        assertFalse(Files.exists(folder.resolve("a")));

        result = CommandRunner.run("run", run.toString(), "--set", "model.retries=1", "--set",
                "sampler.max-invalid-fraction=1.5", "--out", folder.resolve("b").toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("sampler.max-invalid-fraction = 1.5") && result.err().contains("[0.0, 1.0]"),
                result.err());
    }

    private static String withoutSeconds(Path iterations) throws IOException {
        StringBuilder text = new StringBuilder();
        for (CSVRecord row : rows(iterations)) {
            for (Map.Entry<String, String> e : row.toMap().entrySet()) {
                if (!e.getKey().startsWith("seconds_")) {
                    text.append(e.getKey()).append('=').append(e.getValue()).append(' ');
                }
            }
            text.append('\n');
        }
        return text.toString();
    }

    @Test
    @Slow
    @DisplayName("throwing, NaN and flaky failures with retries: Spark local mode gives threads' files bit for bit; "
            + "the retry hides the flaky failures")
    void sparkMatchesThreads() throws IOException {
        Path run = runFile("above = 2.5, nan-below = -3, flaky = true", "sampler.max-invalid-fraction = 0.5",
                "model.retries = 1");
        Path threads = folder.resolve("threads");
        Path spark = folder.resolve("spark");
        CommandRunner.Result a = CommandRunner.run("run", run.toString(), "--out", threads.toString(),
                "--set", "backend.block-size=7", "--set", "output.progress=off");
        assertEquals(ExitCodes.SUCCESS, a.exitCode(), a.err());
        CommandRunner.Result b = CommandRunner.run("run", run.toString(), "--out", spark.toString(),
                "--set", "backend.kind=spark", "--set", "backend.master=\"local[2]\"", "--set", "backend.partitions=3",
                "--set", "output.progress=off");
        assertEquals(ExitCodes.SUCCESS, b.exitCode(), b.err());
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(threads.resolve(name)), Files.readAllBytes(spark.resolve(name)), name);
        }
        assertEquals(withoutSeconds(threads.resolve("iterations.csv")), withoutSeconds(spark.resolve("iterations.csv")));

        Map<String, Object> summary = JsonTree.read(spark.resolve("summary.json"));
        assertTrue((Long) summary.get("invalid_evaluations") > 0);
        assertTrue((Long) summary.get("retried_evaluations") > 0, "the flaky first calls were retried");
        // Throwing and NaN regions fail on every retry too; the flaky calls never do.
        assertEquals(summary.get("invalid_evaluations"), summary.get("failed_after_retries"));
        String flakyReason = "simulator node busy";
        assertFalse(Files.readString(spark.resolve("iterations.csv")).contains(flakyReason));
    }
}
