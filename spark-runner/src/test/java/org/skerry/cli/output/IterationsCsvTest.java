package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;
import org.skerry.engine.sampler.SamplerResult;

class IterationsCsvTest {

    @TempDir
    Path folder;

    private static final List<String> NAMES = List.of("theta", "log_rate");

    private static List<CSVRecord> read(Path file) throws IOException {
        try (Reader in = Files.newBufferedReader(file);
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180.builder().setHeader().setSkipHeaderRecord(true).get())) {
            assertEquals(List.of("iteration", "temperature", "ess", "resampled", "distinct_ancestors", "particles_sent_to_other_partitions",
                    "acceptance", "mh_steps", "scale", "log_evidence_increment", "log_evidence", "evaluations",
                    "zero_likelihood", "invalid", "first_invalid_particle", "first_invalid_reason", "seconds_evaluate",
                    "seconds_temperature", "seconds_reweight", "seconds_resample", "seconds_redistribute", "seconds_fit",
                    "seconds_move", "seconds_checkpoint", "retried", "failed_after_retries", "first_invalid_parameters"),
                    parser.getHeaderNames());
            return parser.getRecords();
        }
    }

    private static void assertSameDouble(double expected, String text) {
        assertEquals(Double.doubleToRawLongBits(expected), Double.doubleToRawLongBits(Double.parseDouble(text)), text);
    }

    private static void assertRow(IterationRecord r, CSVRecord row) {
        assertEquals(r.iteration(), Integer.parseInt(row.get("iteration")));
        assertSameDouble(r.temperature(), row.get("temperature"));
        assertSameDouble(r.ess(), row.get("ess"));
        assertEquals(Boolean.toString(r.resampled()), row.get("resampled"));
        assertEquals(r.distinctAncestors(), Long.parseLong(row.get("distinct_ancestors")));
        assertEquals(r.particlesMoved(), Long.parseLong(row.get("particles_sent_to_other_partitions")));
        assertSameDouble(r.acceptanceRate(), row.get("acceptance"));
        assertEquals(r.mhSteps(), Integer.parseInt(row.get("mh_steps")));
        assertSameDouble(r.scale(), row.get("scale"));
        assertSameDouble(r.logEvidenceIncrement(), row.get("log_evidence_increment"));
        assertSameDouble(r.logEvidence(), row.get("log_evidence"));
        assertEquals(r.evaluations(), Long.parseLong(row.get("evaluations")));
        assertEquals(r.zeroLikelihood(), Long.parseLong(row.get("zero_likelihood")));
        assertEquals(r.invalidEvaluations(), Long.parseLong(row.get("invalid")));
        assertEquals(r.retriedEvaluations(), Long.parseLong(row.get("retried")));
        assertEquals(r.failedAfterRetries(), Long.parseLong(row.get("failed_after_retries")));
        if (r.firstInvalidIndex() < 0) {
            assertEquals("", row.get("first_invalid_particle"));
            assertEquals("", row.get("first_invalid_reason"));
            assertEquals("", row.get("first_invalid_parameters"));
        } else {
            assertEquals(r.firstInvalidIndex(), Long.parseLong(row.get("first_invalid_particle")));
            assertEquals(r.firstInvalidReason(), row.get("first_invalid_reason"));
            String[] pairs = row.get("first_invalid_parameters").split(";");
            assertEquals(r.firstInvalidParameters().size(), pairs.length);
            for (int k = 0; k < pairs.length; k++) {
                String[] pair = pairs[k].split("=");
                assertEquals(NAMES.get(k), pair[0]);
                assertSameDouble(r.firstInvalidParameters().get(k), pair[1]);
            }
        }
        PhaseTimes t = r.seconds();
        assertSameDouble(t.evaluate(), row.get("seconds_evaluate"));
        assertSameDouble(t.temperature(), row.get("seconds_temperature"));
        assertSameDouble(t.reweight(), row.get("seconds_reweight"));
        assertSameDouble(t.resample(), row.get("seconds_resample"));
        assertSameDouble(t.redistribute(), row.get("seconds_redistribute"));
        assertSameDouble(t.fit(), row.get("seconds_fit"));
        assertSameDouble(t.move(), row.get("seconds_move"));
        assertSameDouble(t.checkpoint(), row.get("seconds_checkpoint"));
    }

    @Test
    @DisplayName("one row per record of a real run, every field reading back to the record's value")
    void oneRowPerRecord() throws IOException {
        SamplerResult result = EngineRuns.normalMean(8, 2);
        List<CSVRecord> rows = read(IterationsCsv.write(folder, result.iterations(), NAMES));
        assertEquals(result.iterations().size(), rows.size());
        for (int i = 0; i < rows.size(); i++) {
            assertRow(result.iterations().get(i), rows.get(i));
        }
        assertEquals("NaN", rows.get(0).get("acceptance"));
    }

    @Test
    @DisplayName("invalid-evaluation reasons with commas, quotes and line breaks survive the trip")
    void reasonsAreQuoted() throws IOException {
        SamplerResult result = EngineRuns.fragile(11);
        IterationRecord first = result.iterations().get(0);
        IterationRecord awkward = new IterationRecord(7, 0.5, 12.5, true, 3, 2, 0.25, 4, 0.75, -1e-300, -3.0,
                10, 1, 2, 9, "line one,\r\nline \"two\"", new PhaseTimes(0, 1e-9, 2, 3, 0, 4, 5, 0), 3, 1,
                List.of(0.1 + 0.2, -1e-300));
        List<IterationRecord> records = Arrays.asList(first, awkward);
        List<CSVRecord> rows = read(IterationsCsv.write(folder, records, NAMES));
        assertTrue(first.invalidEvaluations() > 0 && first.firstInvalidParameters().size() == 1);
        assertEquals(2, rows.size());
        assertRow(first, rows.get(0));
        assertRow(awkward, rows.get(1));
    }
}
