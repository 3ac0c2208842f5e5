package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.sampler.SamplerResult;

/**
 * Every key and column a run or batch writes is named in one style — lower case words joined by
 * {@code _} — and is explained in the README: each name appears there in backticks in the first
 * cell of a table row. Names come from files actually written, so a new field is caught.
 */
class OutputsDocumentedTest {

    private static final Pattern SNAKE_CASE = Pattern.compile("[a-z][a-z0-9_]*");
    /** The names in backticks in the first cell of every README table row. */
    private static final Set<String> DOCUMENTED = new HashSet<>();

    @TempDir
    Path folder;

    @BeforeAll
    static void readReadme() throws IOException {
        Matcher cell = Pattern.compile("`([^`]+)`").matcher("");
        for (String line : Files.readAllLines(Path.of("..", "README.md"))) {
            String row = line.strip();
            if (!row.startsWith("| ")) {
                continue;
            }
            int end = row.indexOf(" |", 1);
            cell.reset(row.substring(0, end < 0 ? row.length() : end));
            while (cell.find()) {
                DOCUMENTED.add(cell.group(1));
            }
        }
    }

    private static void assertDocumented(String file, String name) {
        assertTrue(SNAKE_CASE.matcher(name).matches(), file + ": '" + name + "' is not snake_case");
        assertTrue(DOCUMENTED.contains(name), file + ": '" + name + "' is not explained in a README table");
    }

    @Test
    @DisplayName("summary.json (with a first failure) and timing.json: every key snake_case and in the README")
    void jsonKeys() throws IOException {
        SamplerResult result = EngineRuns.fragile(3);
        Map<String, Object> summary = JsonTree.read(SummaryJson.write(folder, "fragile", "m", 3, result));
        assertNotNull(summary.get("first_invalid"), "a run with a failure, so first_invalid's keys are seen");
        for (Map.Entry<String, Object> entry : summary.entrySet()) {
            assertDocumented("summary.json", entry.getKey());
        }
        @SuppressWarnings("unchecked")
        Map<String, Map<String, Object>> parameters = (Map<String, Map<String, Object>>) summary.get("parameters");
        List<String> statistics = new ArrayList<>(parameters.get("theta").keySet());
        StringBuilder listed = new StringBuilder();
        for (String key : statistics) {
            assertTrue(SNAKE_CASE.matcher(key).matches(), "summary.json parameters: " + key);
            listed.append(listed.length() == 0 ? "" : ", ").append('`').append(key).append('`');
        }
        assertTrue(readme().contains("| `parameters` | per parameter, in the model's order: " + listed),
                "the README's parameters row lists " + listed);
        @SuppressWarnings("unchecked")
        Map<String, Object> first = (Map<String, Object>) summary.get("first_invalid");
        assertEquals(List.of("iteration", "particle", "reason", "parameters"), new ArrayList<>(first.keySet()));
        assertTrue(readme().contains("`first_invalid` | the earliest invalid evaluation (lowest particle index in its "
                + "iteration): `iteration`, `particle`, `reason`, `parameters`"), "first_invalid's fields in the README");

        Map<String, Object> timing = JsonTree.read(TimingJson.write(folder,
                RunEnvironment.current("0.1.0", "threads(2)", Instant.EPOCH),
                new TimingJson.Stages(1.5, 0.25, 1.0, 0.125, 0.125), result.iterations()));
        for (Map.Entry<String, Object> entry : timing.entrySet()) {
            assertDocumented("timing.json", entry.getKey());
        }
        @SuppressWarnings("unchecked")
        Map<String, Object> stages = (Map<String, Object>) timing.get("stage_seconds");
        for (String stage : stages.keySet()) {
            assertTrue(readme().contains("`stage_seconds` | an object: ") && readme().lines()
                    .filter(line -> line.startsWith("| `stage_seconds` |")).anyMatch(line -> line.contains("`" + stage + "`")),
                    "timing.json stage_seconds." + stage + " in the README's stage_seconds row");
        }
        @SuppressWarnings("unchecked")
        Map<String, Object> phases = (Map<String, Object>) timing.get("phase_seconds");
        for (String phase : phases.keySet()) {
            assertDocumented("iterations.csv (timing.json phase_seconds." + phase + ")", "seconds_" + phase);
            assertTrue(readme().contains("`" + phase + "`"), "phase " + phase + " named in the README");
        }
    }

    @Test
    @DisplayName("iterations.csv and particles.csv: every column snake_case and in the README")
    void csvColumns() throws IOException {
        for (String column : IterationsCsv.COLUMNS) {
            assertDocumented("iterations.csv", column);
        }
        for (String column : ParticlesCsv.FIXED_COLUMNS) {
            assertDocumented("particles.csv", column);
        }
        for (String column : IterationsCsv.ABC_COLUMNS) {
            assertDocumented("iterations.csv (ABC)", column);
        }
    }

    @Test
    @DisplayName("summary.json of an ABC run: every key, those of its abc object included, snake_case and in the README")
    void abcKeys() throws IOException {
        org.skerry.engine.model.builtin.NormalMeanSimulator model = org.skerry.engine.model.builtin.NormalMeanSimulator
                .of(new double[] {0.5, 1.5}, 1, 0, 2);
        SamplerResult result;
        try (org.skerry.engine.population.threads.ThreadPoolBackend backend
                = new org.skerry.engine.population.threads.ThreadPoolBackend(1, 0)) {
            result = new org.skerry.engine.sampler.SmcSampler(org.skerry.engine.sampler.SamplerSettings.builder()
                    .particles(100).targets(org.skerry.engine.target.SequenceSettings.abc(
                            org.skerry.engine.abc.AbcSettings.of(0.3).withStops(0, 2000))).build()).run(model, backend);
        }
        Map<String, Object> summary = JsonTree.read(SummaryJson.write(folder, "abc", "m", 3, result));
        @SuppressWarnings("unchecked")
        Map<String, Object> abc = (Map<String, Object>) summary.get("abc");
        for (String key : summary.keySet()) {
            assertDocumented("summary.json", key);
        }
        for (String key : abc.keySet()) {
            assertDocumented("summary.json abc", key);
        }
    }

    @Test
    @DisplayName("batch-summary.csv and .json: every column and key snake_case and in the README")
    void batchColumns() throws IOException {
        BatchSummary.write(folder, "base", List.of(new BatchSummary.Row("lake-1", "base", "succeeded", -3.5, 0.1,
                Double.NaN, Double.NaN, 4, 1000, 0.05, 2000, Map.of("theta", new double[] {1, 0.5, 1.5}), 7,
                "lake-1/base", 2.5, null)));
        List<String> header;
        try (Reader in = Files.newBufferedReader(folder.resolve(BatchSummary.CSV_NAME));
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180.builder().setHeader().get())) {
            header = parser.getHeaderNames();
        }
        for (String column : header) {
            if (column.startsWith("theta.")) {
                String statistic = column.substring("theta.".length());
                assertTrue(SNAKE_CASE.matcher(statistic).matches(), column);
                assertTrue(DOCUMENTED.contains("<parameter>." + statistic), "batch-summary.csv: " + column);
            } else {
                assertDocumented("batch-summary.csv", column);
            }
        }
        Map<String, Object> json = JsonTree.read(folder.resolve(BatchSummary.JSON_NAME));
        assertEquals(List.of("reference_variant", "analyses"), new ArrayList<>(json.keySet()));
        assertTrue(readme().contains("`batch-summary.json` holds `reference_variant` and `analyses`"));
        @SuppressWarnings("unchecked")
        Map<String, Object> row = ((List<Map<String, Object>>) json.get("analyses")).get(0);
        for (String key : row.keySet()) {
            if (!key.equals("parameters")) {
                assertDocumented("batch-summary.json", key);
            }
        }
    }

    private static String readme() throws IOException {
        return Files.readString(Path.of("..", "README.md"));
    }
}
