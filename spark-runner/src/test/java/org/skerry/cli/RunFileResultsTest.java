package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/** Runs from run files through the command, checked against closed forms. */
@Slow
class RunFileResultsTest {

    @TempDir
    Path folder;

    private Path runFile(double[][] rows) throws IOException {
        StringBuilder csv = new StringBuilder("# synthetic test data\nheight\n");
        for (double[] row : rows) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", row[0]));
        }
        Files.writeString(folder.resolve("data.csv"), csv.toString());
        return Files.writeString(folder.resolve("run.conf"), String.join("\n",
                "name = conjugate",
                "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0.5, sd = 3 } } }",
                "data { file = \"data.csv\", columns { y = \"height\" } }",
                "sampler { particles = 1000 }",
                "backend { kind = threads, master = \"local[2]\", partitions = 3 }",
                "output.progress = off", ""));
    }

    private static double logEvidenceOf(Path summary) throws IOException {
        Matcher m = Pattern.compile("\"log_evidence\"\\s*:\\s*([-0-9.eE+]+)").matcher(Files.readString(summary));
        assertTrue(m.find(), "log_evidence in summary.json");
        return Double.parseDouble(m.group(1));
    }

    @Test
    @DisplayName("normal-mean from a run file: evidence against the closed form (Bishop PRML eq. 2.115; BDA3 §2.5)")
    void conjugateEvidence() throws IOException {
        double[][] rows = SyntheticData.normalRows(31, 25, new double[] {1.0}, 2.0);
        Path run = runFile(rows);
        double exact = new NormalMeanExact(rows, 2.0, 0.5, 3.0).logEvidence();
        SummaryStatistics logZ = new SummaryStatistics();
        int seeds = 12;
        for (int s = 0; s < seeds; s++) {
            Path out = folder.resolve("seed-" + s);
            CommandRunner.Result result = CommandRunner.run("run", run.toString(), "--out", out.toString(),
                    "--set", "sampler.seed=" + (100 + s));
            assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
            logZ.addValue(logEvidenceOf(out.resolve("summary.json")));
        }
        // log Z-hat is biased low by about Var/2; tolerance: 4 standard errors over the seeds.
        double corrected = logZ.getMean() + 0.5 * logZ.getVariance();
        double error = 4 * logZ.getStandardDeviation() / Math.sqrt(seeds);
        assertEquals(exact, corrected, error, "mean log Z + Var/2 over " + seeds + " seeds; 4 SE = " + error);
    }

    @Test
    @DisplayName("same run file and seed: byte-identical summary.json and particles.csv from Spark local mode and from threads; all five files written")
    void byteIdentical() throws IOException {
        Path run = runFile(SyntheticData.normalRows(32, 10, new double[] {0.0}, 2.0));
        Path a = folder.resolve("a");
        Path b = folder.resolve("b");
        CommandRunner.Result spark = CommandRunner.run("run", run.toString(), "--out", a.toString(),
                "--set", "backend.kind=spark");
        assertEquals(ExitCodes.SUCCESS, spark.exitCode(), spark.err());
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("run", run.toString(), "--out", b.toString(),
                "--set", "backend.threads=1", "--set", "backend.block-size=7").exitCode());
        for (String name : new String[] {"summary.json", "timing.json", "iterations.csv", "particles.csv", "run.conf"}) {
            assertTrue(Files.isRegularFile(a.resolve(name)), name);
        }
        assertArrayEquals(Files.readAllBytes(a.resolve("summary.json")), Files.readAllBytes(b.resolve("summary.json")));
        assertArrayEquals(Files.readAllBytes(a.resolve("particles.csv")), Files.readAllBytes(b.resolve("particles.csv")));
        CommandRunner.Result other = CommandRunner.run("run", run.toString(), "--out", folder.resolve("c").toString(),
                "--set", "sampler.seed=2");
        assertEquals(ExitCodes.SUCCESS, other.exitCode());
        assertTrue(!Files.readString(a.resolve("summary.json")).equals(Files.readString(folder.resolve("c/summary.json"))),
                "another seed gives another answer");
    }
}
