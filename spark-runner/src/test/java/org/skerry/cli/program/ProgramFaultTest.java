package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.ProgramProcess;
import org.skerry.engine.Slow;

/**
 * skerry killed or stopped while its workers run: SIGKILL leaves no worker behind, and a SIGTERM
 * stop resumed gives the bytes of an undisturbed run. Faults are triggered by an observable event
 * (a checkpoint's manifest appearing), never by a timer; the worker sleeps 1 ms a request so that
 * a run lasts long enough to be interrupted.
 */
@Slow
class ProgramFaultTest {

    @TempDir
    static Path dir;

    private static Path runFile;
    private static Path undisturbed;

    @BeforeAll
    static void undisturbedRun() throws IOException {
        ProgramRunFiles.writeData(dir, 25);
        runFile = ProgramRunFiles.write(dir, "faults", 1, List.of("--jitter", "--sleep", "0.001"), "sampler { particles = 200, seed = 3 }", "backend { kind = threads, threads = 2 }",
                "checkpoint.enabled = true", "output.progress = log");
        undisturbed = dir.resolve("undisturbed");
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out", undisturbed.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
    }

    private static Process startAndAwaitCheckpoint(Path out, Path log, Path pids, int iteration)
            throws IOException, InterruptedException {
        Process process = ProgramProcess.start(log, "run", runFile.toString(), "--out", out.toString(),
                "--set", "model.program.environment.SKERRY_TEST_PIDS=" + pids);
        Path manifest = out.resolve(String.format("checkpoints/iteration-%06d/manifest.txt", iteration));
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (!Files.exists(manifest)) {
            assertTrue(process.isAlive(), "the run ended before its checkpoint " + iteration + ": " + Files.readString(log));
            assertTrue(System.nanoTime() < deadline, "no checkpoint " + iteration + " within 120 s");
            Thread.sleep(20);
        }
        return process;
    }

    private static List<Long> pids(Path folder) throws IOException {
        List<Long> pids = new ArrayList<>();
        try (Stream<Path> files = Files.list(folder)) {
            for (Path file : files.toList()) {
                pids.add(Long.parseLong(Files.readString(file).strip()));
            }
        }
        return pids;
    }

    private static boolean alive(long pid) {
        return ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false);
    }

    @Test
    @DisplayName("skerry killed with SIGKILL mid-run: every worker it started is gone within 10 s")
    void sigkillLeavesNoWorker() throws Exception {
        Path pids = Files.createDirectories(dir.resolve("pids-killed"));
        Path out = dir.resolve("killed");
        Process process = startAndAwaitCheckpoint(out, dir.resolve("killed.log"), pids, 1);
        List<Long> workers = pids(pids);
        assertTrue(workers.stream().anyMatch(ProgramFaultTest::alive), "workers running when skerry is killed: " + workers);
        process.destroyForcibly();
        assertTrue(process.waitFor(30, TimeUnit.SECONDS));
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        for (long pid : workers) {
            while (alive(pid)) {
                assertTrue(System.nanoTime() < deadline, "worker " + pid + " outlived skerry by 10 s");
                Thread.sleep(20);
            }
        }
    }

    @Test
    @DisplayName("SIGTERM after checkpoint 1: exit 75, no worker left → resume → the undisturbed run's bytes")
    void terminatedThenResumed() throws Exception {
        Path pids = Files.createDirectories(dir.resolve("pids-terminated"));
        Path out = dir.resolve("terminated");
        Path log = dir.resolve("terminated.log");
        Process process = startAndAwaitCheckpoint(out, log, pids, 1);
        process.destroy();
        assertTrue(process.waitFor(60, TimeUnit.SECONDS), "stopped within the grace period");
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), Files.readString(log));
        for (long pid : pids(pids)) {
            assertFalse(alive(pid), "worker " + pid + " outlived the stopped run");
        }
        assertFalse(Files.exists(out.resolve("summary.json")), "the stop landed before the run ended");
        CommandRunner.Result resumed = CommandRunner.run("resume", out.toString(), "--set", "output.progress=off");
        assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(undisturbed.resolve(name)), Files.readAllBytes(out.resolve(name)), name);
        }
        assertEquals(List.of(), ProgramRunFiles.workers(), "no worker outlives the resumed run");
    }
}
