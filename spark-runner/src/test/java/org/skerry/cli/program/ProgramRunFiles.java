package org.skerry.cli.program;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.skerry.engine.program.PythonWorkers;
import org.skerry.engine.reference.SyntheticData;

/**
 * Run files whose model is the test worker normal_mean.py (the normal mean with known sd 2 and a
 * normal(0.5, 3) prior on mu: closed form in BDA3 §2.5), with synthetic data beside them.
 */
final class ProgramRunFiles {

    static final double SIGMA = 2.0;
    static final double PRIOR_MEAN = 0.5;
    static final double PRIOR_SD = 3.0;

    private ProgramRunFiles() {
    }

    /** Writes data.csv (synthetic: {@code n} draws of N(1, 2²) from seed 31) into {@code folder}; returns its rows. */
    static double[][] writeData(Path folder, int n) throws IOException {
        double[][] rows = SyntheticData.normalRows(31, n, new double[] {1.0}, SIGMA);
        StringBuilder csv = new StringBuilder("# synthetic test data\ny\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", row[0]));
        }
        Files.writeString(folder.resolve("data.csv"), csv.toString());
        return rows;
    }

    /**
     * A run file {@code file}.conf in {@code folder} running normal_mean.py with {@code arguments}
     * after the sd, {@code batch} particles per request, no checkpoints, then {@code more} lines.
     */
    static Path write(Path folder, String file, int batch, List<String> arguments, String... more) throws IOException {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve("normal_mean.py").toString(), Double.toString(SIGMA)));
        command.addAll(arguments);
        StringBuilder text = new StringBuilder();
        text.append("name = program\n");
        text.append("model.program {\n");
        text.append("  command = ").append(quoted(command)).append('\n');
        text.append("  files = [\"data.csv\"]\n");
        text.append("  environment { SKERRY_WORKER_LIBRARY = ").append(quote(PythonWorkers.LIBRARY.toString()))
                .append(" }\n");
        text.append("  batch = ").append(batch).append('\n');
        text.append("  parameters = [ { name = mu, prior { distribution = normal, mean = ").append(PRIOR_MEAN)
                .append(", sd = ").append(PRIOR_SD).append(" } } ]\n");
        text.append("}\n");
        text.append("output.progress = off\n");
        text.append("checkpoint.enabled = false\n");
        for (String line : more) {
            text.append(line).append('\n');
        }
        return Files.writeString(folder.resolve(file + ".conf"), text.toString());
    }

    private static String quoted(List<String> values) {
        List<String> out = new ArrayList<>();
        values.forEach(v -> out.add(quote(v)));
        return "[" + String.join(", ", out) + "]";
    }

    static String quote(String value) {
        return '"' + value.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }

    /** The Python processes of the test workers that are children of this JVM. */
    static List<ProcessHandle> workers() {
        return ProcessHandle.current().descendants()
                .filter(p -> p.info().commandLine().orElse("").contains("normal_mean.py")).toList();
    }
}
