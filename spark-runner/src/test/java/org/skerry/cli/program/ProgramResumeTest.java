package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;

/**
 * The content of the files a program reads joins the settings a resume compares, as the data file
 * does: a run whose program file changed after its checkpoint is refused (exit 2, naming the key),
 * and with the file as it was the resume gives the bytes of the undisturbed run.
 */
@Slow
class ProgramResumeTest {

    @TempDir
    Path folder;

    @Test
    @DisplayName("a program's file changed since the checkpoint: resume refused naming model.program.files; "
            + "restored: the undisturbed run's bytes")
    void changedFileRefused() throws IOException {
        ProgramRunFiles.writeData(folder, 10);
        Path runFile = ProgramRunFiles.write(folder, "resumable", 1, List.of("--jitter"),
                "sampler { particles = 60, seed = 5 }", "backend { kind = threads, threads = 2 }",
                "checkpoint.enabled = true", "output.report = false");
        Path undisturbed = folder.resolve("undisturbed");
        CommandRunner.Result run = CommandRunner.run("run", runFile.toString(), "--out", undisturbed.toString());
        assertEquals(ExitCodes.SUCCESS, run.exitCode(), run.err());
        Path first;
        try (Stream<Path> checkpoints = Files.list(undisturbed.resolve("checkpoints"))) {
            first = checkpoints.filter(p -> p.getFileName().toString().startsWith("iteration-")).sorted().findFirst()
                    .orElseThrow();
        }
        Path crashed = folder.resolve("crashed");
        Files.createDirectories(crashed.resolve("checkpoints").resolve(first.getFileName()));
        Files.copy(undisturbed.resolve("run.conf"), crashed.resolve("run.conf"));
        try (Stream<Path> files = Files.list(first)) {
            for (Path file : files.toList()) {
                Files.copy(file, crashed.resolve("checkpoints").resolve(first.getFileName()).resolve(file.getFileName()));
            }
        }
        Path data = folder.resolve("data.csv");
        byte[] original = Files.readAllBytes(data);
        Files.writeString(data, Files.readString(data) + "1.25\n");
        CommandRunner.Result refused = CommandRunner.run("resume", crashed.toString());
        assertEquals(ExitCodes.BAD_INPUT, refused.exitCode(), refused.err());
        assertTrue(refused.err().contains("model.program.files was sha256:"), refused.err());
        assertFalse(Files.exists(crashed.resolve("summary.json")), "nothing written");
        Files.write(data, original);
        CommandRunner.Result resumed = CommandRunner.run("resume", crashed.toString());
        assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
        for (String name : List.of("summary.json", "particles.csv")) {
            assertArrayEquals(Files.readAllBytes(undisturbed.resolve(name)), Files.readAllBytes(crashed.resolve(name)),
                    name);
        }
        assertEquals(List.of(), ProgramRunFiles.workers(), "no worker outlives the runs");
    }
}
