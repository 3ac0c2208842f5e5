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
        List<String> command = List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve("normal_mean_summaries.py").toString(), "10", "1.0");
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
}
