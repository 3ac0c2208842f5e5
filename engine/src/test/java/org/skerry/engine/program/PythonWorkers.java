package org.skerry.engine.program;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.skerry.engine.model.prior.Normal;

/** Program settings for the test workers in src/test/resources/program, run with python3 and the repository's worker library. */
public final class PythonWorkers {

    /** The repository's Python worker library (workers/python). */
    public static final Path LIBRARY = Path.of("..", "workers", "python").toAbsolutePath().normalize();
    /** The test workers' folder. */
    public static final Path SCRIPTS = Path.of("..", "engine", "src", "test", "resources", "program").toAbsolutePath()
            .normalize();

    /**
     * The python3 interpreter itself, found once: version managers put a shell script on PATH
     * (pyenv's shim) that costs more than half a second per start under load, a real interpreter
     * about 0.1 s.
     */
    public static final String PYTHON = interpreter();

    private PythonWorkers() {
    }

    private static String interpreter() {
        try {
            Process process = new ProcessBuilder("python3", "-c", "import sys; print(sys.executable)")
                    .redirectErrorStream(true).start();
            String path = new String(process.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8)
                    .strip();
            return process.waitFor() == 0 && !path.isEmpty() ? path : "python3";
        } catch (java.io.IOException e) {
            return "python3";
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return "python3";
        }
    }

    /** The environment the test workers need: where the worker library is. */
    public static Map<String, String> environment() {
        return Map.of("SKERRY_WORKER_LIBRARY", LIBRARY.toString());
    }

    /** One parameter {@code mu} with a normal(0, 3) prior, {@code script} with {@code arguments}, in worker mode. */
    public static ProgramSettings settings(String script, List<Path> files, Duration timeout, int batch, Path scratch,
            String... arguments) {
        List<String> command = new ArrayList<>(List.of(PYTHON, SCRIPTS.resolve(script).toString()));
        command.addAll(List.of(arguments));
        return new ProgramSettings(command, files, environment(), timeout, Duration.ofSeconds(60),
                ProgramSettings.Mode.WORKER, batch, List.of("mu"), List.of(Normal.of(0, 3)), scratch, null);
    }
}
