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
 * skerry killed or stopped while its workers run: SIGKILL leaves no worker and no file-mode program
 * (nor a child a program started) behind, and a SIGTERM stop resumed gives the bytes of an
 * undisturbed run. Faults are triggered by an observable event (a checkpoint's manifest appearing,
 * the programs' process ids written), never by a timer; the worker sleeps 1 ms a request so that a
 * run lasts long enough to be interrupted.
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

    private static Process startAndAwaitCheckpoint(Path out, Path log, Path pids, int iteration, String... settings)
            throws IOException, InterruptedException {
        List<String> arguments = new ArrayList<>(List.of("run", runFile.toString(), "--out", out.toString(),
                "--set", "model.program.environment.SKERRY_TEST_PIDS=" + pids));
        for (String setting : settings) {
            arguments.addAll(List.of("--set", setting));
        }
        Process process = ProgramProcess.start(log, arguments.toArray(String[]::new));
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

    /**
     * Whether {@code pid} still runs: a zombie has exited (only its new parent has not collected it
     * yet, which in a container's init can take a while), so it counts as gone.
     */
    static boolean alive(long pid) {
        try {
            String stat = Files.readString(Path.of("/proc", Long.toString(pid), "stat"));
            return !stat.substring(stat.lastIndexOf(')') + 2).startsWith("Z");
        } catch (IOException e) {
            return ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false);
        }
    }

    @Test
    @DisplayName("skerry killed with SIGKILL mid-run: every worker it started is gone within 10 s")
    void sigkillLeavesNoWorker() throws Exception {
        Path pids = Files.createDirectories(dir.resolve("pids-killed"));
        Path out = dir.resolve("killed");
        // A SIGKILLed skerry cannot remove its scratch folder: keep it in the test's folder, not /tmp.
        Process process = startAndAwaitCheckpoint(out, dir.resolve("killed.log"), pids, 1,
                "model.program.scratch=" + ProgramRunFiles.quote(dir.resolve("scratch-killed").toString()));
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
    @DisplayName("SIGTERM after checkpoint 1: exit 75, no worker left → resume with the program's file changed: "
            + "refused, naming model.program.files → resume with it restored → the undisturbed run's bytes")
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
        // The program's files join the settings a resume compares, by content, as data.file does.
        Path data = dir.resolve("data.csv");
        byte[] original = Files.readAllBytes(data);
        Files.writeString(data, Files.readString(data) + "1.25\n");
        CommandRunner.Result refused = CommandRunner.run("resume", out.toString(), "--set", "output.progress=off");
        Files.write(data, original);
        assertEquals(ExitCodes.BAD_INPUT, refused.exitCode(), refused.err());
        assertTrue(refused.err().contains("model.program.files was sha256:"), refused.err());
        assertFalse(Files.exists(out.resolve("summary.json")), "nothing written by the refused resume");
        CommandRunner.Result resumed = CommandRunner.run("resume", out.toString(), "--set", "output.progress=off");
        assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(undisturbed.resolve(name)), Files.readAllBytes(out.resolve(name)), name);
        }
        assertEquals(List.of(), ProgramRunFiles.workers(), "no worker outlives the resumed run");
    }

    @Test
    @DisplayName("skerry killed with SIGKILL during file-mode evaluations: every program it started, and the "
            + "child each program started (a wrapper script's), is gone within 10 s")
    void sigkillLeavesNoFileModeProgram() throws Exception {
        Path pids = Files.createDirectories(dir.resolve("pids-file-mode"));
        Path folder = Files.createDirectories(dir.resolve("file-mode"));
        Files.writeString(folder.resolve("input.tmpl"), "mu = {{mu}}\n");
        Path script = org.skerry.engine.program.PythonWorkers.SCRIPTS.resolve("file_faulty.sh");
        Path run = Files.writeString(folder.resolve("run.conf"), "name = file-mode-killed\nmodel.program {\n"
                + "  mode = file\n  command = [\"sh\", " + ProgramRunFiles.quote(script.toString()) + ", \"hang-many\"]\n"
                + "  input-template = \"input.tmpl\"\n  timeout = 10m\n"
                // A SIGKILLed skerry cannot remove its scratch folder: keep it in the test's folder, not /tmp.
                + "  scratch = " + ProgramRunFiles.quote(folder.resolve("scratch").toString()) + "\n"
                + "  environment { PIDS_DIR = " + ProgramRunFiles.quote(pids.toString()) + " }\n"
                + "  parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 1 } } ]\n}\n"
                + "sampler.particles = 20\nbackend { kind = threads, threads = 2 }\noutput.progress = off\n"
                + "checkpoint.enabled = false\n");
        Path log = dir.resolve("file-mode-killed.log");
        Process process = ProgramProcess.start(log, "run", run.toString(), "--out", folder.resolve("out").toString());
        List<Long> programs = new ArrayList<>();
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (programs.size() < 4) {
            assertTrue(process.isAlive(), "the run ended before its programs started: " + Files.readString(log));
            assertTrue(System.nanoTime() < deadline, "two file-mode programs did not start within 120 s");
            Thread.sleep(20);
            programs.clear();
            try (Stream<Path> files = Files.list(pids)) {
                for (Path file : files.filter(f -> f.toString().endsWith(".txt")).toList()) {
                    for (String pid : Files.readString(file).strip().split(" ")) {
                        programs.add(Long.parseLong(pid));
                    }
                }
            }
        }
        assertTrue(programs.stream().allMatch(ProgramFaultTest::alive),
                "programs and their children running when skerry is killed: " + programs);
        process.destroyForcibly();
        assertTrue(process.waitFor(30, TimeUnit.SECONDS));
        deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        try {
            for (long pid : programs) {
                while (alive(pid)) {
                    assertTrue(System.nanoTime() < deadline, "process " + pid + " (a file-mode program or its child) "
                            + "outlived skerry by 10 s");
                    Thread.sleep(20);
                }
            }
        } finally {
            programs.forEach(pid -> ProcessHandle.of(pid).ifPresent(ProcessHandle::destroyForcibly));
        }
    }
}
