package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.skerry.cli.CommandRunner;

/**
 * Mistakes in {@code model.program}: each is bad input (exit 2) naming the file, line, key and
 * value, before any program starts and before anything is written.
 */
class ProgramRunFileTest {

    @TempDir
    Path folder;

    private static final String GOOD_COMMAND = "command = [\"python3\", \"./model.py\"]";
    private static final String GOOD_PARAMETERS =
            "parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 1 } } ]";

    @ParameterizedTest(name = "{0}")
    @DisplayName("a mistake in model.program: exit 2, located, nothing written")
    @CsvSource(delimiter = '|', value = {
        "command as a shell string | command = \"python3 model.py\" | " + "@P"
            + " | line 3: model.program.command = \"python3 model.py\": expected a list of text values",
        "no command | @none | @P | model.program.command: missing setting",
        "empty command | command = [] | @P | model.program.command = []: must name the program",
        "a misspelt key | @C | @P~comand = [\"x\"] | line 5: model.program.comand = [\"x\"]: unknown setting of a program model",
        "no parameters | @C | @none | model.program.parameters: missing setting",
        "parameters not a list | @C | parameters { mu = 1 } | model.program.parameters: expected a list of parameters",
        "a parameter without prior | @C | parameters = [ { name = mu } ] | model.program.parameters[0].prior: missing prior",
        "an unknown distribution | @C | parameters = [ { name = mu, prior { distribution = normall } } ] "
            + "| model.program.parameters[0].prior.distribution: unknown distribution 'normall'",
        "a bad name | @C | parameters = [ { name = \"m u\", prior { distribution = normal, mean = 0, sd = 1 } } ] "
            + "| model.program.parameters[0].name = \"m u\": a parameter name is letters",
        "a name twice | @C | " + "parameters = [ { name = mu, prior { distribution = normal, mean = 0, sd = 1 } }, "
            + "{ name = mu, prior { distribution = normal, mean = 0, sd = 1 } } ] | parameter 'mu' is declared twice",
        "batch zero | @C | @P~batch = 0 | model.program.batch = 0",
        "timeout not a duration | @C | @P~timeout = soon | model.program.timeout = \"soon\": expected a duration",
        "a missing file | @C | @P~files = [\"missing.csv\"] | model.program.files = [\"missing.csv\"]: file ",
        "a bad environment name | @C | @P~environment { \"1X\" = a } | an environment variable's name",
        "mode unknown | @C | @P~mode = daemon | model.program.mode = \"daemon\": must be one of worker, file",
    })
    void mistakes(String what, String command, String parameters, String expected) throws IOException {
        StringBuilder program = new StringBuilder();
        for (String part : new String[] {command.replace("@C", GOOD_COMMAND), parameters.replace("@P", GOOD_PARAMETERS)}) {
            if (!part.equals("@none")) {
                program.append(part.replace("@P", GOOD_PARAMETERS).replace("~", "\n")).append('\n');
            }
        }
        Path run = Files.writeString(folder.resolve("run.conf"), "name = mistake\nmodel.program {\n" + program
                + "}\noutput.progress = off\n");
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "run.conf", expected.strip());
        assertFalse(Files.exists(out), "nothing written");
    }

    @ParameterizedTest(name = "{0}")
    @DisplayName("model.program beside other model or data settings: exit 2, located")
    @CsvSource(delimiter = '|', value = {
        "with model.name | model.name = normal-mean | model.name = \"normal-mean\": set only one of model.name, model.class and model.program",
        "with data.file | data.file = data.csv | data.file = \"data.csv\": a program model reads its own files",
    })
    void conflicts(String what, String line, String expected) throws IOException {
        Files.writeString(folder.resolve("data.csv"), "y\n1\n");
        Path run = Files.writeString(folder.resolve("run.conf"), "name = conflict\nmodel.program {\n" + GOOD_COMMAND
                + "\n" + GOOD_PARAMETERS + "\n}\n" + line + "\noutput.progress = off\n");
        CommandRunner.assertBadInput(CommandRunner.run("run", run.toString(), "--out",
                folder.resolve("out").toString()), "run.conf", expected.strip());
    }

    @org.junit.jupiter.api.Test
    @DisplayName("a program that is not on PATH: exit 2 naming it, before anything is written")
    void missingProgram() throws IOException {
        Path run = Files.writeString(folder.resolve("run.conf"), "name = missing\nmodel.program {\n"
                + "command = [\"an-interpreter-that-is-not-installed\", \"model.py\"]\n" + GOOD_PARAMETERS
                + "\n}\noutput.progress = off\n");
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "cannot start the model program an-interpreter-that-is-not-installed "
                + "model.py: program 'an-interpreter-that-is-not-installed' is not on the PATH");
        assertFalse(Files.exists(out), "nothing written");
        assertEquals(0, org.skerry.engine.process.ProcessLauncher.liveCount());
    }

    @org.junit.jupiter.api.Test
    @org.skerry.engine.Slow
    @DisplayName("a relative model.program.scratch is read from the run file's folder, not the current folder: the "
            + "failed evaluations' folders are kept there, and run.conf names it by absolute path")
    void relativeScratchFromTheRunFilesFolder() throws IOException {
        Path runs = Files.createDirectories(folder.resolve("runs"));
        Files.writeString(runs.resolve("input.tmpl"), "mu = {{mu}}\n");
        Path script = org.skerry.engine.program.PythonWorkers.SCRIPTS.resolve("file_faulty.sh");
        Path run = Files.writeString(runs.resolve("run.conf"), "name = scratch\nmodel.program {\n  mode = file\n"
                + "  command = [\"sh\", " + ProgramRunFiles.quote(script.toString()) + ", \"exit\"]\n"
                + "  input-template = \"input.tmpl\"\n  scratch = \"scratch-here\"\n  keep-failed = 2\n  "
                + GOOD_PARAMETERS + "\n}\nsampler.particles = 20\nbackend.kind = threads\noutput.progress = off\n"
                + "checkpoint.enabled = false\noutput.report = false\n");
        Path out = folder.resolve("out");
        Path besideUs = Path.of("scratch-here").toAbsolutePath();
        assertFalse(Files.exists(besideUs), "no scratch-here in the current folder before the run");
        CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString());
        assertFalse(Files.exists(besideUs), "nothing made in the current folder " + besideUs.getParent());
        Path scratch = runs.resolve("scratch-here");
        assertTrue(Files.isDirectory(scratch), "scratch folder beside the run file; " + result.err());
        long kept;
        try (java.util.stream.Stream<Path> files = Files.walk(scratch)) {
            kept = files.filter(p -> p.getFileName().toString().equals("input.txt")).count();
        }
        assertEquals(2, kept, "keep-failed = 2 failed evaluations' folders kept in " + scratch);
        if (Files.exists(out.resolve("run.conf"))) {
            assertTrue(Files.readString(out.resolve("run.conf")).contains(scratch.toString()),
                    "run.conf names the scratch folder by absolute path");
        }
    }
}
