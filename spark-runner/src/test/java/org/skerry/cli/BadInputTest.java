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

/** Each kind of bad input: exit code 2, one clear message naming the place, no results written. */
class BadInputTest {

    @TempDir
    Path folder;

    private static final String GOOD = ConjugateRun.RUN_FILE;

    private Path write(String name, String text) throws IOException {
        Path file = folder.resolve(name);
        Files.writeString(file, text);
        return file;
    }

    private Path goodData() throws IOException {
        return write("data.csv", ConjugateRun.DATA);
    }

    private CommandRunner.Result expectBadInput(Path runFile, String... fragments) {
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, fragments);
        assertFalse(Files.exists(out.resolve("summary.json")), "no results written");
        return result;
    }

    @Test
    void goodFileRuns() throws IOException {
        goodData();
        Path out = folder.resolve("good");
        CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(Files.exists(out.resolve("summary.json")));
    }

    @Test
    @DisplayName("syntax error: file and line")
    void syntaxError() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD + "sampler { particles = \n"), "run.conf", "line 8");
    }

    @Test
    @DisplayName("unknown key: the closest valid key is suggested")
    void unknownKey() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD + "sampler.partcles = 10\n"), "run.conf: line 7",
                "unknown setting 'sampler.partcles'", "did you mean 'sampler.particles'");
    }

    @Test
    @DisplayName("unknown model setting: suggested from the model's own settings")
    void unknownModelSetting() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD + "model.settings.sigmaa = 1\n"), "sigmaa", "did you mean 'sigma'");
    }

    @Test
    @DisplayName("wrong type")
    void wrongType() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD + "sampler.particles = many\n"), "line 7", "sampler.particles",
                "expected a whole number");
    }

    @Test
    @DisplayName("value out of range")
    void outOfRange() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD + "sampler.resampling.threshold = 1.5\n"), "line 7",
                "sampler.resampling.threshold = 1.5", "(0.0, 1.0]");
    }

    @Test
    @DisplayName("an override on the command line is checked the same way")
    void badOverride() throws IOException {
        goodData();
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out", out.toString(),
                "--set", "sampler.particles=1");
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode());
        assertTrue(result.err().contains("--set sampler.particles=1") && result.err().contains("between 2"), result.err());
    }

    @Test
    @DisplayName("missing data file")
    void missingData() throws IOException {
        expectBadInput(write("run.conf", GOOD), "cannot read data file", "data.csv");
    }

    @Test
    @DisplayName("unreadable data file (a folder where a file should be)")
    void unreadableData() throws IOException {
        Files.createDirectories(folder.resolve("data.csv"));
        expectBadInput(write("run.conf", GOOD), "data.csv");
    }

    @Test
    @DisplayName("malformed CSV row: line number")
    void malformedRow() throws IOException {
        write("data.csv", "# synthetic\ny\n1.0\n2.0,3.0\n");
        expectBadInput(write("run.conf", GOOD), "data.csv", "line 4");
    }

    @Test
    @DisplayName("non-numeric value in the data")
    void nonNumeric() throws IOException {
        write("data.csv", "y\n1.0\nabc\n");
        expectBadInput(write("run.conf", GOOD), "line 3", "abc");
    }

    @Test
    @DisplayName("missing value in the data")
    void missingValue() throws IOException {
        write("data.csv", "y,x\n1.0,2\n,3\n");
        expectBadInput(write("run.conf", GOOD), "line 3");
    }

    @Test
    @DisplayName("unknown model name")
    void unknownModel() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD.replace("normal-mean", "normal-maen")), "unknown model 'normal-maen'",
                "did you mean 'normal-mean'");
    }

    @Test
    @DisplayName("model class not found")
    void classNotFound() throws IOException {
        goodData();
        expectBadInput(write("run.conf", GOOD.replace("name = normal-mean", "class = \"com.example.NoSuchModel\"")),
                "com.example.NoSuchModel", "not found");
    }

    @Test
    @DisplayName("output folder that cannot be written")
    void unwritableOutput() throws IOException {
        goodData();
        Path blocker = write("blocker", "a file, not a folder");
        CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out",
                blocker.resolve("run").toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("run folder") && result.err().contains("blocker"), result.err());
    }

    @Test
    @DisplayName("an output folder that already holds files is refused, and left as it was")
    void existingOutput() throws IOException {
        goodData();
        Path out = Files.createDirectories(folder.resolve("taken"));
        Files.writeString(out.resolve("notes.txt"), "keep me");
        CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out", out.toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode());
        assertEquals("keep me", Files.readString(out.resolve("notes.txt")));
        assertFalse(Files.exists(out.resolve("summary.json")));
    }

    @Test
    @DisplayName("a missing run file")
    void missingRunFile() {
        CommandRunner.Result result = CommandRunner.run("run", folder.resolve("nope.conf").toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode());
        assertTrue(result.err().contains("nope.conf") && result.err().contains("no such file"), result.err());
    }

    @Test
    @DisplayName("validate checks without running")
    void validate() throws IOException {
        goodData();
        CommandRunner.Result ok = CommandRunner.run("validate", write("run.conf", GOOD).toString());
        assertEquals(ExitCodes.SUCCESS, ok.exitCode(), ok.err());
        assertTrue(ok.out().contains("ok") && ok.out().contains("4 rows"), ok.out());
        CommandRunner.Result bad = CommandRunner.run("validate", write("bad.conf", GOOD + "sampler.seed = x\n").toString());
        assertEquals(ExitCodes.BAD_INPUT, bad.exitCode());
    }

    @Test
    @DisplayName("an unknown option is bad input too")
    void unknownOption() {
        assertEquals(ExitCodes.BAD_INPUT, CommandRunner.run("run", "--frobnicate").exitCode());
    }

    @Test
    @DisplayName("an unreachable Spark master: a clear error within the connect timeout, never a hang, nothing left")
    void unreachableMaster() throws IOException {
        goodData();
        int port;
        try (java.net.ServerSocket socket = new java.net.ServerSocket(0)) {
            port = socket.getLocalPort();
        }
        long start = System.nanoTime();
        CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out",
                folder.resolve("out").toString(), "--master", "spark://127.0.0.1:" + port,
                "--set", "backend.connect-timeout-seconds=3");
        double seconds = (System.nanoTime() - start) * 1e-9;
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("cannot reach the Spark master spark://127.0.0.1:" + port), result.err());
        assertTrue(seconds < 10, "gave up after " + seconds + " s");
        assertFalse(Files.exists(folder.resolve("out")), "no run folder, run.conf or .spark-scratch/ left");
    }
}
