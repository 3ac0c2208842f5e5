package org.skerry.cli.checkpoint;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.ProgramProcess;

/**
 * The driver process killed or told to stop mid-run, or its run folder turned read-only, then
 * resumed: the final files are byte for byte those of an undisturbed run. Each fault is triggered by an observable event — the
 * checkpoint of iteration 2 appearing — never by a timer. The runs use the demo's ODE model at
 * small N, whose iterations take long enough that the fault lands before the run ends (checked).
 */
class RunFaultTest {

    private static final Path DEMO_RUN = Path.of("..", "conf", "demo", "buoy-07-sigmoidal.conf").toAbsolutePath()
            .normalize();
    private static final String[] SMALL = {"--set", "sampler.particles=150", "--set", "output.progress=log"};

    @TempDir
    static Path dir;

    private static Path undisturbed;

    private static String[] args(Path out, String... more) {
        List<String> args = new ArrayList<>(List.of("run", DEMO_RUN.toString(), "--out", out.toString()));
        args.addAll(List.of(SMALL));
        args.addAll(List.of(more));
        return args.toArray(new String[0]);
    }

    @BeforeAll
    static void undisturbedRun() {
        undisturbed = dir.resolve("undisturbed");
        CheckpointResumeTest.Result result = CheckpointResumeTest.skerry(args(undisturbed));
        assertEquals(0, result.exitCode(), result.err());
    }

    /** Starts the program and waits until the checkpoint of {@code iteration} is complete. */
    private static Process startAndAwaitCheckpoint(Path out, Path log, int iteration, String... more)
            throws IOException, InterruptedException {
        Process process = ProgramProcess.start(log, args(out, more));
        Path manifest = out.resolve(String.format("checkpoints/iteration-%06d/manifest.txt", iteration));
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (!Files.exists(manifest)) {
            assertTrue(process.isAlive(), "the run ended before its checkpoint " + iteration + ": "
                    + Files.readString(log));
            assertTrue(System.nanoTime() < deadline, "no checkpoint " + iteration + " within 120 s");
            Thread.sleep(20);
        }
        return process;
    }

    private static void resumeAndCompare(Path out) throws IOException {
        assertFalse(Files.exists(out.resolve("summary.json")), "the fault landed before the run ended");
        CheckpointResumeTest.Result resumed = CheckpointResumeTest.skerry("resume", out.toString(),
                "--set", "output.progress=off");
        assertEquals(0, resumed.exitCode(), resumed.err());
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(undisturbed.resolve(name)), Files.readAllBytes(out.resolve(name)), name);
        }
        assertEquals(Files.readAllLines(undisturbed.resolve("iterations.csv")).size(),
                Files.readAllLines(out.resolve("iterations.csv")).size());
    }

    @Test
    @DisplayName("driver killed with SIGKILL after checkpoint 2 → resume → byte-identical final results")
    void killedDriver() throws Exception {
        Path out = dir.resolve("killed");
        Process process = startAndAwaitCheckpoint(out, dir.resolve("killed.log"), 2);
        process.destroyForcibly();
        assertTrue(process.waitFor(30, TimeUnit.SECONDS));
        resumeAndCompare(out);
    }

    @Test
    @DisplayName("SIGTERM after checkpoint 2 → the iteration in flight finishes, a checkpoint, exit 75 → resume → byte-identical")
    void terminated() throws Exception {
        Path out = dir.resolve("terminated");
        Path log = dir.resolve("terminated.log");
        Process process = startAndAwaitCheckpoint(out, log, 2);
        process.destroy();
        assertTrue(process.waitFor(60, TimeUnit.SECONDS), "stopped within the grace period");
        String text = Files.readString(log);
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), text);
        assertTrue(text.contains("termination signal"), text);
        assertTrue(text.contains("Continue with: skerry resume " + out), text);
        resumeAndCompare(out);
    }

    /** chattr +i / -i: makes a folder immutable even for root (ext4, xfs …); false where unsupported. */
    private static boolean immutable(Path folder, boolean on) throws IOException, InterruptedException {
        Process chattr;
        try {
            chattr = new ProcessBuilder("chattr", on ? "+i" : "-i", folder.toString()).redirectErrorStream(true).start();
        } catch (IOException e) {
            return false;
        }
        return chattr.waitFor(10, TimeUnit.SECONDS) && chattr.exitValue() == 0;
    }

    @Test
    @DisplayName("run folder turns read-only after checkpoint 2: a clear error, exit 1, the last checkpoint intact → resume → byte-identical")
    void readOnlyRunFolder() throws Exception {
        Path probe = Files.createDirectories(dir.resolve("probe"));
        boolean supported = immutable(probe, true);
        if (supported) {
            boolean blocked = false;
            try {
                Files.createFile(probe.resolve("x"));
            } catch (IOException e) {
                blocked = true;
            }
            immutable(probe, false);
            supported = blocked;
        }
        assumeTrue(supported, "chattr +i is not available here: cannot simulate a read-only folder as root");

        Path out = dir.resolve("read-only");
        ExecutorService driver = Executors.newSingleThreadExecutor();
        try {
            Future<CheckpointResumeTest.Result> running = driver.submit(() -> CheckpointResumeTest.skerry(
                    args(out, "--set", "backend.kind=threads", "--set", "backend.threads=1")));
            Path manifest = out.resolve("checkpoints/iteration-000002/manifest.txt");
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
            while (!Files.exists(manifest)) {
                assertTrue(!running.isDone(), "the run ended before checkpoint 2");
                assertTrue(System.nanoTime() < deadline, "no checkpoint 2 within 120 s");
                Thread.sleep(20);
            }
            assertTrue(immutable(out, true) && immutable(out.resolve("checkpoints"), true));
            CheckpointResumeTest.Result result;
            try {
                result = running.get(120, TimeUnit.SECONDS);
            } finally {
                immutable(out.resolve("checkpoints"), false);
                immutable(out, false);
            }
            assertEquals(ExitCodes.RUN_FAILURE, result.exitCode(), result.err());
            assertTrue(result.err().contains("Operation not permitted") || result.err().contains("Permission denied")
                    || result.err().contains("cannot create"), result.err());
            assertTrue(result.err().matches("(?s).*the checkpoint of iteration [2-9] is intact.*"), result.err());
            assertTrue(result.err().contains("skerry resume " + out), result.err());
        } finally {
            driver.shutdownNow();
        }
        resumeAndCompare(out);
    }
}
