package org.skerry.cli.checkpoint;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.SkerryCommand;
import org.skerry.engine.Slow;
import org.skerry.engine.reference.SyntheticData;

/**
 * Resuming through the command, in this JVM on Spark's local mode: from any checkpoint of a run,
 * past a damaged newest checkpoint, after the checkpoint file system filled up, and the refusals
 * (changed settings, nothing to resume). Every resumed run is compared byte for byte with the
 * undisturbed one.
 */
@Slow
class CheckpointResumeTest {

    @TempDir
    static Path dir;

    private static Path runFile;
    private static Path undisturbed;

    record Result(int exitCode, String out, String err) {
    }

    static Result skerry(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Result(code, out.toString(), err.toString());
    }

    private static String[] run(Path out, String... more) {
        List<String> args = new ArrayList<>(List.of("run", runFile.toString(), "--out", out.toString(),
                "--set", "output.progress=off"));
        args.addAll(List.of(more));
        return args.toArray(new String[0]);
    }

    @BeforeAll
    static void undisturbedRun() throws IOException {
        double[][] rows = SyntheticData.normalRows(83, 25, new double[] {0.3, -0.7}, 1.0);
        StringBuilder csv = new StringBuilder("# synthetic test data\ny1,y2\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g,%.17g%n", row[0], row[1]));
        }
        Files.writeString(dir.resolve("data.csv"), csv.toString());
        runFile = Files.writeString(dir.resolve("resume.conf"), String.join("\n",
                "name = resume-test",
                "model { name = normal-mean, settings { sigma = 1.0, prior { mean = 0, sd = 3 } } }",
                "data.file = \"data.csv\"",
                "sampler { particles = 300, seed = 4242 }",
                "backend { master = \"local[2]\", partitions = 3 }",
                "checkpoint.keep = 100", ""));
        undisturbed = dir.resolve("undisturbed");
        Result result = skerry(run(undisturbed));
        assertEquals(0, result.exitCode(), result.err());
    }

    private static List<Path> checkpoints(Path runFolder) throws IOException {
        try (Stream<Path> entries = Files.list(runFolder.resolve("checkpoints"))) {
            return entries.filter(p -> p.getFileName().toString().startsWith("iteration-")).sorted().toList();
        }
    }

    /** A run folder as a crash after iteration {@code k}'s checkpoint leaves it: run.conf and checkpoints 0..k. */
    private static Path crashedAfter(int k, String name) throws IOException {
        Path crashed = dir.resolve(name);
        Files.createDirectories(crashed.resolve("checkpoints"));
        Files.copy(undisturbed.resolve("run.conf"), crashed.resolve("run.conf"));
        for (Path checkpoint : checkpoints(undisturbed)) {
            if (Integer.parseInt(checkpoint.getFileName().toString().substring("iteration-".length())) <= k) {
                copyFolder(checkpoint, crashed.resolve("checkpoints").resolve(checkpoint.getFileName()));
            }
        }
        return crashed;
    }

    private static void copyFolder(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (Stream<Path> files = Files.list(from)) {
            for (Path file : files.toList()) {
                Files.copy(file, to.resolve(file.getFileName()));
            }
        }
    }

    private static void assertSameResults(Path expected, Path actual) throws IOException {
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(expected.resolve(name)), Files.readAllBytes(actual.resolve(name)),
                    name + " of " + actual);
        }
        assertEquals(Files.readAllLines(expected.resolve("iterations.csv")).size(),
                Files.readAllLines(actual.resolve("iterations.csv")).size(), "one iterations.csv row per iteration");
    }

    @Test
    @DisplayName("the undisturbed run checkpointed every iteration, wrote manifests and kept what keep allows")
    void everyIterationCheckpointed() throws IOException {
        List<Path> all = checkpoints(undisturbed);
        long rows = Files.readAllLines(undisturbed.resolve("iterations.csv")).size() - 1;
        assertEquals(rows, all.size(), "one checkpoint per iteration, the initial draw included");
        for (Path checkpoint : all) {
            assertTrue(Files.isRegularFile(checkpoint.resolve("manifest.txt")), checkpoint.toString());
            assertTrue(Files.isRegularFile(checkpoint.resolve("block-00002.bin")), "three partitions, three blocks");
        }
        assertTrue(all.size() >= 4, "enough iterations to interrupt: " + all.size());
    }

    private static List<Integer> checkpointedIterations(Path runFolder) throws IOException {
        List<Integer> iterations = new ArrayList<>();
        for (Path checkpoint : checkpoints(runFolder)) {
            iterations.add(Integer.parseInt(checkpoint.getFileName().toString().substring("iteration-".length())));
        }
        return iterations;
    }

    @Test
    @DisplayName("every k iterations or every m minutes: the checkpoints written are the ones asked for, always with the last; the answer is the same")
    void checkpointFrequency() throws IOException {
        int last = checkpoints(undisturbed).size() - 1;
        Path everyThird = dir.resolve("every-third");
        Result third = skerry(run(everyThird, "--set", "checkpoint.every-iterations=3"));
        assertEquals(0, third.exitCode(), third.err());
        List<Integer> expected = new ArrayList<>();
        for (int k = 0; k < last; k += 3) {
            expected.add(k);
        }
        expected.add(last);
        assertEquals(expected, checkpointedIterations(everyThird));
        assertSameResults(undisturbed, everyThird);

        Path rarely = dir.resolve("rarely");
        Result minutes = skerry(run(rarely, "--set", "checkpoint.every-minutes=600"));
        assertEquals(0, minutes.exitCode(), minutes.err());
        assertEquals(List.of(0, last), checkpointedIterations(rarely), "the initial draw and the end only");
        assertSameResults(undisturbed, rarely);

        Path none = dir.resolve("no-checkpoints-at-all");
        Result off = skerry(run(none, "--set", "checkpoint.enabled=false"));
        assertEquals(0, off.exitCode(), off.err());
        assertFalse(Files.exists(none.resolve("checkpoints")));
        assertSameResults(undisturbed, none);

        Path pruned = dir.resolve("pruned");
        Result kept = skerry(run(pruned, "--set", "checkpoint.keep=2"));
        assertEquals(0, kept.exitCode(), kept.err());
        assertEquals(List.of(last - 1, last), checkpointedIterations(pruned), "the newest two kept");
    }

    @Test
    @DisplayName("resumed from the first, a middle and the last checkpoint, on other partitions: byte-identical results")
    void resumeFromEveryPoint() throws IOException {
        int last = checkpoints(undisturbed).size() - 1;
        for (int k : new int[] {0, last / 2, last}) {
            Path crashed = crashedAfter(k, "crashed-" + k);
            Result result = skerry("resume", crashed.toString(), "--set", "backend.partitions=5",
                    "--set", "output.progress=off");
            assertEquals(0, result.exitCode(), result.err());
            assertTrue(result.err().contains("after iteration " + k), result.err());
            assertSameResults(undisturbed, crashed);
        }
    }

    @Test
    @DisplayName("tasks per block and per executor (3 blocks in 2 groups) give the same bytes, straight through and "
            + "resumed from each other's checkpoints")
    void taskGroupings() throws IOException {
        // The run file's local[2] makes tasks per executor by default (one group, both cores).
        Path perBlock = dir.resolve("per-block");
        Result straight = skerry(run(perBlock, "--set", "backend.tasks=per-block"));
        assertEquals(0, straight.exitCode(), straight.err());
        assertSameResults(undisturbed, perBlock);
        int middle = (checkpoints(undisturbed).size() - 1) / 2;
        Path crashed = crashedAfter(middle, "crashed-grouped");
        Result grouped = skerry("resume", crashed.toString(), "--set", "backend.tasks=per-executor",
                "--set", "backend.task-groups=2", "--set", "backend.partitions=5", "--set", "output.progress=off");
        assertEquals(0, grouped.exitCode(), grouped.err());
        assertSameResults(undisturbed, crashed);
        // The grouped resume (the checkpoint's three blocks in two groups) wrote its own checkpoints:
        // a task per block resumes from one of them.
        Path again = dir.resolve("crashed-grouped-again");
        Files.createDirectories(again.resolve("checkpoints"));
        Files.copy(crashed.resolve("run.conf"), again.resolve("run.conf"));
        Path written = checkpoints(crashed).get(middle + 1);
        assertTrue(Files.isRegularFile(written.resolve("block-00002.bin")), "three blocks in " + written);
        copyFolder(written, again.resolve("checkpoints").resolve(written.getFileName()));
        Result perBlockResume = skerry("resume", again.toString(), "--set", "backend.tasks=per-block",
                "--set", "output.progress=off");
        assertEquals(0, perBlockResume.exitCode(), perBlockResume.err());
        assertSameResults(undisturbed, again);
    }

    @Test
    @DisplayName("the thread backend resumes a Spark run's checkpoint to the same bytes (the backend does not change the answer)")
    void resumeOnThreads() throws IOException {
        Path crashed = crashedAfter(2, "crashed-threads");
        Result result = skerry("resume", crashed.toString(), "--set", "backend.kind=threads",
                "--set", "backend.block-size=7");
        assertEquals(0, result.exitCode(), result.err());
        assertSameResults(undisturbed, crashed);
    }

    @Test
    @DisplayName("a corrupted block of the newest checkpoint is reported and the previous checkpoint is used")
    void damagedNewestCheckpoint() throws IOException {
        Path crashed = crashedAfter(3, "crashed-damaged");
        Path block = crashed.resolve("checkpoints/iteration-000003/block-00001.bin");
        byte[] bytes = Files.readAllBytes(block);
        bytes[bytes.length / 2] ^= 0x10;
        Files.write(block, bytes);
        Result result = skerry("resume", crashed.toString());
        assertEquals(0, result.exitCode(), result.err());
        assertTrue(result.err().contains("skipped checkpoint iteration-000003"), result.err());
        assertTrue(result.err().contains("block-00001.bin") && result.err().contains("checksum"), result.err());
        assertTrue(result.err().contains("after iteration 2"), result.err());
        assertSameResults(undisturbed, crashed);
    }

    @Test
    @DisplayName("a missing block and an unfinished checkpoint (no manifest) are skipped too")
    void missingBlockAndUnfinished() throws IOException {
        Path crashed = crashedAfter(3, "crashed-missing");
        Files.delete(crashed.resolve("checkpoints/iteration-000003/block-00000.bin"));
        Files.delete(crashed.resolve("checkpoints/iteration-000002/manifest.txt"));
        Result result = skerry("resume", crashed.toString());
        assertEquals(0, result.exitCode(), result.err());
        assertTrue(result.err().contains("block-00000.bin is missing"), result.err());
        assertTrue(result.err().contains("iteration-000002: no manifest"), result.err());
        assertTrue(result.err().contains("after iteration 1"), result.err());
        assertSameResults(undisturbed, crashed);
    }

    @Test
    @DisplayName("a resume that would change the answer is refused, naming the setting; nothing is written")
    void changedSettingsRefused() throws IOException {
        Path crashed = crashedAfter(1, "crashed-changed");
        Result result = skerry("resume", crashed.toString(), "--set", "sampler.seed=4243");
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        assertTrue(result.err().contains("sampler.seed was 4242, now 4243"), result.err());
        assertFalse(Files.exists(crashed.resolve("summary.json")));
        assertTrue(Files.isRegularFile(crashed.resolve("checkpoints/iteration-000001/manifest.txt")),
                "the checkpoint is kept");
        Files.writeString(crashed.resolve("data-copy.csv"), "# synthetic test data\ny1,y2\n1,2\n");
        Result data = skerry("resume", crashed.toString(), "--set", "data.file=\"" + crashed.resolve("data-copy.csv") + "\"");
        assertEquals(ExitCodes.BAD_INPUT, data.exitCode(), data.err());
        assertTrue(data.err().contains("data.file was sha256:"), data.err());
    }

    @Test
    @DisplayName("a finished run exits 0 with a note, a folder without run.conf is an error, a run stopped before its first checkpoint runs from the start")
    void nothingToResume() throws IOException {
        Result finished = skerry("resume", undisturbed.toString());
        assertEquals(0, finished.exitCode(), finished.err());
        assertTrue(finished.out().contains("has finished"), finished.out());

        Path empty = Files.createDirectories(dir.resolve("not-a-run"));
        Result notRun = skerry("resume", empty.toString());
        assertEquals(ExitCodes.BAD_INPUT, notRun.exitCode());
        assertTrue(notRun.err().contains("has no run.conf"), notRun.err());

        Path bare = Files.createDirectories(dir.resolve("no-checkpoints"));
        Files.copy(undisturbed.resolve("run.conf"), bare.resolve("run.conf"));
        Result fresh = skerry("resume", bare.toString());
        assertEquals(0, fresh.exitCode(), fresh.err());
        assertTrue(fresh.err().contains("running it from the start"), fresh.err());
        assertSameResults(undisturbed, bare);

        Path unusable = crashedAfter(1, "all-damaged");
        Files.delete(unusable.resolve("checkpoints/iteration-000000/manifest.txt"));
        Files.delete(unusable.resolve("checkpoints/iteration-000001/driver-state.bin"));
        Result none = skerry("resume", unusable.toString());
        assertEquals(ExitCodes.RUN_FAILURE, none.exitCode(), none.err());
        assertTrue(none.err().contains("no usable checkpoint in"), none.err());
        assertTrue(none.err().contains("iteration-000001") && none.err().contains("iteration-000000"), none.err());
    }

    @Test
    @DisplayName("checkpoint file system full: a clear error and exit 1, the previous checkpoint intact and resumable")
    void fullFileSystem() throws IOException {
        Path out = dir.resolve("filling");
        Path root = dir.resolve("filling-checkpoints");
        Result result = skerry(run(out, "--set", "checkpoint.path=\"fillingfs://" + root + "\"",
                "--set", "backend.spark.\"spark.hadoop.fs.fillingfs.impl\"=" + FillingFileSystem.class.getName(),
                "--set", "backend.spark.\"spark.hadoop.test.filling.last-iteration\"=2"));
        assertEquals(ExitCodes.RUN_FAILURE, result.exitCode(), result.err());
        assertTrue(result.err().contains("cannot write the checkpoint of iteration 3"), result.err());
        assertTrue(result.err().contains("No space left on device"), result.err());
        assertTrue(result.err().contains("the checkpoint of iteration 2 is intact"), result.err());
        assertTrue(result.err().contains("skerry resume " + out), result.err());
        assertFalse(Files.exists(out.resolve("summary.json")));
        assertEquals(4, Files.readAllLines(out.resolve("iterations.csv")).size(), "header and iterations 0..2 kept");

        // Space freed: the same folder through the plain local file system.
        Result resumed = skerry("resume", out.toString(), "--set", "checkpoint.path=\"" + root + "\"",
                "--set", "output.progress=off");
        assertEquals(0, resumed.exitCode(), resumed.err());
        assertTrue(resumed.err().contains("after iteration 2"), resumed.err());
        assertSameResults(undisturbed, out);
        try (Stream<Path> left = Files.walk(root)) {
            assertTrue(left.sorted(Comparator.reverseOrder()).noneMatch(p -> p.toString().endsWith(".tmp")),
                    "no temporary files left behind");
        }
    }

    @Test
    @DisplayName("--max-wall-time stops at a checkpoint with exit code 75; requeued each time, the run progresses and ends byte-identical")
    void wallTimeLimit() throws IOException {
        Path out = dir.resolve("wall-time");
        // A limit every iteration exceeds: each invocation makes exactly one iteration, then stops.
        Result stopped = skerry(run(out, "--max-wall-time", "1ms"));
        assertEquals(ExitCodes.STOPPED_RESUMABLE, stopped.exitCode(), stopped.err());
        assertTrue(stopped.err().contains("stopped after iteration 1"), stopped.err());
        assertTrue(stopped.err().contains("would not fit in the wall time left"), stopped.err());
        assertTrue(stopped.err().contains("skerry resume " + out), stopped.err());
        assertFalse(Files.exists(out.resolve("summary.json")));
        int iterations = Files.readAllLines(undisturbed.resolve("iterations.csv")).size() - 2;
        int invocations = 1;
        Result resumed;
        do {
            resumed = skerry("resume", out.toString());
            invocations++;
            assertTrue(invocations <= iterations, "at least one iteration per invocation: " + invocations);
        } while (resumed.exitCode() == ExitCodes.STOPPED_RESUMABLE);
        assertEquals(0, resumed.exitCode(), resumed.err());
        assertEquals(iterations, invocations, "one iteration per invocation");
        assertSameResults(undisturbed, out);
    }
}
