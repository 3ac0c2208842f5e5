package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/** Data tempering from a run file: the keys, the iterations it makes, and its refusals. */
@Slow
class DataTemperingRunTest {

    @TempDir
    Path folder;

    private Path write(String name, String text) throws IOException {
        Path file = folder.resolve(name);
        Files.writeString(file, text);
        return file;
    }

    private CommandRunner.Result run(String extra, String out) throws IOException {
        write("data.csv", ConjugateRun.DATA);
        Path runFile = write("run.conf", ConjugateRun.RUN_FILE + extra);
        return CommandRunner.run("run", runFile.toString(), "--out", folder.resolve(out).toString());
    }

    @Test
    @DisplayName("fixed batches of one: one iteration per observation, the last at temperature column 1")
    void fixedBatches() throws IOException {
        CommandRunner.Result result = run("sampler { sequence = data-tempering, data-tempering.batch = 1 }\n", "fixed");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        List<String> rows = Files.readAllLines(folder.resolve("fixed/iterations.csv"));
        // A header, iteration 0, then one iteration for each of the four observations.
        assertEquals(6, rows.size(), String.join("\n", rows));
        assertTrue(rows.get(2).split(",")[1].equals("0.25"), rows.get(2));
        assertTrue(rows.get(5).split(",")[1].equals("1.0"), rows.get(5));
        assertTrue(Files.isRegularFile(folder.resolve("fixed/summary.json")));
    }

    @Test
    @DisplayName("adaptive batches: the same bytes from the same seed, whatever the threads and blocks")
    void adaptiveSameBytes() throws IOException {
        String sequence = "sampler { sequence = data-tempering, data-tempering { window = 3, target = 0.8 } }\n";
        CommandRunner.Result one = run(sequence + "backend.threads = 1\n", "one");
        CommandRunner.Result two = run(sequence + "backend { threads = 2, block-size = 17 }\n", "two");
        assertEquals(ExitCodes.SUCCESS, one.exitCode(), one.err());
        assertEquals(ExitCodes.SUCCESS, two.exitCode(), two.err());
        for (String file : List.of("summary.json", "particles.csv")) {
            assertEquals(Files.readString(folder.resolve("one").resolve(file)),
                    Files.readString(folder.resolve("two").resolve(file)), file);
        }
    }

    @Test
    @DisplayName("a model without a likelihood per observation range: exit 2 naming sampler.sequence, nothing written")
    void refusedForModelWithoutRanges() throws IOException {
        write("data.csv", ConjugateRun.DATA);
        Path runFile = write("run.conf", ConjugateRun.RUN_FILE
                .replace("model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
                        "model { name = costly-normal, settings { cost-micros = 0 } }")
                .replace("data { file = \"data.csv\" }\n", "")
                + "sampler.sequence = data-tempering\n");
        Path out = folder.resolve("refused");
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "sampler.sequence", "run.conf", "costly-normal");
        assertFalse(Files.exists(out.resolve("summary.json")), "no results written");
    }

    @Test
    @DisplayName("a batch that is neither adaptive nor a number: exit 2 naming the key")
    void badBatch() throws IOException {
        Path out = folder.resolve("bad");
        write("data.csv", ConjugateRun.DATA);
        Path runFile = write("run.conf", ConjugateRun.RUN_FILE
                + "sampler { sequence = data-tempering, data-tempering.batch = often }\n");
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "sampler.data-tempering.batch", "often");
        assertFalse(Files.exists(out.resolve("summary.json")), "no results written");
    }
}
