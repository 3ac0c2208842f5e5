package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.io.IOException;
import java.math.BigDecimal;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;

class TimingJsonTest {

    @TempDir
    Path folder;

    private static IterationRecord record(int iteration, PhaseTimes times) {
        return new IterationRecord(iteration, 0.5, 10, false, 10, 0, 0.3, 2, 1.0, 0, 0, 20, 0, 0, -1, null, times);
    }

    @Test
    @DisplayName("phase seconds are summed over iterations; environment fields and start time read back")
    void readsBack() throws IOException {
        List<IterationRecord> records = List.of(
                record(0, new PhaseTimes(0.5, 0, 0, 0, 0, 0, 0, 0)),
                record(1, new PhaseTimes(0, 0.125, 0.25, 0.375, 0, 0.0625, 1.5, 0)),
                record(2, new PhaseTimes(0, 0.1, 0.2, 0.3, 0, 0.4, 0.7, 0)),
                record(3, null));
        Instant start = Instant.parse("2025-03-01T09:30:00.250Z");
        RunEnvironment environment = new RunEnvironment("0.1.0", "17.0.9", "Vendor \"X\"", null, "threads(4)", start);
        Map<String, Object> json = JsonTree.read(TimingJson.write(folder, environment,
                new TimingJson.Stages(12.75, 2.5, 8.0, 1.25, 1.0), records));
        assertEquals(List.of("wall_seconds", "stage_seconds", "phase_seconds", "program_version", "java_version", "java_vendor", "host",
                "backend", "started_at"), new ArrayList<>(json.keySet()));
        assertEquals(12.75, json.get("wall_seconds"));
        @SuppressWarnings("unchecked")
        Map<String, Object> stages = (Map<String, Object>) json.get("stage_seconds");
        assertEquals(List.of("startup", "sampling", "export", "output"), new ArrayList<>(stages.keySet()));
        assertEquals(List.of(2.5, 8.0, 1.25, 1.0), new ArrayList<>(stages.values()));
        @SuppressWarnings("unchecked")
        Map<String, Object> phases = (Map<String, Object>) json.get("phase_seconds");
        assertEquals(List.of("evaluate", "temperature", "reweight", "resample", "redistribute", "fit", "move",
                "checkpoint"), new ArrayList<>(phases.keySet()));
        assertEquals(0.5, phases.get("evaluate"));
        // Sums of a few terms: compared with the exactly rounded decimal sum, to within rounding.
        assertEquals(new BigDecimal("0.225").doubleValue(), (Double) phases.get("temperature"), 1e-15);
        assertEquals(new BigDecimal("0.45").doubleValue(), (Double) phases.get("reweight"), 1e-15);
        assertEquals(new BigDecimal("0.675").doubleValue(), (Double) phases.get("resample"), 1e-15);
        assertEquals(new BigDecimal("0.4625").doubleValue(), (Double) phases.get("fit"), 1e-15);
        assertEquals(new BigDecimal("2.2").doubleValue(), (Double) phases.get("move"), 1e-15);
        assertEquals("0.1.0", json.get("program_version"));
        assertEquals("17.0.9", json.get("java_version"));
        assertEquals("Vendor \"X\"", json.get("java_vendor"));
        assertNull(json.get("host"));
        assertEquals("threads(4)", json.get("backend"));
        assertEquals(start, Instant.parse((String) json.get("started_at")));
        assertEquals("2025-03-01T09:30:00.250Z", json.get("started_at"));
    }

    @Test
    @DisplayName("the current environment names this JVM")
    void currentEnvironment() {
        RunEnvironment environment = RunEnvironment.current("v", "b", Instant.EPOCH);
        assertEquals(System.getProperty("java.version"), environment.javaVersion());
        assertEquals(System.getProperty("java.vendor"), environment.javaVendor());
        assertEquals("v", environment.programVersion());
        assertEquals("b", environment.backend());
    }
}
