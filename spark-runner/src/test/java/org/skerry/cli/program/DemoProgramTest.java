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
 * The Lake Quellmar demo whose model is a Python program (conf/demo/program, synthetic data), run
 * as the README's one command runs it, at a small N and at most 2 moves an iteration (to keep it
 * short): it ends normally with every evaluation valid, and — the condition its worker documents —
 * gives the same bytes with numpy batches of 200 (the run file's) and of 7, a size that divides
 * no block. About 25 s at load 16 on our 2-core machine.
 */
@Slow
class DemoProgramTest {

    @TempDir
    Path folder;

    private Path run(String out, String... sets) {
        Path runFile = Path.of("..", "conf", "demo", "program", "buoy-07-python.conf").toAbsolutePath().normalize();
        List<String> args = new java.util.ArrayList<>(List.of("run", runFile.toString(), "--out",
                folder.resolve(out).toString(), "--set", "sampler.particles=30", "--set", "sampler.moves.max-steps=2", "--set", "output.progress=off",
                "--set", "output.report=false", "--set", "checkpoint.enabled=false"));
        for (String set : sets) {
            args.addAll(List.of("--set", set));
        }
        CommandRunner.Result result = CommandRunner.run(args.toArray(String[]::new));
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        return folder.resolve(out);
    }

    @Test
    @DisplayName("buoy-07-python.conf runs from its one command; numpy batches of 200 and of 7 give the same bytes")
    void demoRunsAndBatchSizeDoesNotMatter() throws IOException {
        Path batched200 = run("batch-200");
        String summary = Files.readString(batched200.resolve("summary.json"));
        assertTrue(summary.contains("\"invalid_evaluations\": 0"), summary);
        for (String name : List.of("mu_max", "k_n", "g_max", "k_p", "m_p", "sigma")) {
            assertTrue(summary.contains("\"" + name + "\""), name + " in " + summary);
        }
        Path batched7 = run("batch-7", "model.program.batch=7");
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(batched200.resolve(file)), Files.readAllBytes(batched7.resolve(file)),
                    file);
        }
    }
}
