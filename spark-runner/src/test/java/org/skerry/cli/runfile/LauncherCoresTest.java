package org.skerry.cli.runfile;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Properties;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * {@code backend.tasks = auto} under spark-submit: the executors' cores given on spark-submit's
 * command line ({@code --executor-cores}, {@code --conf spark.executor.cores} or
 * {@code spark.task.cpus}, which reach the driver as system properties) count as known, so a
 * cluster run gets a task per executor without repeating them in the run file. The run file's own
 * setting, and a local master's cores, come first.
 */
class LauncherCoresTest {

    @TempDir
    Path folder;

    private BackendSpec backend(String backendLines, int launcherCores) throws Exception {
        Path file = folder.resolve("run.conf");
        Files.writeString(file, String.join("\n", "name = cores",
                "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
                "data.inline { columns = [y], rows = [[1.2], [0.7]] }", backendLines, ""));
        return BackendSpec.read(SettingsReader.of(RunFile.load(file, List.of()).config()), launcherCores);
    }

    private static Properties properties(String... keyValues) {
        Properties properties = new Properties();
        for (int i = 0; i < keyValues.length; i += 2) {
            properties.setProperty(keyValues[i], keyValues[i + 1]);
        }
        return properties;
    }

    @Test
    @DisplayName("the launcher's cores: spark.task.cpus first, then spark.executor.cores; none or malformed is 0")
    void fromProperties() {
        assertEquals(4, BackendSpec.launcherCores(properties("spark.executor.cores", "4")));
        assertEquals(2, BackendSpec.launcherCores(properties("spark.executor.cores", "4", "spark.task.cpus", "2")));
        assertEquals(3, BackendSpec.launcherCores(properties("spark.executor.cores", " 3 ")));
        assertEquals(0, BackendSpec.launcherCores(properties()));
        assertEquals(0, BackendSpec.launcherCores(properties("spark.executor.cores", "0")));
        assertEquals(0, BackendSpec.launcherCores(properties("spark.executor.cores", "four")));
        assertEquals(4, BackendSpec.launcherCores(properties("spark.task.cpus", "x", "spark.executor.cores", "4")));
    }

    @Test
    @DisplayName("auto on YARN: a task per executor with the launcher's cores; a task per block without them")
    void autoOnCluster() throws Exception {
        BackendSpec given = backend("backend.master = yarn", 4);
        assertTrue(given.perExecutor());
        assertEquals(4, given.taskCores());
        BackendSpec none = backend("backend.master = yarn", 0);
        assertFalse(none.perExecutor());
    }

    @Test
    @DisplayName("the run file's cores, then a local master's, come before the launcher's")
    void precedence() throws Exception {
        assertEquals(3, backend("backend { master = yarn, spark { \"spark.executor.cores\" = 3 } }", 4).taskCores());
        assertEquals(2, backend("backend.master = \"local[2]\"", 4).taskCores());
        assertEquals(4, backend("backend.master = \"spark://127.0.0.1:7077\"", 4).taskCores());
    }

    @Test
    @DisplayName("per-executor on a cluster with no cores anywhere: bad input naming the key and the ways to give them")
    void perExecutorWithoutCores() {
        SettingsException e = assertThrows(SettingsException.class,
                () -> backend("backend { master = yarn, tasks = per-executor }", 0));
        assertTrue(e.getMessage().contains("backend.tasks") && e.getMessage().contains("--executor-cores"),
                e.getMessage());
    }
}
