package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.output.ParticlesFormat;
import org.skerry.engine.Slow;

/**
 * {@code output.particles-format} end to end: which of particles.csv and particles.arrow a run
 * writes, and that a report of a run with only particles.arrow reads the very values and weights
 * the CSV of the same run file and seed holds.
 */
@Slow
class ParticlesFormatRunTest {

    @TempDir
    static Path root;

    static Path both;
    static Path arrow;
    static Path auto;

    private static final String RUN_FILE = String.join("\n", "# synthetic: costly-normal without busy work",
            "name = formats", "model { name = costly-normal, settings { dimension = 3, cost-micros = 0 } }",
            "sampler { particles = 300, seed = 11 }", "output.progress = off", "output.report = false",
            "backend.kind = threads", "");

    @BeforeAll
    static void runs() throws IOException {
        Path file = root.resolve("run.conf");
        Files.writeString(file, RUN_FILE);
        both = run(file, "both", "output.particles-format=both");
        arrow = run(file, "arrow", "output.particles-format=arrow");
        auto = run(file, "auto");
    }

    private static Path run(Path file, String name, String... settings) {
        Path out = root.resolve(name);
        List<String> args = new ArrayList<>(List.of("run", file.toString(), "--out", out.toString()));
        for (String setting : settings) {
            args.addAll(List.of("--set", setting));
        }
        CommandRunner.Result result = CommandRunner.run(args.toArray(String[]::new));
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        return out;
    }

    private static long[] bits(double[] values) {
        long[] bits = new long[values.length];
        for (int i = 0; i < values.length; i++) {
            bits[i] = Double.doubleToRawLongBits(values[i]);
        }
        return bits;
    }

    @Test
    @DisplayName("both writes both files, arrow only particles.arrow, auto at 300 x 6 numbers only particles.csv")
    void filesWritten() {
        assertTrue(Files.isRegularFile(both.resolve("particles.csv")));
        assertTrue(Files.isRegularFile(both.resolve("particles.arrow")));
        assertTrue(Files.isRegularFile(arrow.resolve("particles.arrow")));
        assertFalse(Files.exists(arrow.resolve("particles.csv")));
        assertTrue(Files.isRegularFile(auto.resolve("particles.csv")));
        assertFalse(Files.exists(auto.resolve("particles.arrow")));
    }

    @Test
    @DisplayName("the same seed writes the same particles.arrow bytes with or without the CSV beside it")
    void sameArrowBytes() throws IOException {
        assertArrayEquals(Files.readAllBytes(both.resolve("particles.arrow")),
                Files.readAllBytes(arrow.resolve("particles.arrow")));
    }

    @Test
    @DisplayName("a report reads from particles.arrow the bits it reads from particles.csv; skerry report succeeds on it")
    void reportReadsArrow() {
        RunReport fromCsv = RunReport.read(both);
        RunReport fromArrow = RunReport.read(arrow);
        assertEquals(300, fromArrow.particles());
        assertArrayEquals(bits(fromCsv.weights()), bits(fromArrow.weights()));
        assertEquals(3, fromArrow.values().size());
        for (int k = 0; k < 3; k++) {
            assertArrayEquals(bits(fromCsv.values().get(k)), bits(fromArrow.values().get(k)), "parameter " + k);
        }
        CommandRunner.Result result = CommandRunner.run("report", arrow.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(Files.isRegularFile(arrow.resolve("report/index.html")));
    }

    @Test
    @DisplayName("a run folder with neither particles file is bad input naming both")
    void neitherFile() throws IOException {
        Path copy = Files.createDirectory(root.resolve("neither"));
        for (String name : List.of("summary.json", "iterations.csv", "run.conf")) {
            Files.copy(arrow.resolve(name), copy.resolve(name));
        }
        CommandRunner.assertBadInput(CommandRunner.run("report", copy.toString()), "particles.csv", "particles.arrow");
    }

    @Test
    @DisplayName("a cut-off particles.arrow, or one without a weight column, is bad input naming the file")
    void brokenArrow() throws IOException {
        Path cut = Files.createDirectory(root.resolve("cut"));
        for (String name : List.of("summary.json", "iterations.csv", "run.conf")) {
            Files.copy(arrow.resolve(name), cut.resolve(name));
        }
        byte[] bytes = Files.readAllBytes(arrow.resolve("particles.arrow"));
        Files.write(cut.resolve("particles.arrow"), Arrays.copyOf(bytes, bytes.length / 2));
        CommandRunner.assertBadInput(CommandRunner.run("report", cut.toString()), "particles.arrow",
                "not a readable Arrow IPC file");
        assertFalse(Files.exists(cut.resolve("report")), "nothing written");

        Path renamed = Files.createDirectory(root.resolve("renamed"));
        for (String name : List.of("summary.json", "iterations.csv", "run.conf")) {
            Files.copy(arrow.resolve(name), renamed.resolve(name));
        }
        // The same file with the weight column's name changed in place (same length, so the
        // flatbuffers stay valid): "weight" -> "wEight".
        byte[] changed = bytes.clone();
        String text = new String(changed, StandardCharsets.ISO_8859_1);
        for (int at = text.indexOf("weight"); at >= 0; at = text.indexOf("weight", at + 1)) {
            changed[at + 1] = 'E';
        }
        Files.write(renamed.resolve("particles.arrow"), changed);
        CommandRunner.assertBadInput(CommandRunner.run("report", renamed.toString()), "particles.arrow",
                "no column weight");
    }

    @Test
    @DisplayName("auto switches to Arrow at exactly 2e6 numbers, N * (d + 3)")
    void autoBoundary() {
        // 2e6 = 200 000 * (7 + 3): one particle fewer stays CSV.
        assertTrue(ParticlesFormat.AUTO.writesCsv(199_999, 7));
        assertFalse(ParticlesFormat.AUTO.writesArrow(199_999, 7));
        assertTrue(ParticlesFormat.AUTO.writesArrow(200_000, 7));
        assertFalse(ParticlesFormat.AUTO.writesCsv(200_000, 7));
        assertTrue(ParticlesFormat.BOTH.writesCsv(1, 1) && ParticlesFormat.BOTH.writesArrow(1, 1));
        assertFalse(ParticlesFormat.CSV.writesArrow(10_000_000, 10));
        assertFalse(ParticlesFormat.ARROW.writesCsv(1, 1));
    }

    @Test
    @DisplayName("an unknown format is bad input naming the key and the choices; nothing is written")
    void unknownFormat() throws IOException {
        Path file = root.resolve("run.conf");
        Path out = root.resolve("unknown");
        CommandRunner.Result result = CommandRunner.run("run", file.toString(), "--out", out.toString(), "--set",
                "output.particles-format=parquet");
        CommandRunner.assertBadInput(result, "output.particles-format", "parquet");
        assertFalse(Files.exists(out));
    }
}
