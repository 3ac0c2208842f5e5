package org.skerry.cli.program;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;
import org.skerry.engine.reference.NormalMeanExact;

/**
 * Runs whose model is a Python worker program, through the command: the normal mean against its
 * closed form, and the same bytes on every backend, partitioning and batch size.
 */
@Slow
class ProgramModelRunTest {

    @TempDir
    Path folder;

    private static double number(Path summary, String key) throws IOException {
        Matcher m = Pattern.compile("\"" + key + "\"\\s*:\\s*([-0-9.eE+]+)").matcher(Files.readString(summary));
        assertTrue(m.find(), key + " in summary.json");
        return Double.parseDouble(m.group(1));
    }

    private CommandRunner.Result run(Path runFile, String out, String... sets) {
        String[] args = new String[3 + 2 * sets.length];
        args[0] = "run";
        args[1] = runFile.toString();
        args[2] = "--out=" + folder.resolve(out);
        for (int i = 0; i < sets.length; i++) {
            args[3 + 2 * i] = "--set";
            args[4 + 2 * i] = sets[i];
        }
        CommandRunner.Result result = CommandRunner.run(args);
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        assertEquals(List.of(), ProgramRunFiles.workers(), "no worker outlives its run");
        return result;
    }

    @Test
    @DisplayName("a Python worker for the normal mean: log evidence and posterior mean against the closed form "
            + "(BDA3 §2.5; Bishop PRML eq. 2.115), within 4 standard errors over 8 seeds")
    void closedForm() throws IOException {
        double[][] rows = ProgramRunFiles.writeData(folder, 25);
        Path runFile = ProgramRunFiles.write(folder, "normal", 1, List.of(),
                "sampler.particles = 400", "backend { kind = threads, threads = 2 }");
        NormalMeanExact exact = new NormalMeanExact(rows, ProgramRunFiles.SIGMA, ProgramRunFiles.PRIOR_MEAN,
                ProgramRunFiles.PRIOR_SD);
        SummaryStatistics logZ = new SummaryStatistics();
        SummaryStatistics mean = new SummaryStatistics();
        int seeds = 8;
        for (int s = 0; s < seeds; s++) {
            run(runFile, "seed-" + s, "sampler.seed=" + (200 + s));
            Path summary = folder.resolve("seed-" + s).resolve("summary.json");
            logZ.addValue(number(summary, "log_evidence"));
            mean.addValue(number(summary, "mean"));
            assertEquals(0.0, number(summary, "invalid_evaluations"));
        }
        // log Z-hat is biased low by about Var/2; tolerances: 4 standard errors of the replicated mean.
        double corrected = logZ.getMean() + 0.5 * logZ.getVariance();
        double error = 4 * logZ.getStandardDeviation() / Math.sqrt(seeds);
        assertEquals(exact.logEvidence(), corrected, error, "mean log Z + Var/2 over " + seeds + " seeds; 4 SE = " + error);
        double meanError = 4 * mean.getStandardDeviation() / Math.sqrt(seeds);
        assertEquals(exact.posteriorMean(0), mean.getMean(), meanError, "posterior mean; 4 SE = " + meanError);
    }

    @Test
    @DisplayName("the file-mode example (conf/examples/file-mode, shell and awk) from the command: every particle's "
            + "log-likelihood equals the closed form, the sum of normal log-densities (Commons Math)")
    void fileModeExample() throws IOException {
        Path example = Path.of("..", "conf", "examples", "file-mode").toAbsolutePath().normalize();
        run(example.resolve("run.conf"), "file-mode", "sampler.particles=20", "output.progress=off",
                "checkpoint.enabled=false");
        List<Double> y = new java.util.ArrayList<>();
        for (String line : Files.readAllLines(example.resolve("observations.csv"))) {
            if (!line.isBlank() && !line.startsWith("#") && !line.equals("y")) {
                y.add(Double.parseDouble(line));
            }
        }
        List<String> lines = Files.readAllLines(folder.resolve("file-mode").resolve("particles.csv"));
        List<String> header = List.of(lines.get(0).split(","));
        int mu = header.indexOf("mu");
        int logLikelihood = header.indexOf("log_likelihood");
        assertEquals(21, lines.size(), "20 particles");
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            org.apache.commons.math3.distribution.NormalDistribution normal =
                    new org.apache.commons.math3.distribution.NormalDistribution(null, Double.parseDouble(cells[mu]), 2.0);
            double exact = 0;
            for (double v : y) {
                exact += normal.logDensity(v);
            }
            assertEquals(exact, Double.parseDouble(cells[logLikelihood]), 1e-12 * Math.abs(exact), line);
        }
    }

    @Test
    @DisplayName("a seeded worker: the same bytes on threads (1 and 2, block size 7), Spark local with 1, 3 and 8 "
            + "partitions, and numpy batches of 7 and 1000 (neither divides the block size)")
    void sameBytesEverywhere() throws IOException {
        ProgramRunFiles.writeData(folder, 10);
        String[] common = {"sampler.particles = 150", "sampler.seed = 9"};
        Path single = ProgramRunFiles.write(folder, "single", 1, List.of("--jitter"), common);
        Path batched7 = ProgramRunFiles.write(folder, "batched7", 7, List.of("--jitter", "--batched"), common);
        Path batched1000 = ProgramRunFiles.write(folder, "batched1000", 1000, List.of("--jitter", "--batched"), common);
        run(single, "reference", "backend.kind=threads", "backend.threads=2");
        run(single, "threads1", "backend.kind=threads", "backend.threads=1", "backend.block-size=7");
        run(single, "spark1", "backend.kind=spark", "backend.master=local[2]", "backend.partitions=1");
        run(single, "spark3", "backend.kind=spark", "backend.master=local[2]", "backend.partitions=3");
        run(single, "spark8", "backend.kind=spark", "backend.master=local[2]", "backend.partitions=8");
        run(batched7, "numpy7", "backend.kind=threads", "backend.threads=2");
        run(batched7, "numpy7spark", "backend.kind=spark", "backend.master=local[2]", "backend.partitions=3");
        run(batched1000, "numpy1000", "backend.kind=threads", "backend.threads=2", "backend.block-size=64");
        Path reference = folder.resolve("reference");
        for (String other : List.of("threads1", "spark1", "spark3", "spark8", "numpy7", "numpy7spark", "numpy1000")) {
            for (String file : List.of("summary.json", "particles.csv")) {
                assertArrayEquals(Files.readAllBytes(reference.resolve(file)),
                        Files.readAllBytes(folder.resolve(other).resolve(file)), other + "/" + file);
            }
        }
        run(single, "other-seed", "backend.kind=threads", "sampler.seed=10");
        assertTrue(!Files.readString(reference.resolve("particles.csv"))
                .equals(Files.readString(folder.resolve("other-seed/particles.csv"))), "another seed, another answer");
    }
}
