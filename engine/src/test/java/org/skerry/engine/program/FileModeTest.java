package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.block.LikelihoodEvaluator;

/**
 * File mode with small shell programs: the example in conf/examples/file-mode against the closed
 * form of its likelihood, the input rendered from the template, and each failure's outcome (the
 * folder kept, up to the cap; a timeout killing the process tree).
 */
@Slow
class FileModeTest {

    private static final Path EXAMPLE = Path.of("..", "conf", "examples", "file-mode").toAbsolutePath().normalize();

    @TempDir
    Path scratch;

    private ProgramModel model(List<String> command, String template, int keepFailed, Duration timeout)
            throws IOException {
        Path file = Files.writeString(scratch.resolve("input.tmpl"), template);
        Path work = Files.createDirectories(scratch.resolve("work"));
        ProgramSettings.FileMode fileMode = new ProgramSettings.FileMode(file, template, "input.txt", "output.txt",
                keepFailed);
        return new ProgramModel(new ProgramSettings(command, List.of(), java.util.Map.of("PIDS_DIR", scratch.toString()),
                timeout, Duration.ofSeconds(30), ProgramSettings.Mode.FILE, 1, List.of("mu"), List.of(Normal.of(0, 3)),
                work, fileMode));
    }

    private ProgramModel faulty(String behaviour, int keepFailed, Duration timeout) throws IOException {
        return model(List.of("sh", PythonWorkers.SCRIPTS.resolve("file_faulty.sh").toString(), behaviour),
                "mu = {{mu}}\n", keepFailed, timeout);
    }

    private static EvaluationTally evaluate(ProgramModel model, double mu, double[] value) {
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 3L, 0);
        value[0] = evaluator.evaluate(new double[] {mu}, 5, 1, 0);
        return evaluator.drainTally();
    }

    private List<Path> keptFolders() throws IOException {
        List<Path> kept = new ArrayList<>();
        try (Stream<Path> roots = Files.list(scratch.resolve("work"))) {
            for (Path root : roots.toList()) {
                try (Stream<Path> folders = Files.list(root)) {
                    kept.addAll(folders.toList());
                }
            }
        }
        return kept;
    }

    @Test
    @DisplayName("the shell-and-awk example: its log-likelihood equals the closed form, the sum of normal log-densities "
            + "(Commons Math), at five values of mu; nothing left in the scratch space")
    void exampleAgainstClosedForm() throws IOException {
        String template = Files.readString(EXAMPLE.resolve("input.tmpl"));
        List<Double> y = new ArrayList<>();
        for (String line : Files.readAllLines(EXAMPLE.resolve("observations.csv"))) {
            if (!line.isBlank() && !line.startsWith("#") && !line.equals("y")) {
                y.add(Double.parseDouble(line));
            }
        }
        try (ProgramModel model = model(List.of("sh", EXAMPLE.resolve("model.sh").toString(),
                EXAMPLE.resolve("observations.csv").toString()), template, 10, Duration.ofSeconds(60))) {
            for (double mu : new double[] {-2.5, 0.0, 0.3, 1.3, 4.75}) {
                NormalDistribution normal = new NormalDistribution(null, mu, 2.0);
                double exact = 0;
                for (double v : y) {
                    exact += normal.logDensity(v);
                }
                double[] value = new double[1];
                EvaluationTally tally = evaluate(model, mu, value);
                assertEquals(0, tally.invalid(), String.valueOf(tally.firstInvalidReason()));
                // awk's own log and arithmetic, printed with 17 digits: equal to rounding error.
                assertEquals(exact, value[0], 1e-12 * Math.abs(exact), "mu = " + mu);
            }
        }
        assertEquals(List.of(), keptFolders(), "every evaluation's folder removed");
    }

    @Test
    @DisplayName("the template renders 17 significant digits (read back exactly), hexadecimal, the seed and the iteration")
    void templateRendering() {
        InputTemplate template = InputTemplate.parse("a={{mu}} h={{ mu:hex }} s={{seed}} i={{iteration}}\n",
                List.of("mu"));
        double mu = 0.1;
        String text = template.render(new double[] {mu}, 1, 0, -1L, 4);
        assertEquals("a=1.0000000000000001e-01 h=0x1.999999999999ap-4 s=18446744073709551615 i=4\n", text);
        assertEquals(mu, Double.parseDouble("1.0000000000000001e-01"));
        for (double x : new double[] {1.0, -2.5e-300, 6.02214076e23, Math.PI, -0.0, Double.MIN_VALUE, Double.MAX_VALUE}) {
            String written = InputTemplate.appendDecimal(new StringBuilder(), x).toString();
            assertEquals(Double.doubleToRawLongBits(x), Double.doubleToRawLongBits(Double.parseDouble(written)), written);
        }
    }

    @Test
    @DisplayName("failures: non-zero exit, no output file, output not a number — invalid with the reason and the "
            + "program's output; folders kept up to keep-failed")
    void failures() throws IOException {
        double[] value = new double[1];
        try (ProgramModel model = faulty("exit", 1, Duration.ofSeconds(60))) {
            String reason = evaluate(model, 1.0, value).firstInvalidReason();
            assertTrue(reason.contains("it exited with status 3"), reason);
            assertTrue(reason.contains("cannot converge"), reason);
            assertTrue(reason.contains("its folder is kept: "), reason);
            String second = evaluate(model, 1.0, value).firstInvalidReason();
            assertFalse(second.contains("its folder is kept"), "the cap of one kept folder: " + second);
        }
        assertEquals(1, keptFolders().size(), "one failed folder kept after the model closed");
        Path kept = keptFolders().get(0);
        assertEquals("mu = 1.0000000000000000e+00\n", Files.readString(kept.resolve("input.txt")));
        try (ProgramModel model = faulty("nooutput", 0, Duration.ofSeconds(60))) {
            assertTrue(evaluate(model, 1.0, value).firstInvalidReason().contains("it wrote no output file output.txt"));
        }
        try (ProgramModel model = faulty("garbage", 0, Duration.ofSeconds(60))) {
            assertTrue(evaluate(model, 1.0, value).firstInvalidReason()
                    .contains("its output file output.txt holds 'not-a-number', not a number"));
        }
        try (ProgramModel model = faulty("healthy", 0, Duration.ofSeconds(60))) {
            assertEquals(0, evaluate(model, 1.5, value).invalid());
            assertEquals(-0.5 * 1.5 * 1.5, value[0]);
        }
    }

    @Test
    @DisplayName("a timeout kills the program and the child it started")
    void timeoutKillsTheTree() throws IOException {
        double[] value = new double[1];
        try (ProgramModel model = faulty("hang", 0, Duration.ofSeconds(2))) {
            String reason = evaluate(model, 1.0, value).firstInvalidReason();
            assertTrue(reason.contains("no result within 2 s (the timeout); its process tree was killed"), reason);
        }
        for (String pid : Files.readString(scratch.resolve("pids.txt")).strip().split(" ")) {
            ProgramModelFailuresTest.assertGone(Long.parseLong(pid));
        }
    }
}
