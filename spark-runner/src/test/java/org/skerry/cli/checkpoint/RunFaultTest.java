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
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.ProgramProcess;
import org.skerry.engine.Slow;

/**
 * The driver process killed, told to stop (SIGTERM, Ctrl-C once or twice) mid-run, or its run
 * folder turned read-only, then resumed: the final files are byte for byte those of an undisturbed
 * run, and a stop on request says how to continue without a failure's noise. Each fault is triggered by an observable event — the
 * checkpoint of iteration 2 appearing — never by a timer. The runs use the demo's ODE model at
 * small N, whose iterations take long enough that the fault lands before the run ends (checked).
 */
@Slow
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

    /**
     * As {@link #startAndAwaitCheckpoint}, with SIGINT at its default disposition so that the
     * program sees Ctrl-C; skipped where it cannot be had (a JVM started with SIGINT ignored, and
     * no {@code env --default-signal}).
     */
    private static Process startInterruptibleAndAwaitCheckpoint(Path out, Path log, int iteration, String... more)
            throws IOException, InterruptedException {
        Process process = ProgramProcess.startInterruptible(log, args(out, more));
        if (ProgramProcess.ignoresInterrupt(process)) {
            process.destroyForcibly();
            process.waitFor(30, TimeUnit.SECONDS);
            assumeTrue(false, "the program was started with SIGINT ignored (inherited, and this system's env cannot "
                    + "reset it): Ctrl-C cannot be tested here");
        }
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

    private static void awaitLog(Path log, String text, Process process) throws IOException, InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (!Files.readString(log).contains(text)) {
            assertTrue(process.isAlive(), "the program ended before saying \"" + text + "\": " + Files.readString(log));
            assertTrue(System.nanoTime() < deadline, "no \"" + text + "\" within 30 s: " + Files.readString(log));
            Thread.sleep(20);
        }
    }

    /** A stop on request is no failure: no "the run failed", no exception or stack trace, no error lines from Spark. */
    private static void assertQuiet(String log) {
        for (String noise : new String[] {"the run failed", "Exception", "\tat ", " ERROR "}) {
            assertFalse(log.contains(noise), "the log of a stop shows \"" + noise + "\":\n" + log);
        }
    }

    private static int newestManifest(Path out) throws IOException {
        try (Stream<Path> folders = Files.list(out.resolve("checkpoints"))) {
            return folders.filter(f -> Files.exists(f.resolve("manifest.txt")))
                    .mapToInt(f -> Integer.parseInt(f.getFileName().toString().substring("iteration-".length())))
                    .max().orElse(-1);
        }
    }

    private static void resumeAndCompare(Path out) throws IOException {
        resumeAndCompare(out, "");
    }

    /** Resumes the run in {@code out}, checks the final files against the undisturbed run's and the resume's log for {@code said}. */
    private static void resumeAndCompare(Path out, String said) throws IOException {
        assertFalse(Files.exists(out.resolve("summary.json")), "the fault landed before the run ended");
        CheckpointResumeTest.Result resumed = CheckpointResumeTest.skerry("resume", out.toString(),
                "--set", "output.progress=off");
        assertEquals(0, resumed.exitCode(), resumed.err());
        assertTrue(resumed.err().contains(said), resumed.err());
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

    @Test
    @DisplayName("Ctrl-C on Spark after checkpoint 2 → the iteration in flight finishes, a complete checkpoint, "
            + "exit 75, the resume line and no Spark errors")
    void interrupted() throws Exception {
        Path out = dir.resolve("interrupted");
        Path log = dir.resolve("interrupted.log");
        Process process = startInterruptibleAndAwaitCheckpoint(out, log, 2);
        ProgramProcess.signal(process, "INT");
        assertTrue(process.waitFor(60, TimeUnit.SECONDS), "stopped within the grace period");
        String text = Files.readString(log);
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), text);
        assertTrue(text.contains("interrupt (Ctrl-C): finishing the iteration in flight"), text);
        assertTrue(text.contains("press Ctrl-C again to stop at once"), text);
        assertTrue(text.matches("(?s).*stopped after iteration [2-9]: an interrupt \\(Ctrl-C, SIGINT\\) arrived.*"), text);
        assertTrue(text.contains("Continue with: skerry resume " + out), text);
        assertQuiet(text);
        // A clean checkpoint of the iteration it stopped after (resuming from one is what `terminated` checks).
        java.util.regex.Matcher stopped = java.util.regex.Pattern.compile("stopped after iteration (\\d+)").matcher(text);
        assertTrue(stopped.find(), text);
        assertEquals(Integer.parseInt(stopped.group(1)), newestManifest(out), text);
        try (Stream<Path> left = Files.walk(out.resolve("checkpoints"))) {
            assertTrue(left.noneMatch(p -> p.toString().endsWith(".tmp")), "no temporary files left");
        }
        assertFalse(Files.exists(out.resolve("summary.json")));
    }

    @Test
    @DisplayName("Ctrl-C twice on threads → abandoned at once, exit 75, the log says what is kept and how to continue; "
            + "what an interrupted checkpoint write leaves is removed on resume → byte-identical")
    void interruptedTwice() throws Exception {
        Path out = dir.resolve("interrupted-twice");
        Path log = dir.resolve("interrupted-twice.log");
        Process process = startInterruptibleAndAwaitCheckpoint(out, log, 2, "--set", "backend.kind=threads");
        // The progress line comes after the checkpoint: iteration 3 is in flight then, and both
        // presses land in it (each signal reaches its handler on a thread of its own).
        awaitLog(log, " iter 2 ", process);
        ProgramProcess.signal(process, "INT");
        ProgramProcess.signal(process, "INT");
        assertTrue(process.waitFor(20, TimeUnit.SECONDS), "stopped at once");
        String text = Files.readString(log);
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), text);
        assertTrue(text.contains("press Ctrl-C again"), text);
        int kept = newestManifest(out);
        assertTrue(text.contains("second interrupt (Ctrl-C): abandoning the iteration in flight at once. The run stops "
                + "on the checkpoint of iteration " + kept + "; the work since is lost"), text);
        assertTrue(text.contains("Continue with: skerry resume " + out), text);
        assertQuiet(text);

        // What a process ended in the middle of a checkpoint write leaves: a folder without a
        // manifest holding temporary block files, and (a retried task) a temporary file beside a
        // complete checkpoint's files.
        Path unfinished = Files.createDirectories(out.resolve(String.format("checkpoints/iteration-%06d", kept + 1)));
        Files.writeString(unfinished.resolve("_block-00000.bin.0b6c7e1e-interrupted.tmp"), "half a block");
        Files.writeString(out.resolve(String.format("checkpoints/iteration-%06d/_block-00001.bin.5d1f-retried.tmp", kept)),
                "half a block");
        resumeAndCompare(out, "removed what an interrupted checkpoint write left");
        try (Stream<Path> left = Files.walk(out.resolve("checkpoints"))) {
            assertTrue(left.noneMatch(p -> p.toString().endsWith(".tmp")), "no temporary files left");
        }
    }

    @Test
    @DisplayName("SIGTERM with a grace period too short for the iteration in flight → abandoned, exit 75, the log "
            + "says so, what is kept and how to continue, with no Spark errors")
    void graceTooShort() throws Exception {
        Path out = dir.resolve("grace-too-short");
        Path log = dir.resolve("grace-too-short.log");
        // A 1 s grace period leaves 0.83 s for the iteration in flight; the demo's take seconds here.
        Process process = startAndAwaitCheckpoint(out, log, 2, "--set", "limits.stop-grace-seconds=1");
        awaitLog(log, " iter 2 ", process); // after the checkpoint: iteration 3 is in flight
        process.destroy();
        assertTrue(process.waitFor(30, TimeUnit.SECONDS), "stopped at once");
        String text = Files.readString(log);
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), text);
        assertTrue(text.matches("(?s).*termination signal: (the iteration in flight needs about \\d+ s more, more than "
                + "the 1 s grace period \\(limits.stop-grace-seconds\\); abandoning it|the grace period is nearly "
                + "over; abandoning the iteration in flight)\\. The run stops on the checkpoint of iteration "
                + newestManifest(out) + "; the work since is lost and will be done again\\. Continue with: skerry resume "
                + java.util.regex.Pattern.quote(out.toString()) + ".*"), text);
        assertQuiet(text);
        assertFalse(Files.exists(out.resolve("summary.json")));
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
