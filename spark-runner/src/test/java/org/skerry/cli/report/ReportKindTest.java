package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;

/**
 * {@code skerry report} on folders that are no run, batch or study, or whose batch or study files
 * do not read back: exit 2, one message naming the folder or file and what it lacks, and nothing
 * written (the folder's listing is the same afterwards). No run is needed.
 */
class ReportKindTest {

    @TempDir
    Path dir;

    private static List<Path> listing(Path folder) throws IOException {
        try (Stream<Path> files = Files.walk(folder)) {
            return files.sorted().toList();
        }
    }

    private void badInput(Path folder, String... fragments) throws IOException {
        List<Path> before = listing(dir);
        CommandRunner.assertBadInput(CommandRunner.run("report", folder.toString()), fragments);
        assertEquals(before, listing(dir), "nothing written");
    }

    @Test
    @DisplayName("a folder of none of the kinds: the message names it and the files it lacks")
    void noneOfTheKinds() throws IOException {
        Path other = Files.createDirectories(dir.resolve("holiday-photos"));
        Files.writeString(other.resolve("notes.txt"), "not a run\n");
        badInput(other, other.toString(), "not a run, batch or study folder", "summary.json", "batch-summary.json",
                "scaling.csv");
        badInput(Files.createDirectories(dir.resolve("empty")), "empty", "not a run, batch or study folder");
        Path file = Files.writeString(dir.resolve("plain.txt"), "x\n");
        badInput(file, file.toString(), "is not a folder");
    }

    @Test
    @DisplayName("an unfinished study or batch says what is missing and how to finish it")
    void unfinished() throws IOException {
        Path study = Files.createDirectories(dir.resolve("study"));
        Files.writeString(study.resolve("study.conf"), "scaling = strong\n");
        badInput(study, study.toString(), "no scaling.csv", "skerry scale");
        Path batch = Files.createDirectories(dir.resolve("batch"));
        Files.writeString(batch.resolve("batch.conf"), "settings {}\n");
        badInput(batch, batch.toString(), "no batch-summary.json");
    }

    @Test
    @DisplayName("a batch summary that does not read back names the file and the line or key")
    void brokenBatchSummary() throws IOException {
        Path batch = Files.createDirectories(dir.resolve("batch"));
        Files.writeString(batch.resolve("batch.conf"), "settings {}\n");
        Files.writeString(batch.resolve("batch-summary.json"), "{\n \"reference_variant\": \"a\",\n \"analyses\": [ \n");
        badInput(batch, "batch-summary.json", "line");
        Files.writeString(batch.resolve("batch-summary.json"), "{\"reference_variant\": \"a\", \"analyses\": "
                + "[{\"dataset\": \"d\", \"variant\": \"a\", \"status\": \"succeeded\", \"folder\": \"../../elsewhere\"}]}\n");
        badInput(batch, "batch-summary.json", "analyses[0].folder", "inside the batch folder");
        Files.writeString(batch.resolve("batch-summary.json"), "{\"reference_variant\": \"a\", \"analyses\": "
                + "[{\"dataset\": \"d\", \"variant\": \"a\", \"status\": \"succeeded\", \"folder\": \"d/a\", "
                + "\"log_evidence\": \"high\"}]}\n");
        badInput(batch, "batch-summary.json", "analyses[0].log_evidence", "high");
    }

    @Test
    @DisplayName("a study table with a field that is not a number names the file, line and column")
    void brokenStudyTable() throws IOException {
        Path study = Files.createDirectories(dir.resolve("study"));
        Files.writeString(study.resolve("study.conf"), "scaling = strong\nrepeats = 1\n");
        Files.writeString(study.resolve("scaling.csv"), String.join("\n",
                "point,repeat,cores,particles,partitions,islands,iterations,evaluations,wall_seconds,loop_seconds,"
                        + "evaluate_seconds,reduce_seconds,resample_seconds,redistribute_seconds,move_seconds,"
                        + "checkpoint_seconds,evaluations_per_second,speedup,efficiency,load_average,run_folder",
                "cores-1,1,1,100,,0,3,400,1.0,0.5,0.1,0.1,0.1,0.0,0.2,0.0,800,1.0,1.0,0.5,runs/cores-1-r1",
                "cores-2,1,2,100,,0,3,400,1.0,fast,0.1,0.1,0.1,0.0,0.2,0.0,800,1.0,1.0,0.5,runs/cores-2-r1", ""));
        badInput(study, "scaling.csv", "line 3", "loop_seconds", "fast");
    }
}
