package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.skerry.engine.Slow;

/**
 * Bad input that used to slip through (issue 11, section 5), each through the command: exit code
 * 2, one message naming the file, line, key and value, and nothing written — no run folder, no
 * {@code run.conf}, no {@code .spark-scratch/}.
 */
class SlippedInputTest {

    @TempDir
    Path folder;

    private static final String GOOD = ConjugateRun.RUN_FILE;

    private Path write(String name, String text) throws IOException {
        Path file = folder.resolve(name);
        Files.createDirectories(file.getParent());
        Files.writeString(file, text);
        return file;
    }

    private void goodData() throws IOException {
        write("data.csv", ConjugateRun.DATA);
    }

    /** Runs {@code skerry run FILE --out out [more…]} and checks it is bad input that wrote nothing. */
    private String expectBadRun(Path runFile, List<String> more, String... fragments) {
        Path out = folder.resolve("out");
        List<String> args = new java.util.ArrayList<>(List.of("run", runFile.toString(), "--out", out.toString()));
        args.addAll(more);
        CommandRunner.Result result = CommandRunner.run(args.toArray(String[]::new));
        CommandRunner.assertBadInput(result, fragments);
        assertFalse(Files.exists(out), "nothing written: " + out);
        return result.err();
    }

    private String expectBadRun(Path runFile, String... fragments) {
        return expectBadRun(runFile, List.of(), fragments);
    }

    @Test
    @DisplayName("sampler.seed = 1.5 is refused, not run as seed 1")
    void fractionalSeed() throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "sampler.seed = 1.5\n"), "run.conf: line 7", "sampler.seed = 1.5",
                "expected a whole number");
    }

    @Test
    @DisplayName("sampler.moves.target-acceptance must be auto or a number in (0, 1)")
    void targetAcceptance() throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "sampler.moves.target-acceptance = fast\n"), "run.conf: line 7",
                "sampler.moves.target-acceptance", "auto");
    }

    @Test
    @DisplayName("sampler.particles = 200.7 is refused, not truncated to 200")
    void fractionalParticles() throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "sampler.particles = 200.7\n"), "run.conf: line 7",
                "sampler.particles = 200.7", "expected a whole number");
    }

    @ParameterizedTest
    @ValueSource(strings = {"9223372036854775808", "18446744073709551615", "-9223372036854775809", "1e30"})
    @DisplayName("a seed the random streams cannot key (2^63 and beyond, 1e30) is refused, not clamped")
    void seedOutOfRange(String seed) throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "sampler.seed = " + seed + "\n"), "run.conf: line 7", "sampler.seed = ",
                "from -9223372036854775808 to 9223372036854775807");
    }

    @Test
    @Slow
    @DisplayName("the seeds at either end of the range run, and run.conf and summary.json hold the same seed")
    void seedRangeEnds() throws IOException {
        goodData();
        for (String seed : List.of("-9223372036854775808", "9223372036854775807")) {
            Path out = folder.resolve("seed" + seed);
            CommandRunner.Result result = CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out",
                    out.toString(), "--set", "sampler.seed=" + seed, "--set", "sampler.particles=20");
            assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
            assertTrue(Files.readString(out.resolve("run.conf")).contains("seed=" + seed), "run.conf");
            assertTrue(java.util.regex.Pattern.compile("\"seed\": " + seed + "\\s*[,}]")
                    .matcher(Files.readString(out.resolve("summary.json"))).find(), "summary.json");
        }
    }

    @Test
    @DisplayName("include of a missing file is refused at the include's line")
    void missingInclude() throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "include \"missing.conf\"\n"), "run.conf: line 7",
                "include \"missing.conf\"", "no such file");
    }

    @Test
    @DisplayName("a data role bound to a column the model never reads is refused")
    void unreadRole() throws IOException {
        goodData();
        expectBadRun(write("run.conf", GOOD + "data.columns { z = \"y\" }\n"), "run.conf: line 7",
                "data.columns.z = \"y\"", "reads no data role 'z'");
    }

    @Test
    @DisplayName("resume of a finished run checks --set as any resume does, then says there is nothing to do")
    void resumeFinishedRun() throws IOException {
        goodData();
        Path run = folder.resolve("finished");
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("run", write("run.conf", GOOD).toString(), "--out",
                run.toString(), "--set", "sampler.particles=20").exitCode());
        CommandRunner.assertBadInput(CommandRunner.run("resume", run.toString(), "--set", "sampler.bogus=1"),
                "--set sampler.bogus=1", "unknown setting 'sampler.bogus'");
        CommandRunner.assertBadInput(CommandRunner.run("resume", run.toString(), "--set", "sampler.particles=500"),
                "sampler.particles was 20, now 500");
        CommandRunner.Result neutral = CommandRunner.run("resume", run.toString(), "--set", "backend.threads=2");
        assertEquals(ExitCodes.SUCCESS, neutral.exitCode(), neutral.err());
        assertTrue(neutral.out().contains("nothing to resume"), neutral.out());
    }

    @Test
    @DisplayName("backend.master = \"foo://bar\" is refused by validate, and by run before anything is written")
    void invalidMaster() throws IOException {
        goodData();
        Path file = write("run.conf", GOOD.replace("backend.kind = threads", "backend { kind = spark, master = \"foo://bar\" }"));
        CommandRunner.assertBadInput(CommandRunner.run("validate", file.toString()), "run.conf: line 6",
                "backend.master = \"foo://bar\"", "not a Spark master", "spark://host:port");
        expectBadRun(file, "run.conf: line 6", "backend.master = \"foo://bar\"");
    }

    @Test
    @DisplayName("tasks per executor on a cluster master without the executors' cores, or cores that are no number: "
            + "refused at the line, nothing written")
    void tasksPerExecutorWithoutCores() throws IOException {
        goodData();
        Path file = write("run.conf", GOOD.replace("backend.kind = threads",
                "backend { kind = spark, master = \"spark://127.0.0.1:7077\", tasks = per-executor }"));
        CommandRunner.assertBadInput(CommandRunner.run("validate", file.toString()), "run.conf: line 6",
                "backend.tasks", "spark.executor.cores", "per-block");
        expectBadRun(file, "run.conf: line 6", "backend.tasks");
        Path cores = write("cores.conf", GOOD.replace("backend.kind = threads",
                "backend { kind = spark, master = \"local[2]\", spark { \"spark.executor.cores\" = two } }"));
        expectBadRun(cores, "cores.conf: line 6", "spark.executor.cores", "a number of cores");
    }

    @Test
    @DisplayName("an empty run file names itself, not the jar's reference.conf")
    void emptyRunFile() throws IOException {
        String message = expectBadRun(write("empty.conf", "# nothing yet\n"), "empty.conf: the run file is empty",
                "model.name");
        assertFalse(message.contains("reference.conf:"), message);
    }

    @Test
    @DisplayName("a folder given as the run file is called a folder")
    void folderAsRunFile() throws IOException {
        Path dir = Files.createDirectories(folder.resolve("analysis.conf"));
        expectBadRun(dir, "analysis.conf", "it is a folder");
    }

    @Test
    @DisplayName("particles = 1e12 is a whole number out of range: the range is given")
    void particlesOutOfRange() throws IOException {
        goodData();
        String message = expectBadRun(write("run.conf", GOOD + "sampler.particles = 1e12\n"), "run.conf: line 7",
                "sampler.particles", "must be between 2 and 100000000");
        assertFalse(message.contains("whole number"), message);
    }

    @Test
    @DisplayName("a missing brace is called a brace, with the line of the '{' left open")
    void missingBrace() throws IOException {
        goodData();
        String message = expectBadRun(write("run.conf", GOOD + "sampler {\n  particles = 10\n"), "run.conf: line 7",
                "this '{' is never closed", "before its '}'");
        assertFalse(message.contains("parenthes"), message);
    }

    @Test
    @DisplayName("--set sampler=5 says sampler is a group of settings, without a merge dump")
    void groupSetAsValue() throws IOException {
        goodData();
        String message = expectBadRun(write("run.conf", GOOD), List.of("--set", "sampler=5"), "--set sampler=5",
                "sampler = 5", "sampler is a group of settings", "e.g. sampler.");
        assertFalse(message.contains("merge of"), message);
    }

    @ParameterizedTest
    @ValueSource(strings = {";", "\t"})
    @DisplayName("a semicolon- or tab-separated data file gets a hint about the separator")
    void separatorHint(String separator) throws IOException {
        write("data.csv", "x" + separator + "y\n1" + separator + "1.2\n2" + separator + "0.7\n");
        expectBadRun(write("run.conf", GOOD), "data.csv line 2", "is not a number",
                separator.equals(";") ? "separated by semicolons" : "separated by tabs", "comma-separated");
    }

    @Test
    @DisplayName("a batch whose dataset file is missing is bad input up front (exit 2), not a failed analysis")
    void batchWithMissingDataset() throws IOException {
        goodData();
        write("base.conf", GOOD);
        Path batch = write("batch.conf", "base = base.conf\ndatasets.files = [\n  data.csv,\n  gone.csv\n]\n");
        Path out = folder.resolve("batch-out");
        CommandRunner.assertBadInput(CommandRunner.run("batch", batch.toString(), "--out", out.toString()),
                "batch.conf: line 4", "datasets.files[1] = \"gone.csv\"", "no such data file", "gone.csv");
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    @DisplayName("a bad scale axis value is reported at the study file's line, with no --set the user never typed")
    void scaleAxisError() throws IOException {
        goodData();
        write("base.conf", GOOD);
        Path study = write("study.conf", "base = base.conf\naxes {\n  sampler.particles = [1, 100]\n}\n");
        Path out = folder.resolve("study-out");
        CommandRunner.Result result = CommandRunner.run("scale", study.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "study.conf: line 3", "axes.sampler.particles = 1", "between 2");
        assertFalse(result.err().contains("--set"), result.err());
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    @Slow
    @DisplayName("a model class missing on the executors: one short message naming the class and backend.jars, "
            + "no stack trace, exit 2, nothing left behind")
    void classMissingOnExecutors() throws Exception {
        Path file = write("run.conf", String.join("\n",
                "name = missing-on-executors",
                "model.class = \"" + MissingOnExecutorsModel.class.getName() + "\"",
                "sampler { particles = 40, seed = 2 }",
                "output.progress = off",
                "backend { kind = spark, master = \"local[2]\", partitions = 2 }", ""));
        Path out = folder.resolve("out");
        Path log = folder.resolve("log.txt");
        Process process = ProgramProcess.start(log, "run", file.toString(), "--out", out.toString());
        assertTrue(process.waitFor(120, TimeUnit.SECONDS), "finished");
        String text = Files.readString(log);
        assertEquals(ExitCodes.BAD_INPUT, process.exitValue(), text);
        // Spark still logs each failed task in a line or two (here two partitions), but no stack trace.
        assertFalse(text.contains("\tat ") || text.contains("Caused by"), "no stack trace: " + text);
        assertTrue(text.lines().count() <= 15, "a few lines: " + text);
        String last = text.strip().lines().reduce((a, b) -> b).orElse("");
        assertTrue(last.startsWith("skerry: bad input: cannot build the model on executor"), text);
        for (String fragment : List.of("'" + MissingOnExecutorsModel.MISSING + "'", "backend.jars", "SKERRY_CLASSPATH")) {
            assertTrue(last.contains(fragment), "'" + fragment + "' in: " + last);
        }
        assertFalse(Files.exists(out), "nothing written: " + out);
    }

    @Test
    @DisplayName("a model class not found names SKERRY_CLASSPATH, the one that works, not --classpath or CLASSPATH")
    void classNotFoundAdvice() throws IOException {
        goodData();
        String message = expectBadRun(write("run.conf", GOOD.replace("name = normal-mean",
                "class = \"com.example.NoSuchModel\"")), "run.conf: line 2", "com.example.NoSuchModel", "not found",
                "SKERRY_CLASSPATH", "backend.jars");
        assertFalse(message.contains("--classpath"), message);
        assertFalse(message.replace("SKERRY_CLASSPATH", "").contains("CLASSPATH"), message);
    }

    @Test
    @DisplayName("a relative data.file written in an included file is read from that file's folder")
    void dataFileOfIncludedFile() throws IOException {
        goodData();
        write("shared/data.csv", "y\n0.5\n");
        write("shared/data.conf", "data.file = \"data.csv\"\n");
        Path file = write("run.conf", GOOD.replace("data { file = \"data.csv\" }", "include \"shared/data.conf\""));
        CommandRunner.Result result = CommandRunner.run("validate", file.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("1 rows from " + folder.resolve("shared/data.csv")), result.out());
    }
}
