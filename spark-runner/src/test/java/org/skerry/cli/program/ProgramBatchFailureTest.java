package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;

/**
 * The documented outcome of a failed batch request: each of its particles is evaluated again
 * alone before it counts. A worker that fails every request of more than one particle therefore
 * gives, in batches of 7, the particles of the same worker asked one particle at a time, with no
 * invalid evaluation.
 */
@Slow
class ProgramBatchFailureTest {

    @TempDir
    Path folder;

    private Path run(Path runFile, String out) {
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out",
                folder.resolve(out).toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertEquals(List.of(), ProgramRunFiles.workers(), "no worker outlives its run");
        return folder.resolve(out);
    }

    @Test
    @DisplayName("every batch request fails: each particle is asked alone, and the run gives the one-at-a-time bytes")
    void failedBatchesAreEvaluatedAlone() throws IOException {
        ProgramRunFiles.writeData(folder, 10);
        String[] common = {"sampler.particles = 60", "sampler.seed = 4", "backend { kind = threads, threads = 2 }"};
        Path single = run(ProgramRunFiles.write(folder, "single", 1, List.of("--jitter"), common), "single");
        Path failing = run(ProgramRunFiles.write(folder, "failing", 7, List.of("--jitter", "--batched",
                "--fail-batches"), common), "failing");
        assertArrayEquals(Files.readAllBytes(single.resolve("particles.csv")),
                Files.readAllBytes(failing.resolve("particles.csv")), "particles.csv");
        String summary = Files.readString(failing.resolve("summary.json"));
        assertTrue(summary.contains("\"invalid_evaluations\": 0"), summary);
    }
}
