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
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;
import org.skerry.engine.program.PythonWorkers;

/**
 * ABC runs whose simulator is a Python program replying with summaries (normal_mean_summaries.py),
 * through the command: the same bytes on threads and on Spark local mode with 3 partitions, and
 * the refusals of a summaries program outside ABC (exit 2, naming the key, nothing written).
 */
@Slow
class ProgramAbcRunTest {

    @TempDir
    Path folder;

    private Path write(String name, String sequence, String... more) throws IOException {
        return write(name, List.of(), sequence, more);
    }

    private Path write(String name, List<String> scriptArguments, String sequence, String... more) throws IOException {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve("normal_mean_summaries.py").toString(), "10", "1.0"));
        command.addAll(scriptArguments);
        List<String> quoted = new ArrayList<>();
        command.forEach(c -> quoted.add(ProgramRunFiles.quote(c)));
        StringBuilder text = new StringBuilder("name = program-abc\n");
        text.append("model.program {\n  command = [").append(String.join(", ", quoted)).append("]\n");
        text.append("  environment { SKERRY_WORKER_LIBRARY = ").append(ProgramRunFiles.quote(
                PythonWorkers.LIBRARY.toString())).append(" }\n");
        text.append("  summaries = [mean]\n");
        text.append("  parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 3 } } ]\n}\n");
        text.append("sampler { particles = 200, seed = 12, sequence = ").append(sequence).append('\n');
        text.append("  abc { final-tolerance = 0.2, distance-weights { mean = 1 }, observed { mean = 1.1 } } }\n");
        text.append("output.progress = off\noutput.report = false\ncheckpoint.enabled = false\n");
        for (String line : more) {
            text.append(line).append('\n');
        }
        return Files.writeString(folder.resolve(name + ".conf"), text.toString());
    }

    private CommandRunner.Result run(Path runFile, String out, String... sets) {
        List<String> args = new ArrayList<>(List.of("run", runFile.toString(), "--out=" + folder.resolve(out)));
        for (String set : sets) {
            args.add("--set");
            args.add(set);
        }
        return CommandRunner.run(args.toArray(new String[0]));
    }

    @Test
    @DisplayName("a Python summaries worker under ABC: the same bytes on threads (2) and Spark local mode with 3 "
            + "partitions; no worker outlives its run")
    void sameBytes() throws IOException {
        Path runFile = write("abc", "abc");
        CommandRunner.Result threads = run(runFile, "threads", "backend.kind=threads", "backend.threads=2");
        assertEquals(ExitCodes.SUCCESS, threads.exitCode(), threads.err());
        assertTrue(threads.out().contains("tolerance 0.200000 reached"), threads.out());
        CommandRunner.Result spark = run(runFile, "spark", "backend.kind=spark", "backend.master=local[2]",
                "backend.partitions=3");
        assertEquals(ExitCodes.SUCCESS, spark.exitCode(), spark.err());
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(folder.resolve("threads").resolve(file)),
                    Files.readAllBytes(folder.resolve("spark").resolve(file)), "spark/" + file);
        }
        assertTrue(Files.readString(folder.resolve("threads/summary.json")).contains("\"invalid_evaluations\" : 0")
                || Files.readString(folder.resolve("threads/summary.json")).contains("\"invalid_evaluations\": 0"),
                "no invalid simulation");
        assertEquals(List.of(), ProcessHandle.current().descendants()
                .filter(p -> p.info().commandLine().orElse("").contains("normal_mean_summaries.py")).toList(),
                "no worker outlives its run");
    }

    @Test
    @DisplayName("requests of 7 particles replying with summaries (the worker's batched form), M = 2: the bytes "
            + "of one particle a request, on threads and on Spark local mode with 3 partitions")
    void batchedSameBytes() throws IOException {
        String m2 = "sampler.abc.simulations-per-particle = 2";
        CommandRunner.Result single = run(write("single", "abc", m2), "single", "backend.kind=threads",
                "backend.threads=2");
        assertEquals(ExitCodes.SUCCESS, single.exitCode(), single.err());
        Path sizes = folder.resolve("batch-sizes.txt");
        Path batched = write("batched", List.of("--batched"), "abc", m2, "model.program.batch = 7",
                "model.program.environment.SKERRY_TEST_BATCHES = " + ProgramRunFiles.quote(sizes.toString()));
        CommandRunner.Result threads = run(batched, "batched-threads", "backend.kind=threads", "backend.threads=2");
        assertEquals(ExitCodes.SUCCESS, threads.exitCode(), threads.err());
        CommandRunner.Result spark = run(batched, "batched-spark", "backend.kind=spark", "backend.master=local[2]",
                "backend.partitions=3");
        assertEquals(ExitCodes.SUCCESS, spark.exitCode(), spark.err());
        // M = 2 simulations a particle: requests of 7 vectors (a few smaller at the ends of a block).
        List<Integer> requests = Files.readAllLines(sizes).stream().map(Integer::parseInt).toList();
        assertEquals(7, requests.stream().mapToInt(Integer::intValue).max().orElse(0), "requests of up to 7");
        assertTrue(requests.stream().filter(k -> k == 7).count() > requests.size() / 2, "mostly full requests");
        for (String out : List.of("batched-threads", "batched-spark")) {
            for (String file : List.of("summary.json", "particles.csv")) {
                assertArrayEquals(Files.readAllBytes(folder.resolve("single").resolve(file)),
                        Files.readAllBytes(folder.resolve(out).resolve(file)), out + "/" + file);
            }
        }
    }

    @Test
    @DisplayName("a summaries program with likelihood tempering, or in file mode: exit 2 naming "
            + "model.program.summaries and its line, nothing written")
    void refusals() throws IOException {
        CommandRunner.Result tempering = run(write("tempering", "likelihood-tempering"), "tempering");
        assertEquals(ExitCodes.BAD_INPUT, tempering.exitCode(), tempering.err());
        assertTrue(tempering.err().contains("tempering.conf: line 5") && tempering.err().contains(
                "model.program.summaries") && tempering.err().contains("sampler.sequence = abc"), tempering.err());
        assertFalse(tempering.err().contains("\tat "), "no stack trace");
        assertFalse(Files.exists(folder.resolve("tempering")), "nothing written");

        Path template = Files.writeString(folder.resolve("input.template"), "mu = {{mu}}\n");
        CommandRunner.Result file = run(write("file", "abc", "model.program.mode = file",
                "model.program.input-template = " + ProgramRunFiles.quote(template.toString())), "file");
        assertEquals(ExitCodes.BAD_INPUT, file.exitCode(), file.err());
        assertTrue(file.err().contains("model.program.summaries") && file.err().contains("worker mode"), file.err());
        assertFalse(Files.exists(folder.resolve("file")), "nothing written");
    }

    @Test
    @DisplayName("a program replying with two numbers for its one summary: known only from its replies, so the run "
            + "fails at iteration 0 (exit 1), naming the counts and the key, no stack trace, no worker left")
    void wrongSummaryCount() throws IOException {
        CommandRunner.Result result = run(write("wrong", List.of("--wrong-count"), "abc"), "wrong",
                "sampler.particles=20", "backend.kind=threads", "backend.threads=1");
        assertEquals(ExitCodes.RUN_FAILURE, result.exitCode(), result.err());
        assertTrue(result.err().contains("iteration 0") && result.err().contains("carried 2 numbers")
                && result.err().contains("model.program.summaries names 1 [mean]"), result.err());
        assertTrue(result.err().contains("make the two agree"), result.err());
        assertFalse(result.err().contains("raise sampler.max-invalid-fraction"), "no advice to hide it");
        assertFalse(result.err().contains("\tat "), "no stack trace");
        assertFalse(Files.exists(folder.resolve("wrong/summary.json")), "no result");
        assertEquals(List.of(), ProcessHandle.current().descendants()
                .filter(p -> p.info().commandLine().orElse("").contains("normal_mean_summaries.py")).toList(),
                "no worker outlives its run");
    }

    @Test
    @DisplayName("SIGTERM after checkpoint 1 of a program-simulator ABC run: exit 75, no worker left → resume → the "
            + "undisturbed run's bytes, tolerance columns included")
    void terminatedThenResumed() throws Exception {
        // Each request sleeps 1 ms so the run lasts long enough to be stopped; the stop is triggered
        // by checkpoint 1's manifest appearing, never by a timer.
        Path runFile = write("stopped", List.of("--sleep", "0.001"), "abc", "checkpoint.enabled = true",
                "output.progress = log", "backend { kind = threads, threads = 2 }");
        CommandRunner.Result whole = run(runFile, "undisturbed");
        assertEquals(ExitCodes.SUCCESS, whole.exitCode(), whole.err());
        List<String> rows = Files.readAllLines(folder.resolve("undisturbed/iterations.csv"));
        assertTrue(rows.size() >= 5, "iterations after checkpoint 1 for the stop to land in: " + rows.size());

        Path pids = Files.createDirectories(folder.resolve("pids"));
        Path out = folder.resolve("stopped");
        Path log = folder.resolve("stopped.log");
        Process process = org.skerry.cli.ProgramProcess.start(log, "run", runFile.toString(), "--out", out.toString(),
                "--set", "model.program.environment.SKERRY_TEST_PIDS=" + pids);
        Path manifest = out.resolve("checkpoints/iteration-000001/manifest.txt");
        long deadline = System.nanoTime() + java.util.concurrent.TimeUnit.SECONDS.toNanos(120);
        while (!Files.exists(manifest)) {
            assertTrue(process.isAlive(), "the run ended before its checkpoint 1: " + Files.readString(log));
            assertTrue(System.nanoTime() < deadline, "no checkpoint 1 within 120 s");
            Thread.sleep(20);
        }
        process.destroy();
        assertTrue(process.waitFor(60, java.util.concurrent.TimeUnit.SECONDS), "stopped within the grace period");
        assertEquals(ExitCodes.STOPPED_RESUMABLE, process.exitValue(), Files.readString(log));
        try (java.util.stream.Stream<Path> files = Files.list(pids)) {
            List<Path> written = files.toList();
            assertFalse(written.isEmpty(), "the workers wrote their process ids");
            for (Path file : written) {
                long pid = Long.parseLong(Files.readString(file).strip());
                assertFalse(ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false),
                        "worker " + pid + " outlived the stopped run");
            }
        }
        assertFalse(Files.exists(out.resolve("summary.json")), "the stop landed before the run ended");
        CommandRunner.Result resumed = CommandRunner.run("resume", out.toString(), "--set", "output.progress=off");
        assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
        for (String file : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(folder.resolve("undisturbed").resolve(file)),
                    Files.readAllBytes(out.resolve(file)), file);
        }
        assertEquals(abcColumns(folder.resolve("undisturbed")), abcColumns(out), "tolerance columns");
        assertEquals(List.of(), ProcessHandle.current().descendants()
                .filter(p -> p.info().commandLine().orElse("").contains("normal_mean_summaries.py")).toList(),
                "no worker outlives the resumed run");
    }

    /** The iteration, tolerance, share and simulation columns of a run folder's iterations.csv. */
    private static List<String> abcColumns(Path run) throws IOException {
        return Files.readAllLines(run.resolve("iterations.csv")).stream().map(row -> {
            String[] cells = row.split(",", -1);
            return cells[0] + "," + String.join(",", java.util.Arrays.copyOfRange(cells, cells.length - 3, cells.length));
        }).toList();
    }
}
