package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.Reader;
import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.sampler.SamplerResult;

class ParticlesCsvTest {

    @TempDir
    Path folder;

    private static List<CSVRecord> read(Path file) throws IOException {
        try (Reader in = Files.newBufferedReader(file);
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180)) {
            return parser.getRecords();
        }
    }

    @Test
    @DisplayName("particles.csv reads back with commons-csv to the same bits, N rows, weights summing to 1")
    void readsBackExactly() throws IOException {
        SamplerResult result = EngineRuns.normalMean(3, 2);
        FinalParticles particles = result.particles();
        Path file = ParticlesCsv.write(folder, List.of("mu_a", "mu \"b\", second"), particles, result.normalisedWeights());
        List<CSVRecord> records = read(file);
        assertEquals(List.of("mu_a", "mu \"b\", second", "weight", "log_likelihood", "log_prior"), records.get(0).toList());
        assertEquals(particles.size() + 1, records.size());
        BigDecimal total = BigDecimal.ZERO;
        for (int i = 0; i < particles.size(); i++) {
            CSVRecord row = records.get(i + 1);
            assertEquals(5, row.size());
            for (int k = 0; k < 2; k++) {
                assertEquals(Double.doubleToRawLongBits(particles.value(i, k)),
                        Double.doubleToRawLongBits(Double.parseDouble(row.get(k))), "row " + i + " column " + k);
            }
            double weight = Double.parseDouble(row.get(2));
            assertEquals(Double.doubleToRawLongBits(result.normalisedWeights()[i]), Double.doubleToRawLongBits(weight));
            total = total.add(new BigDecimal(row.get(2)));
            assertEquals(Double.doubleToRawLongBits(particles.logLikelihood()[i]),
                    Double.doubleToRawLongBits(Double.parseDouble(row.get(3))), "log_likelihood of row " + i);
            assertEquals(Double.doubleToRawLongBits(particles.logPrior()[i]),
                    Double.doubleToRawLongBits(Double.parseDouble(row.get(4))), "log_prior of row " + i);
        }
        assertEquals(1.0, total.doubleValue(), 1e-12);
    }

    @Test
    @DisplayName("the same seed gives a byte-identical particles.csv, whatever the thread count")
    void sameSeedSameBytes() throws IOException {
        Path a = Files.createDirectory(folder.resolve("a"));
        Path b = Files.createDirectory(folder.resolve("b"));
        SamplerResult one = EngineRuns.normalMean(4, 1);
        SamplerResult three = EngineRuns.normalMean(4, 3);
        ParticlesCsv.write(a, List.of("mu1", "mu2"), one.particles(), one.normalisedWeights());
        ParticlesCsv.write(b, List.of("mu1", "mu2"), three.particles(), three.normalisedWeights());
        assertArrayEquals(Files.readAllBytes(a.resolve("particles.csv")), Files.readAllBytes(b.resolve("particles.csv")));
    }

    @Test
    @DisplayName("names that do not fit the particles are refused before anything is written")
    void badNames() {
        FinalParticles particles = new FinalParticles(2, 1, new double[] {1, 2}, new double[] {0}, new double[] {0},
                new double[] {0}, new long[] {0}, new long[] {0});
        double[] w = {1.0};
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> ParticlesCsv.write(folder, List.of("a"), particles, w)).getMessage().contains("one name per parameter (2)"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> ParticlesCsv.write(folder, List.of("a", "a"), particles, w)).getMessage().contains("'a' appears twice"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> ParticlesCsv.write(folder, List.of("a", "weight"), particles, w)).getMessage().contains("named 'weight'"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> ParticlesCsv.write(folder, List.of("log_prior", "b"), particles, w)).getMessage()
                .contains("named 'log_prior', which is the name of a column"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> ParticlesCsv.write(folder, List.of("a", "b"), particles, new double[2])).getMessage().contains("one weight per particle (1), got 2"));
        assertTrue(!Files.exists(folder.resolve("particles.csv")));
    }

    @Test
    @DisplayName("streamed: rows in two runs give the file of one; abandoned before finish leaves nothing; rows out of order refused")
    void streamed() throws IOException {
        double[] values = {1.5, -2.0, 0.25, 3.0, 1e-300, -0.0};
        double[] weights = {0.5, 0.25, 0.25};
        double[] logLikelihood = {-1.0, Double.NEGATIVE_INFINITY, -3.5};
        double[] logPrior = {-0.5, -0.75, -1.25};
        FinalParticles whole = new FinalParticles(2, 3, values, new double[3], logPrior, logLikelihood, new long[] {0, 1, 2},
                new long[3]);
        Path one = Files.createDirectories(folder.resolve("one"));
        ParticlesCsv.write(one, List.of("a", "b"), whole, weights);
        Path two = Files.createDirectories(folder.resolve("two"));
        try (ParticlesCsv csv = ParticlesCsv.open(two, List.of("a", "b"), 2)) {
            csv.append(new org.skerry.engine.population.ParticleRows(0, 1, 2, values, weights, logLikelihood, logPrior));
            assertTrue(!Files.exists(two.resolve("particles.csv")), "no file under its name before finish");
            csv.append(new org.skerry.engine.population.ParticleRows(1, 2, 2, new double[] {0.25, 3.0, 1e-300, -0.0},
                    new double[] {0.25, 0.25}, new double[] {Double.NEGATIVE_INFINITY, -3.5}, new double[] {-0.75, -1.25}));
            csv.finish();
        }
        assertArrayEquals(Files.readAllBytes(one.resolve("particles.csv")), Files.readAllBytes(two.resolve("particles.csv")));

        Path abandoned = Files.createDirectories(folder.resolve("abandoned"));
        try (ParticlesCsv csv = ParticlesCsv.open(abandoned, List.of("a", "b"), 2)) {
            csv.append(new org.skerry.engine.population.ParticleRows(0, 1, 2, values, weights, logLikelihood, logPrior));
            assertTrue(assertThrows(IllegalArgumentException.class, () -> csv.append(new org.skerry.engine.population
                    .ParticleRows(2, 1, 2, values, weights, logLikelihood, logPrior))).getMessage()
                    .contains("rows start at particle 2, expected 1"));
        }
        try (java.util.stream.Stream<Path> left = Files.list(abandoned)) {
            assertEquals(0, left.count(), "nothing left after close without finish");
        }
    }
}
