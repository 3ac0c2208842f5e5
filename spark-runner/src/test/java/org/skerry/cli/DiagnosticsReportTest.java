package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.JsonTree;

/**
 * What a run says about its own diagnostics, through the command: an evidence error that cannot be
 * trusted is printed without a ± figure and flagged in summary.json; iterations whose MH steps hit
 * the cap are reported with the setting to change.
 */
class DiagnosticsReportTest {

    @TempDir
    Path folder;

    private Path runFile() throws IOException {
        Files.writeString(folder.resolve("data.csv"), ConjugateRun.DATA);
        Path file = folder.resolve("run.conf");
        Files.writeString(file, ConjugateRun.RUN_FILE + "sampler.particles = 300\n");
        return file;
    }

    @Test
    @DisplayName("default settings: a reliable error, printed with ±, and no step-cap warning")
    void defaults() throws IOException {
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", runFile().toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("±"), result.out());
        Map<String, Object> summary = JsonTree.read(out.resolve("summary.json"));
        assertEquals(Boolean.TRUE, summary.get("log_evidence_error_reliable"));
        assertEquals(0L, ((Number) summary.get("iterations_at_step_cap")).longValue());
        assertNull(summary.get("step_cap_warning"));
    }

    @Test
    @DisplayName("systematic resampling: the error is flagged unreliable and printed without a ± figure")
    void systematicFlagged() throws IOException {
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", runFile().toString(), "--out", out.toString(),
                "--set", "sampler.resampling.scheme=systematic");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertFalse(result.out().contains("±"), result.out());
        assertTrue(result.out().contains("multinomial"), result.out());
        Map<String, Object> summary = JsonTree.read(out.resolve("summary.json"));
        assertEquals(Boolean.FALSE, summary.get("log_evidence_error_reliable"));
        assertTrue(String.valueOf(summary.get("log_evidence_error_warning")).contains("systematic"));
    }

    @Test
    @DisplayName("a cap of one MH step: every iteration is reported at the cap, with the setting to change")
    void stepCapReported() throws IOException {
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", runFile().toString(), "--out", out.toString(),
                "--set", "sampler.moves.max-steps=1");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("sampler.moves.max-steps"), result.out());
        Map<String, Object> summary = JsonTree.read(out.resolve("summary.json"));
        assertEquals(((Number) summary.get("iterations")).longValue(),
                ((Number) summary.get("iterations_at_step_cap")).longValue());
        assertTrue(String.valueOf(summary.get("step_cap_warning")).contains("sampler.moves.max-steps"));
    }
}
