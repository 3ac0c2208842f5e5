package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code skerry status}: each way a run ends leaves its own file in the run folder (summary.json,
 * failure.txt, stopped.txt), the status command reads it back with the exit code the run itself
 * gave, and a resume clears an earlier attempt's outcome.
 */
class RunStatusTest {

    @TempDir
    Path dir;

    private Path conjugate() throws IOException {
        Files.writeString(dir.resolve("data.csv"), ConjugateRun.DATA);
        return Files.writeString(dir.resolve("run.conf"), ConjugateRun.RUN_FILE);
    }

    @Test
    @DisplayName("a stopped run: exit 75, stopped.txt, status 75; resumed to the end: stopped.txt gone, status 0")
    void stoppedThenFinished() throws IOException {
        Path out = dir.resolve("out");
        // A wall-time limit every iteration exceeds: the run stops after its first iteration.
        CommandRunner.Result stopped = CommandRunner.run("run", conjugate().toString(), "--out", out.toString(),
                "--max-wall-time", "1ms");
        assertEquals(ExitCodes.STOPPED_RESUMABLE, stopped.exitCode(), stopped.err());
        assertTrue(Files.isRegularFile(out.resolve(RunOutcome.STOPPED_FILE)));
        assertFalse(Files.exists(out.resolve(RunOutcome.FAILURE_FILE)));
        CommandRunner.Result status = CommandRunner.run("status", out.toString());
        assertEquals(ExitCodes.STOPPED_RESUMABLE, status.exitCode(), status.err());
        assertTrue(status.out().startsWith("stopped at a checkpoint: "), status.out());
        assertTrue(status.out().contains("skerry resume " + out), status.out());

        CommandRunner.Result resumed = CommandRunner.run("resume", out.toString());
        assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
        assertFalse(Files.exists(out.resolve(RunOutcome.STOPPED_FILE)), "the resume cleared the earlier outcome");
        CommandRunner.Result done = CommandRunner.run("status", out.toString());
        assertEquals(ExitCodes.SUCCESS, done.exitCode(), done.err());
        assertTrue(done.out().startsWith("finished: "), done.out());
    }

    @Test
    @DisplayName("a failed run: exit 1, failure.txt with the reason, status 1 printing it")
    void failed() throws IOException {
        Path run = Files.writeString(dir.resolve("failing.conf"), String.join("\n",
                "name = failing",
                "model { class = \"" + FailingTestModel.class.getName() + "\", settings { everywhere = true } }",
                "sampler { particles = 100, seed = 5 }",
                "backend { kind = threads, threads = 2 }",
                "output.progress = off", ""));
        Path out = dir.resolve("failed");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        assertEquals(ExitCodes.RUN_FAILURE, result.exitCode(), result.err());
        String reason = Files.readString(out.resolve(RunOutcome.FAILURE_FILE)).strip();
        assertTrue(reason.startsWith("the run failed at iteration 0"), reason);
        CommandRunner.Result status = CommandRunner.run("status", out.toString());
        assertEquals(ExitCodes.RUN_FAILURE, status.exitCode(), status.err());
        assertEquals("failed: " + reason, status.out().strip());
    }

    @Test
    @DisplayName("a folder with run.conf and no outcome: exit 4; a folder that is no run folder: bad input, exit 2")
    void noOutcomeAndBadInput() throws IOException {
        Path running = Files.createDirectories(dir.resolve("running"));
        Files.writeString(running.resolve("run.conf"), "name = x\n");
        CommandRunner.Result status = CommandRunner.run("status", running.toString());
        assertEquals(ExitCodes.NO_OUTCOME, status.exitCode(), status.err());
        assertTrue(status.out().startsWith("no outcome yet"), status.out());

        Path empty = Files.createDirectories(dir.resolve("empty"));
        CommandRunner.assertBadInput(CommandRunner.run("status", empty.toString()), empty.toString(), "run.conf");
        CommandRunner.assertBadInput(CommandRunner.run("status", dir.resolve("missing").toString()), "missing");
    }
}
