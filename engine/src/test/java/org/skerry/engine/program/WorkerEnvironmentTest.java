package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.process.ChildEnvironment;

/**
 * What a worker is given (the safety rules): only the usual basics of this JVM's
 * environment, plus what the run file adds, plus TMPDIR; and a current folder of its own inside
 * the model's scratch space, which is also its TMPDIR and is removed when the model closes.
 */
@Slow
class WorkerEnvironmentTest {

    @TempDir
    Path scratch;

    @TempDir
    Path reports;

    @Test
    @DisplayName("a worker's environment is the basics, the run file's additions and TMPDIR; its current folder "
            + "is its own scratch folder, removed at the end")
    void environmentAndFolder() throws IOException {
        Path report = reports.resolve("environment.txt");
        ProgramSettings base = PythonWorkers.settings("report_environment.py", List.of(), Duration.ofSeconds(30), 1,
                scratch, report.toString());
        Map<String, String> added = new LinkedHashMap<>(base.environment());
        added.put("LAKE_SCENARIO", "quellmar");
        ProgramSettings settings = new ProgramSettings(base.command(), base.files(), added, base.timeout(),
                base.startTimeout(), base.mode(), base.batch(), base.names(), base.priors(), scratch, null);
        Map<String, String> seen = new LinkedHashMap<>();
        String cwd;
        try (ProgramModel model = new ProgramModel(settings)) {
            LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 5L, 0);
            assertEquals(-0.5 * 1.5 * 1.5, evaluator.evaluate(new double[] {1.5}, 0, 0, 1), "the worker answered");
            String last = null;
            for (String line : Files.readAllLines(report)) {
                int eq = line.indexOf('=');
                seen.put(line.substring(0, eq), line.substring(eq + 1));
                last = line;
            }
            assertTrue(last != null && last.startsWith("cwd="), "report complete");
            cwd = seen.remove("cwd");
            Path folder = Path.of(cwd).toRealPath();
            Path space = scratch.toRealPath();
            assertTrue(folder.startsWith(space) && !folder.equals(space),
                    "current folder " + cwd + " is a folder of its own inside the scratch space " + scratch);
            assertEquals(cwd, seen.get("TMPDIR"), "TMPDIR is its current folder");
            assertEquals("quellmar", seen.get("LAKE_SCENARIO"), "the run file's addition");
        }
        Set<String> allowed = new HashSet<>(ChildEnvironment.BASICS);
        allowed.addAll(added.keySet());
        allowed.add("TMPDIR");
        Set<String> extra = new HashSet<>(seen.keySet());
        extra.removeAll(allowed);
        assertEquals(Set.of(), extra, "nothing beyond the basics, the additions and TMPDIR");
        for (String name : ChildEnvironment.BASICS) {
            String own = System.getenv(name);
            if (own != null && !name.equals("TMPDIR") && !name.equals("LC_CTYPE")) {
                // LC_CTYPE may be set by Python itself (PEP 538 locale coercion).
                assertEquals(own, seen.get(name), "basic " + name + " passed on as it is");
            }
        }
        List<String> ours = System.getenv().keySet().stream().filter(n -> !allowed.contains(n)).toList();
        assertFalse(ours.isEmpty(), "this JVM has variables beyond the basics (else the check above proves little)");
        assertFalse(Files.exists(Path.of(cwd)), "the worker's folder is removed when the model closes");
    }
}
