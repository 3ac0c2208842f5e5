package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStream;
import java.io.RandomAccessFile;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledOnOs;
import org.junit.jupiter.api.condition.OS;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * The two ways the Python worker library (workers/python/skerry_worker.py) ends on its own, each
 * tested alone, so that a worker never outlives skerry even where the kernel's parent-death
 * signal is missing: it exits at the end of its standard input while its parent lives, and it
 * exits when its parent dies while its standard input stays open (the parent watch), even in the
 * middle of a long evaluation. The workers here are started with a plain {@link ProcessBuilder},
 * not skerry's launcher, so no parent-death signal is involved.
 */
@Slow
class WorkerLibraryExitTest {

    @TempDir
    Path folder;

    private Path data() throws IOException {
        return Files.writeString(folder.resolve("data.csv"), "# synthetic test data\ny\n0.5\n1.5\n");
    }

    private static ProcessBuilder builder(List<String> command) {
        ProcessBuilder builder = new ProcessBuilder(command).redirectError(ProcessBuilder.Redirect.DISCARD);
        builder.environment().putAll(PythonWorkers.environment());
        return builder;
    }

    private static List<String> worker(String... arguments) {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve("normal_mean.py").toString(), "2.0"));
        command.addAll(List.of(arguments));
        return command;
    }

    private String startMessage() throws IOException {
        return WorkerProtocol.start(List.of("mu"), List.of(data()), WorkerProtocol.REPLY_LOG_LIKELIHOOD);
    }

    /** Gone: no such process, or a zombie (it has exited; only its parent has not collected it). */
    private static boolean gone(long pid) {
        try {
            String stat = Files.readString(Path.of("/proc", Long.toString(pid), "stat"));
            return stat.substring(stat.lastIndexOf(')') + 2).startsWith("Z");
        } catch (IOException e) {
            return true;
        }
    }

    @Test
    @DisplayName("end of standard input, its parent alive: the worker exits with status 0")
    void exitsAtEndOfInput() throws Exception {
        Process process = builder(worker()).start();
        try {
            BufferedReader out = new BufferedReader(new InputStreamReader(process.getInputStream(), StandardCharsets.UTF_8));
            OutputStream in = process.getOutputStream();
            in.write(startMessage().getBytes(StandardCharsets.UTF_8));
            in.flush();
            assertEquals(WorkerProtocol.ready(), out.readLine(), "the worker completed the handshake");
            assertTrue(process.isAlive(), "a worker waits for requests while its input is open");
            in.close();
            assertTrue(process.waitFor(10, TimeUnit.SECONDS), "the worker exited within 10 s of the end of its input");
            assertEquals(0, process.exitValue(), "an orderly exit");
        } finally {
            process.destroyForcibly();
        }
    }

    @Test
    @EnabledOnOs(OS.LINUX)
    @DisplayName("its parent killed mid-evaluation, standard input still open: the worker exits within 10 s "
            + "(its evaluation would take 60 s)")
    void exitsWhenItsParentDies() throws Exception {
        Path fifo = folder.resolve("input.fifo");
        Process mkfifo = new ProcessBuilder("mkfifo", fifo.toString()).inheritIO().start();
        assertEquals(0, mkfifo.waitFor(), "mkfifo");
        // Opened read-write, which on Linux does not wait for a reader: this test holds the write
        // end until the end, so the worker never sees the end of its input.
        try (RandomAccessFile input = new RandomAccessFile(fifo.toFile(), "rw")) {
            List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                    PythonWorkers.SCRIPTS.resolve("parent_of_worker.py").toString(), fifo.toString()));
            command.addAll(worker("--sleep", "60"));
            Process parent = builder(command).start();
            long pid = -1;
            try {
                BufferedReader out = new BufferedReader(new InputStreamReader(parent.getInputStream(),
                        StandardCharsets.UTF_8));
                pid = Long.parseLong(out.readLine().strip());
                input.write(startMessage().getBytes(StandardCharsets.UTF_8));
                assertEquals(WorkerProtocol.ready(), out.readLine(), "the worker completed the handshake");
                StringBuilder request = new StringBuilder();
                WorkerProtocol.request(request, 1, 0, new double[] {0.25}, 1, 0, 1, new long[] {42});
                input.write(request.toString().getBytes(StandardCharsets.UTF_8));
                assertTrue(!gone(pid), "the worker runs while its parent lives");
                parent.destroyForcibly();
                assertTrue(parent.waitFor(10, TimeUnit.SECONDS), "the parent was killed");
                long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
                while (!gone(pid)) {
                    assertTrue(System.nanoTime() < deadline, "worker " + pid + " outlived its parent by 10 s");
                    Thread.sleep(20);
                }
            } finally {
                parent.destroyForcibly();
                if (pid > 0) {
                    ProcessHandle.of(pid).ifPresent(ProcessHandle::destroyForcibly);
                }
            }
        }
    }
}
