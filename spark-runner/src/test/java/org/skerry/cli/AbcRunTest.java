package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.JsonTree;
import org.skerry.engine.Slow;

/**
 * ABC runs from a run file: the outputs (tolerance columns, no evidence, the abc object), the same
 * bytes on threads and on Spark, an early end that keeps its result, and the refusals (exit 2,
 * naming the key or file).
 */
@Slow
@SuppressWarnings("unchecked")
class AbcRunTest {

    @TempDir
    Path folder;

    private static final String RUN = """
            name = abc-test
            model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }
            data.inline { columns = ["y"], rows = [[0.4], [1.9], [1.1], [0.7], [1.6]] }
            sampler { particles = 300, seed = 5, sequence = abc
              abc { final-tolerance = 0.1, distance-weights { mean = 1 }, simulations-per-particle = 2 } }
            backend.kind = threads
            output.report = false
            """;

    private Path write(String name, String text) throws IOException {
        Path file = folder.resolve(name);
        Files.writeString(file, text);
        return file;
    }

    private CommandRunner.Result run(String text, String out, String... sets) throws IOException {
        Path runFile = write(out + ".conf", text);
        List<String> args = new java.util.ArrayList<>(List.of("run", runFile.toString(), "--out",
                folder.resolve(out).toString()));
        for (String set : sets) {
            args.add("--set");
            args.add(set);
        }
        return CommandRunner.run(args.toArray(new String[0]));
    }

    @Test
    @DisplayName("outputs: tolerance columns, empty evidence columns, summary.json's abc object and null evidence; "
            + "the same bytes on threads (1 and 3) and Spark local mode (2 partitions)")
    void outputsAndSameBytes() throws IOException {
        CommandRunner.Result one = run(RUN, "one", "backend.threads=1");
        assertEquals(ExitCodes.SUCCESS, one.exitCode(), one.err());
        assertTrue(one.out().contains("tolerance 0.100000 reached"), one.out());
        Map<String, Object> summary = JsonTree.read(folder.resolve("one/summary.json"));
        assertEquals(null, summary.get("log_evidence"));
        assertTrue(String.valueOf(summary.get("log_evidence_error_warning")).contains("Robert, Cornuet, Marin & Pillai"));
        @SuppressWarnings("unchecked")
        Map<String, Object> abc = (Map<String, Object>) summary.get("abc");
        assertEquals(0.1, ((Number) abc.get("final_tolerance")).doubleValue());
        assertEquals(true, abc.get("reached_final_tolerance"));
        List<String> rows = Files.readAllLines(folder.resolve("one/iterations.csv"));
        assertTrue(rows.get(0).endsWith(",tolerance,share_within_tolerance,simulations"), rows.get(0));
        long simulations = 0;
        for (String row : rows.subList(1, rows.size())) {
            String[] cells = row.split(",", -1);
            assertEquals("", cells[9], "no evidence increment");
            assertEquals("", cells[10], "no running evidence");
            assertEquals(2 * Long.parseLong(cells[11]), Long.parseLong(cells[cells.length - 1]), "M = 2");
            simulations += Long.parseLong(cells[cells.length - 1]);
        }
        assertEquals(simulations, ((Number) abc.get("simulations")).longValue());
        assertTrue(rows.get(rows.size() - 1).split(",")[27].equals("0.1"), rows.get(rows.size() - 1));

        CommandRunner.Result three = run(RUN, "three", "backend.threads=3", "backend.block-size=17");
        CommandRunner.Result spark = run(RUN, "spark", "backend.kind=spark", "backend.master=local[2]",
                "backend.partitions=2");
        assertEquals(ExitCodes.SUCCESS, three.exitCode(), three.err());
        assertEquals(ExitCodes.SUCCESS, spark.exitCode(), spark.err());
        for (String other : List.of("three", "spark")) {
            for (String file : List.of("summary.json", "particles.csv")) {
                assertEquals(Files.readString(folder.resolve("one").resolve(file)),
                        Files.readString(folder.resolve(other).resolve(file)), other + " " + file);
            }
        }
    }

    @Test
    @DisplayName("resumed from the first, a middle and the last checkpoint (driver state format 2 and blocks with "
            + "kept summaries), on other threads and blocks: the same bytes, tolerance columns included")
    void resumes() throws IOException {
        CommandRunner.Result whole = run(RUN, "whole", "checkpoint.keep=100", "sampler.abc.distance-weights=null");
        assertEquals(ExitCodes.SUCCESS, whole.exitCode(), whole.err());
        Path checkpoints = folder.resolve("whole/checkpoints");
        List<Path> saved;
        try (java.util.stream.Stream<Path> entries = Files.list(checkpoints)) {
            saved = entries.filter(p -> p.getFileName().toString().startsWith("iteration-")).sorted().toList();
        }
        assertTrue(saved.size() >= 4, "checkpoints: " + saved);
        for (int k : new int[] {0, saved.size() / 2, saved.size() - 2}) {
            Path crashed = folder.resolve("crashed-" + k);
            Files.createDirectories(crashed.resolve("checkpoints"));
            Files.copy(folder.resolve("whole/run.conf"), crashed.resolve("run.conf"));
            for (Path checkpoint : saved.subList(0, k + 1)) {
                Path to = crashed.resolve("checkpoints").resolve(checkpoint.getFileName());
                Files.createDirectories(to);
                try (java.util.stream.Stream<Path> files = Files.list(checkpoint)) {
                    for (Path file : files.toList()) {
                        Files.copy(file, to.resolve(file.getFileName()));
                    }
                }
            }
            CommandRunner.Result resumed = CommandRunner.run("resume", crashed.toString(), "--set", "backend.threads=3",
                    "--set", "backend.block-size=11", "--set", "output.progress=off");
            assertEquals(ExitCodes.SUCCESS, resumed.exitCode(), resumed.err());
            for (String file : List.of("summary.json", "particles.csv")) {
                assertEquals(Files.readString(folder.resolve("whole").resolve(file)),
                        Files.readString(crashed.resolve(file)), "resumed after checkpoint " + k + ": " + file);
            }
            assertEquals(abcColumns(folder.resolve("whole")), abcColumns(crashed), "tolerance columns after " + k);
        }
    }

    /** The iteration, tolerance, share and simulation columns of a run folder's iterations.csv. */
    private static List<String> abcColumns(Path run) throws IOException {
        return Files.readAllLines(run.resolve("iterations.csv")).stream().map(row -> {
            String[] cells = row.split(",", -1);
            return cells[0] + "," + String.join(",", java.util.Arrays.copyOfRange(cells, cells.length - 3, cells.length));
        }).toList();
    }

    @Test
    @DisplayName("sampler.abc.tolerance-rule = share with share-factor 0.3: each adaptive tolerance keeps 0.3 of the "
            + "simulations within the last (M = 1, fixed weights: every living simulation was within it); a rule "
            + "that does not exist is refused, naming the key; iterations at the ABC step cap counted and warned about")
    void shareRule() throws IOException {
        CommandRunner.Result result = run(RUN, "share", "sampler.abc.tolerance-rule=share",
                "sampler.abc.share-factor=0.3", "sampler.abc.simulations-per-particle=1", "sampler.abc.max-steps=3");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        List<String> rows = Files.readAllLines(folder.resolve("share/iterations.csv"));
        List<String> header = List.of(rows.get(0).split(","));
        int tolerance = header.indexOf("tolerance");
        int share = header.indexOf("share_within_tolerance");
        int adaptive = 0;
        for (String row : rows.subList(2, rows.size())) {
            String[] cells = row.split(",", -1);
            if (Double.parseDouble(cells[tolerance]) > 0.1) {
                adaptive++;
                double kept = Double.parseDouble(cells[share]);
                // 0.3 of the living simulations (at least 90 of 300), up to one simulation (continuous
                // summaries: no ties).
                assertTrue(kept >= 0.3 && kept <= 0.3 + 1.0 / 90, row);
            }
        }
        assertTrue(adaptive >= 2, "adaptive tolerances: " + adaptive);
        // The ABC step cap (3 here) counted as for likelihood runs: the iterations.csv rows at it.
        int steps = header.indexOf("mh_steps");
        long atCap = rows.subList(2, rows.size()).stream().filter(row -> row.split(",")[steps].equals("3")).count();
        assertTrue(atCap > 0, "no iteration at the cap of 3");
        Map<String, Object> summary = JsonTree.read(folder.resolve("share/summary.json"));
        assertEquals(atCap, ((Number) summary.get("iterations_at_step_cap")).longValue());
        assertTrue(String.valueOf(summary.get("step_cap_warning")).contains("sampler.abc.max-steps"),
                String.valueOf(summary.get("step_cap_warning")));
        assertTrue(result.out().contains("sampler.abc.max-steps"), result.out());
        CommandRunner.assertBadInput(run(RUN, "median", "sampler.abc.tolerance-rule=median"),
                "sampler.abc.tolerance-rule", "median");
    }

    @Test
    @DisplayName("a final tolerance the budget cannot reach: exit 0, the result kept, the end explained")
    void unreachableTolerance() throws IOException {
        CommandRunner.Result result = run(RUN, "budget", "sampler.abc.final-tolerance=1e-9",
                "sampler.abc.simulation-budget=20000");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("the run ended early: the budget of 20000 simulations was spent"),
                result.out());
        Map<String, Object> summary = JsonTree.read(folder.resolve("budget/summary.json"));
        @SuppressWarnings("unchecked")
        Map<String, Object> abc = (Map<String, Object>) summary.get("abc");
        assertEquals(false, abc.get("reached_final_tolerance"));
        assertTrue(String.valueOf(abc.get("ended_early")).contains("was not reached"));
        assertTrue(Files.isRegularFile(folder.resolve("budget/particles.csv")), "the result is kept");
    }

    @Test
    @DisplayName("a tolerance that cannot fall (every distance equal): exit 0, the result kept, the end explained")
    void stalledTolerance() throws IOException {
        String coins = RUN.replace("model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }",
                "model.class = \"org.skerry.cli.AbcTestSimulators$Coins\"").replace("{ mean = 1 }", "{ a = 1, b = 1 }")
                .replace("data.inline { columns = [\"y\"], rows = [[0.4], [1.9], [1.1], [0.7], [1.6]] }\n", "");
        CommandRunner.Result result = run(coins, "coins");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertTrue(result.out().contains("the run ended early: the tolerance cannot fall below"), result.out());
        Map<String, Object> abc = (Map<String, Object>) JsonTree.read(folder.resolve("coins/summary.json")).get("abc");
        assertEquals(false, abc.get("reached_final_tolerance"));
        // Every distance is sqrt(0.5^2 + 0.5^2): the tolerance falls there from +infinity, then can fall no further.
        assertEquals(Math.sqrt(0.5), ((Number) abc.get("final_tolerance")).doubleValue(), 1e-15);
        assertTrue(String.valueOf(abc.get("ended_early")).contains("0.1 was not reached"), abc.toString());
        assertTrue(Files.isRegularFile(folder.resolve("coins/particles.csv")), "the result is kept");
    }

    @Test
    @DisplayName("bad input, exit 2 before the run: no final tolerance, a model without summaries, observed "
            + "summaries and weights under names the simulator lacks, an observed-summary file whose header does "
            + "not match, a simulator writing more summaries than it names")
    void badInput() throws IOException {
        CommandRunner.assertBadInput(run(RUN.replace("final-tolerance = 0.1, ", ""), "no-tolerance"),
                "sampler.abc.final-tolerance");
        CommandRunner.assertBadInput(run(RUN.replace("normal-mean-simulator", "normal-mean"), "likelihood"),
                "sampler.sequence", "needs a model that simulates summaries");
        CommandRunner.assertBadInput(run(RUN.replace("{ mean = 1 }", "{ average = 1 }"), "weights"),
                "sampler.abc.distance-weights", "'average'", "[mean]");
        write("observed.csv", "average\n1.2\n");
        CommandRunner.assertBadInput(run(RUN.replace("simulations-per-particle = 2", "observed-file = \"observed.csv\""),
                "observed-file"), "sampler.abc.observed-file", "'average'", "[mean]");
        write("two-rows.csv", "mean\n1.2\n1.3\n");
        CommandRunner.assertBadInput(run(RUN.replace("simulations-per-particle = 2",
                "observed-file = \"two-rows.csv\""), "two-rows"), "sampler.abc.observed-file", "2 rows");
        String tooMany = RUN.replace("model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }",
                "model.class = \"org.skerry.cli.AbcTestSimulators$TooMany\"").replace("{ mean = 1 }", "{ a = 1, b = 1 }")
                .replace("data.inline { columns = [\"y\"], rows = [[0.4], [1.9], [1.1], [0.7], [1.6]] }\n", "");
        CommandRunner.Result result = run(tooMany, "too-many");
        CommandRunner.assertBadInput(result, "more summaries than the 2 summaries [a, b]");
        assertFalse(Files.exists(folder.resolve("too-many/summary.json")));
    }

    @Test
    @DisplayName("a summary without spread under the prior: exit 2 naming it")
    void zeroSpread() throws IOException {
        String constant = RUN.replace("model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }",
                "model.class = \"org.skerry.cli.AbcTestSimulators$Constant\"").replace(", distance-weights { mean = 1 }", "")
                .replace("data.inline { columns = [\"y\"], rows = [[0.4], [1.9], [1.1], [0.7], [1.6]] }\n", "");
        CommandRunner.Result result = run(constant, "constant");
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        List<String> lines = result.err().strip().lines().toList();
        String last = lines.get(lines.size() - 1);
        assertTrue(last.startsWith("skerry: bad input: summary 'b' has no spread"), last);
        assertFalse(result.err().contains("\tat "), "no stack trace");
    }

    @Test
    @DisplayName("observed summaries from a file, matched by name in any column order")
    void observedFile() throws IOException {
        write("observed.csv", "b,a\n0.9,0.3\n");
        String noData = RUN.replace("model { name = normal-mean-simulator, settings { sigma = 1, prior.sd = 3 } }",
                "model.class = \"org.skerry.cli.AbcTestSimulators$NoData\"").replace("{ mean = 1 }", "{ a = 1, b = 1 }")
                .replace("simulations-per-particle = 2", "observed-file = \"observed.csv\"")
                .replace("data.inline { columns = [\"y\"], rows = [[0.4], [1.9], [1.1], [0.7], [1.6]] }\n", "");
        CommandRunner.Result result = run(noData, "file");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
    }

    @Test
    @DisplayName("the report of an ABC run: the tolerance and simulations of summary.json, no evidence table or "
            + "figure, a tolerance figure instead of the temperature, and the ABC caveat first among the warnings")
    void report() throws IOException {
        CommandRunner.Result result = run(RUN, "reported", "output.report=true");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        Map<String, Object> abc = (Map<String, Object>) JsonTree.read(folder.resolve("reported/summary.json")).get("abc");
        org.jsoup.nodes.Document page = org.jsoup.Jsoup.parse(
                folder.resolve("reported/report/index.html").toFile(), "UTF-8");
        assertEquals(((Number) abc.get("final_tolerance")).doubleValue(),
                Double.parseDouble(page.selectFirst("#tolerance td[data-key=final_tolerance]").attr("data-value")), 0.0);
        assertEquals(((Number) abc.get("simulations")).longValue(),
                Long.parseLong(page.selectFirst("#tolerance td[data-key=simulations]").attr("data-value")));
        assertTrue(page.select("#evidence, figure#evidence, figure#temperature").isEmpty(), "evidence or temperature shown");
        assertFalse(page.select("figure#tolerance img").isEmpty(), "no tolerance figure");
        assertTrue(Files.isRegularFile(folder.resolve("reported/report/tolerance.svg")));
        String first = page.selectFirst("#warnings li").text();
        assertTrue(first.contains("An ABC run") && first.contains("Robert, Cornuet, Marin & Pillai 2011"), first);
    }
}
