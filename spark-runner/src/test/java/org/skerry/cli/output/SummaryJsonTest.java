package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.sampler.EvidenceEstimate;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;

class SummaryJsonTest {

    @TempDir
    Path folder;

    private static void assertSameDouble(double expected, Object actual, String what) {
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits((Double) actual),
                () -> what + ": expected " + expected + ", read " + actual);
    }

    @Test
    @DisplayName("summary.json of a real run reads back with Jackson to exactly the result's values")
    void readsBackExactly() throws IOException {
        SamplerResult result = EngineRuns.normalMean(5, 2);
        Path file = SummaryJson.write(folder, "beads", "normal-mean", 5, result);
        assertEquals(folder.resolve("summary.json"), file);
        Map<String, Object> json = JsonTree.read(file);

        assertEquals(List.of("name", "model", "log_evidence", "log_evidence_error", "log_evidence_error_reliable", "log_evidence_error_warning",
                "distinct_ancestors_at_end", "islands", "island_log_evidence_error", "parameters", "iterations", "iterations_at_step_cap", "step_cap_warning",
                "likelihood_evaluations",
                "zero_likelihood_evaluations", "invalid_evaluations", "retried_evaluations", "failed_after_retries", "first_invalid",
                "particles", "seed"),
                new ArrayList<>(json.keySet()));
        assertEquals("beads", json.get("name"), "summary.json names its run");
        assertEquals("normal-mean", json.get("model"));
        EvidenceEstimate evidence = result.evidence();
        assertSameDouble(evidence.logEvidence(), json.get("log_evidence"), "log_evidence");
        assertSameDouble(evidence.standardError(), json.get("log_evidence_error"), "log_evidence_error");
        assertEquals(evidence.reliable(), json.get("log_evidence_error_reliable"));
        assertEquals(evidence.warning(), json.get("log_evidence_error_warning"));
        assertEquals(evidence.distinctEves(), json.get("distinct_ancestors_at_end"));

        @SuppressWarnings("unchecked")
        Map<String, Object> parameters = (Map<String, Object>) json.get("parameters");
        List<String> names = new ArrayList<>();
        for (ParameterSummary p : result.parameters()) {
            names.add(p.name());
        }
        assertEquals(names, new ArrayList<>(parameters.keySet()));
        for (ParameterSummary p : result.parameters()) {
            @SuppressWarnings("unchecked")
            Map<String, Object> s = (Map<String, Object>) parameters.get(p.name());
            assertEquals(List.of("mean", "sd", "q2_5", "q5", "q25", "q50", "q75", "q95", "q97_5"),
                    new ArrayList<>(s.keySet()));
            double[] expected = {p.mean(), p.sd(), p.q2_5(), p.q5(), p.q25(), p.q50(), p.q75(), p.q95(), p.q97_5()};
            int k = 0;
            for (Object value : s.values()) {
                assertSameDouble(expected[k++], value, p.name());
            }
        }
        assertEquals((long) result.iterationCount(), json.get("iterations"));
        assertEquals(result.iterations().size() - 1L, json.get("iterations"));
        assertEquals(result.evaluations().evaluations(), json.get("likelihood_evaluations"));
        assertEquals(0L, json.get("zero_likelihood_evaluations"));
        assertEquals(0L, json.get("invalid_evaluations"));
        assertEquals(0L, json.get("retried_evaluations"));
        assertEquals(0L, json.get("failed_after_retries"));
        assertTrue(json.containsKey("first_invalid"));
        assertNull(json.get("first_invalid"));
        assertEquals(400L, json.get("particles"));
        assertEquals(5L, json.get("seed"));
        assertEquals("normal-mean", json.get("model"));
        assertTrue(Files.readString(file).endsWith("}\n"));
    }

    @Test
    @DisplayName("the first invalid evaluation is reported with its particle, reason and parameter values")
    void firstInvalidReported() throws IOException {
        SamplerResult result = EngineRuns.fragile(11);
        EvaluationTally tally = result.evaluations();
        assertTrue(tally.invalid() > 0, "the run should meet invalid evaluations");
        Map<String, Object> json = JsonTree.read(SummaryJson.write(folder, "fragile \"test\" model", 11, result));
        assertEquals(tally.invalid(), json.get("invalid_evaluations"));
        @SuppressWarnings("unchecked")
        Map<String, Object> first = (Map<String, Object>) json.get("first_invalid");
        assertNotNull(first);
        assertEquals(List.of("iteration", "particle", "reason", "parameters"), new ArrayList<>(first.keySet()));
        long firstIteration = result.iterations().stream().filter(r -> r.invalidEvaluations() > 0).findFirst()
                .orElseThrow().iteration();
        assertEquals(firstIteration, first.get("iteration"));
        assertEquals(tally.firstInvalidIndex(), first.get("particle"));
        assertEquals(tally.firstInvalidReason(), first.get("reason"));
        assertTrue(((String) first.get("reason")).contains(EngineRuns.REASON));
        @SuppressWarnings("unchecked")
        Map<String, Object> at = (Map<String, Object>) first.get("parameters");
        assertEquals(List.of("theta"), new ArrayList<>(at.keySet()));
        assertSameDouble(tally.firstInvalidParameters()[0], at.get("theta"), "theta");
        assertTrue((Double) at.get("theta") > 2.5);
        assertEquals("fragile \"test\" model", json.get("model"));
    }

    @Test
    @DisplayName("the same seed gives a byte-identical summary.json, whatever the thread count")
    void sameSeedSameBytes() throws IOException {
        Path a = Files.createDirectory(folder.resolve("a"));
        Path b = Files.createDirectory(folder.resolve("b"));
        Path c = Files.createDirectory(folder.resolve("c"));
        SummaryJson.write(a, "normal-mean", 9, EngineRuns.normalMean(9, 1));
        SummaryJson.write(b, "normal-mean", 9, EngineRuns.normalMean(9, 3));
        SummaryJson.write(c, "normal-mean", 10, EngineRuns.normalMean(10, 1));
        assertArrayEquals(Files.readAllBytes(a.resolve("summary.json")), Files.readAllBytes(b.resolve("summary.json")));
        assertTrue(!Files.readString(a.resolve("summary.json")).equals(Files.readString(c.resolve("summary.json"))),
                "another seed should give another summary");
    }

    @Test
    @DisplayName("numbers that are not finite are written as null; a warning is written as text")
    void nonFiniteAsNull() throws IOException {
        FinalParticles particles = new FinalParticles(1, 2, new double[] {0.5, 1.5}, new double[] {0, 0},
                new double[] {0, 0}, new double[] {0, 0}, new long[] {0, 1}, new long[] {0, 0});
        SamplerResult result = new SamplerResult(
                new EvidenceEstimate(-3.25, Double.NaN, Double.NaN, 1, false, "only 1 distinct ancestor", 0, Double.NaN),
                List.of(new ParameterSummary("x", 1.0, 0.5, 0.5, 0.5, 0.5, 0.5, 1.5, 1.5, Double.POSITIVE_INFINITY)),
                List.of(), EvaluationTally.NONE, particles, new double[] {0.5, 0.5},
                new org.skerry.engine.sampler.StepCapReport(0, 0, 20));
        Path file = SummaryJson.write(folder, "m", -1, result);
        Map<String, Object> json = JsonTree.read(file);
        assertTrue(json.containsKey("log_evidence_error"));
        assertNull(json.get("log_evidence_error"));
        assertEquals(Boolean.FALSE, json.get("log_evidence_error_reliable"));
        assertEquals("only 1 distinct ancestor", json.get("log_evidence_error_warning"));
        @SuppressWarnings("unchecked")
        Map<String, Object> x = (Map<String, Object>) ((Map<String, Object>) json.get("parameters")).get("x");
        assertNull(x.get("q97_5"));
        assertTrue(x.containsKey("q97_5"));
        assertEquals(-1L, json.get("seed"));
        assertEquals(-1L, json.get("iterations"));
    }
}
