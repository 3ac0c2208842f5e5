package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * The final export fetches the population from Spark in jobs of bounded bytes: with
 * {@code spark.driver.maxResultSize} at 1 MiB and a population of about 2 MB (40 000 particles),
 * which one job of sixteen partitions could not fetch, the run ends with its files, byte-identical
 * to the thread backend's.
 */
@Slow
class LargeExportTest {

    @TempDir
    Path folder;

    @Test
    @DisplayName("spark.driver.maxResultSize = 1m, a population of ~2 MB: the run ends, the same bytes as threads")
    void populationLargerThanTheResultLimit() throws IOException {
        StringBuilder csv = new StringBuilder("# synthetic test data\nheight\n");
        SplittableRandom random = new SplittableRandom(16L);
        for (int i = 0; i < 20; i++) {
            csv.append(String.format(Locale.ROOT, "%.17g%n", 1.5 + 2.0 * random.nextGaussian()));
        }
        Files.writeString(folder.resolve("data.csv"), csv.toString());
        Path runFile = Files.writeString(folder.resolve("run.conf"), String.join("\n",
                "name = large-export",
                "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0.5, sd = 3 } } }",
                "data { file = \"data.csv\", columns { y = \"height\" } }",
                "sampler { particles = 40000 }",
                "backend { kind = threads, master = \"local[2]\", partitions = 4 }",
                "output.progress = off", ""));
        Path threads = folder.resolve("threads");
        Path spark = folder.resolve("spark");
        assertEquals(0, skerry("run", runFile.toString(), "--out", threads.toString()));
        assertEquals(0, skerry("run", runFile.toString(), "--out", spark.toString(), "--set", "backend.kind=spark",
                "--set", "backend.spark.\"spark.driver.maxResultSize\"=1m"));
        for (String name : new String[] {"summary.json", "particles.csv"}) {
            assertArrayEquals(Files.readAllBytes(threads.resolve(name)), Files.readAllBytes(spark.resolve(name)), name);
        }
    }

    private static int skerry(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(args, new PrintWriter(out, true), new PrintWriter(err, true));
        if (code != 0) {
            System.err.println(err);
        }
        return code;
    }
}
