package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;
import org.skerry.engine.process.ProcessLauncher;
import org.skerry.engine.program.PythonWorkers;

/**
 * {@code skerry validate} on a program model starts the program and completes the handshake, as a
 * run does before iteration 0: a program that cannot start is bad input (exit 2) with its own
 * standard error, and no process or scratch folder is left behind either way.
 * Slow: most tests start Python.
 */
@Slow
class ProgramValidateTest {

    @TempDir
    Path folder;

    private Path runFile(List<String> command, String... more) throws IOException {
        Files.writeString(folder.resolve("data.csv"), "# synthetic test data\ny\n0.5\n1.5\n");
        List<String> quoted = new ArrayList<>();
        command.forEach(c -> quoted.add(ProgramRunFiles.quote(c)));
        StringBuilder text = new StringBuilder("name = validate\nmodel.program {\n  command = [")
                .append(String.join(", ", quoted)).append("]\n  files = [\"data.csv\"]\n")
                .append("  environment { SKERRY_WORKER_LIBRARY = ")
                .append(ProgramRunFiles.quote(PythonWorkers.LIBRARY.toString())).append(" }\n")
                .append("  scratch = \"scratch\"\n")
                .append("  parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 1 } } ]\n}\n")
                .append("backend.kind = threads\n");
        for (String line : more) {
            text.append(line).append('\n');
        }
        return Files.writeString(folder.resolve("run.conf"), text.toString());
    }

    private static List<String> script(String name, String... arguments) {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve(name).toString()));
        command.addAll(List.of(arguments));
        return command;
    }

    @AfterEach
    void nothingLeft() throws IOException {
        assertEquals(0, ProcessLauncher.liveCount(), "no program process left");
        Path scratch = folder.resolve("scratch");
        if (Files.isDirectory(scratch)) {
            try (var inside = Files.list(scratch)) {
                assertEquals(List.of(), inside.toList(), "no worker scratch folder left");
            }
        }
    }

    @Test
    @DisplayName("a working program: validate starts it, it says ready, exit 0, and it is gone afterwards")
    void workingProgram() throws IOException {
        CommandRunner.Result result = CommandRunner.run("validate", runFile(script("normal_mean.py", "2.0")).toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("program:    started, and said it was ready (protocol 1)"), result.out());
        assertEquals(List.of(), ProgramRunFiles.workers(), "the trial worker ended");
    }

    @ParameterizedTest(name = "{0}")
    @DisplayName("a program that cannot start: exit 2 with its reason and its standard error, no stack trace")
    @CsvSource(delimiter = '|', value = {
        "an import error | import-error | exited with status 1 before saying it was ready | a_module_that_is_not_installed",
        "exits at once | silent | exited with status 5 | faulty worker starting: silent",
        "another protocol version | version | it speaks protocol version 2; this skerry speaks version 1 | faulty worker starting: version",
        "a banner on standard output | chatty | its first line was 'Welcome to the simulator 1.0' | faulty worker starting: chatty",
    })
    void cannotStart(String what, String behaviour, String reason, String stderr) throws IOException {
        CommandRunner.Result result = CommandRunner.run("validate", runFile(script("faulty.py", behaviour)).toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        String message = result.err();
        assertTrue(message.startsWith("skerry: bad input:"), message);
        assertTrue(message.contains("did not start as a worker"), message);
        assertTrue(message.contains(reason), "'" + reason + "' in: " + message);
        assertTrue(message.contains(stderr), "the program's standard error '" + stderr + "' in: " + message);
        assertFalse(message.contains("\tat org.skerry"), "no stack trace: " + message);
        assertFalse(result.out().contains(": ok"), result.out());
    }

    @Test
    @DisplayName("a missing interpreter: exit 2 naming it and the PATH it was looked for on")
    void missingInterpreter() throws IOException {
        CommandRunner.Result result = CommandRunner.run("validate",
                runFile(List.of("an-interpreter-that-is-not-installed", "model.py")).toString());
        CommandRunner.assertBadInput(result, "program 'an-interpreter-that-is-not-installed' is not on the PATH");
    }

    @Test
    @DisplayName("a run for a cluster: the program is not started on this machine (the executors check it)")
    void clusterRunIsCheckedOnTheExecutors() throws IOException {
        CommandRunner.Result result = CommandRunner.run("validate",
                runFile(List.of("an-interpreter-that-is-not-installed", "model.py"), "backend.kind = spark",
                        "backend.master = \"spark://127.0.0.1:7077\"").toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("program:    not started here"), result.out());
    }

    @Test
    @DisplayName("skerry run with a program that cannot start: exit 2 before iteration 0, its standard error shown, "
            + "no run folder written")
    void runRefusesTooBeforeIterationZero() throws IOException {
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", runFile(script("faulty.py", "import-error")).toString(),
                "--out", out.toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("a_module_that_is_not_installed"), result.err());
        assertFalse(result.err().contains("\tat org.skerry"), "no stack trace: " + result.err());
        assertFalse(Files.exists(out), "nothing written");
    }
}
