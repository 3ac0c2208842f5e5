package org.skerry.cli.runfile;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.skerry.cli.scaling.StudyFile;

/**
 * Run, batch and study files and model settings follow the one reader's rules: a number written
 * as {@code NaN}, an infinity, hexadecimal or with a type suffix is refused in each, with the
 * file, line, key and value. Before the reader was shared, model settings took "NaN" and
 * "Infinity" as numbers while run files refused them.
 */
class NonFiniteSettingsTest {

    private static final String RUN = String.join("\n",
            "name = rules",
            "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
            "data.inline { columns = [y], rows = [[1.2], [0.7]] }",
            "backend.kind = threads",
            "");

    @TempDir
    Path folder;

    private Path write(String name, String text) throws Exception {
        Path file = folder.resolve(name);
        Files.writeString(file, text);
        return file;
    }

    private static String shortened(Path file) {
        return RunFile.shorten(file).toString();
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"NaN\"", "\"Infinity\"", "\"-inf\"", "1e400", "\"0x1p-1\"", "\"0.5f\""})
    @DisplayName("a run file's sampler setting")
    void runFile(String written) throws Exception {
        Path file = write("run.conf", RUN + "sampler.resampling.threshold = " + written + "\n");
        RunFileException e = assertThrows(RunFileException.class, () -> RunSpec.from(RunFile.load(file, List.of())));
        assertEquals(shortened(file) + ": line 5: sampler.resampling.threshold = "
                + rendered(written) + ": expected a finite number", e.getMessage());
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"NaN\"", "\"Infinity\"", "\"-inf\"", "1e400", "\"0x1p-1\"", "\"0.5f\""})
    @DisplayName("a model's setting")
    void modelSetting(String written) throws Exception {
        Path file = write("run.conf", RUN.replace("sigma = 2.0", "sigma = " + written));
        RunSpec spec = RunSpec.from(RunFile.load(file, List.of()));
        RunFileException e = assertThrows(RunFileException.class, () -> ModelBuilder.build(spec));
        assertEquals("model normal-mean: " + shortened(file) + ": line 2: model.settings.sigma = "
                + rendered(written) + ": expected a finite number", e.getMessage());
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"NaN\"", "\"Infinity\"", "1e400", "\"0x10\"", "\"2d\""})
    @DisplayName("a batch file's setting")
    void batchFile(String written) throws Exception {
        write("run.conf", RUN);
        write("a.csv", "# synthetic\ny\n1.0\n");
        Path file = write("batch.conf", String.join("\n", "base = run.conf", "datasets.files = [a.csv]",
                "seed = " + written, ""));
        RunFileException e = assertThrows(RunFileException.class, () -> BatchSpec.load(file, folder.resolve("out")));
        assertEquals(shortened(file) + ": line 3: seed = " + rendered(written) + ": expected a whole number",
                e.getMessage());
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"NaN\"", "\"Infinity\"", "1e400", "\"0x10\"", "\"2d\""})
    @DisplayName("a study file's setting")
    void studyFile(String written) throws Exception {
        write("run.conf", RUN);
        Path file = write("study.conf", String.join("\n", "base = run.conf", "repeats = " + written, ""));
        RunFileException e = assertThrows(RunFileException.class, () -> StudyFile.load(file));
        assertEquals(shortened(file) + ": line 2: repeats = " + rendered(written) + ": expected a whole number",
                e.getMessage());
    }

    /** How HOCON renders the value back: text as written, 1e400 as the double it parses to. */
    private static String rendered(String written) {
        return written.equals("1e400") ? "Infinity" : written;
    }
}
