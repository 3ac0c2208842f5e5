package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** The Lake Quellmar generator: reproducible, labelled synthetic, different per buoy, noise as stated. */
class QuellmarDataTest {

    @Test
    @DisplayName("twelve buoys buoy-01..buoy-12 with distinct truths; buoy-07 is the demo buoy; grazing is sigmoidal")
    void scenario() {
        List<QuellmarBuoy> buoys = QuellmarScenario.buoys();
        assertEquals(12, buoys.size());
        Set<String> truths = new HashSet<>();
        for (int b = 0; b < buoys.size(); b++) {
            assertEquals(String.format("buoy-%02d", b + 1), buoys.get(b).name());
            assertEquals(buoys.get(b), QuellmarScenario.buoy(buoys.get(b).name()));
            truths.add(java.util.Arrays.toString(buoys.get(b).trueParameters()) + buoys.get(b).initialNutrient());
        }
        assertEquals(12, truths.size());
        assertEquals("buoy-07", QuellmarScenario.demoBuoy().name());
        assertEquals(GrazingResponse.SIGMOIDAL, QuellmarScenario.TRUE_GRAZING);
        double[] days = QuellmarScenario.seasonDays(QuellmarScenario.FULL_SEASON);
        assertEquals(26, days.length);
        assertEquals(175.0, days[25], 0.0);
        PlanktonModelTest.assertMessage(() -> QuellmarScenario.buoy("buoy-13"), "'buoy-13'");
        PlanktonModelTest.assertMessage(() -> QuellmarScenario.seasonDays(27), "27");
    }

    @Test
    @DisplayName("same seed same data; other seed or other buoy, other data; short seasons are the first weeks")
    void reproducible() {
        QuellmarBuoy demo = QuellmarScenario.demoBuoy();
        double[][] first = QuellmarData.generate(demo, 11L);
        double[][] again = QuellmarData.generate(demo, 11L);
        assertEquals(26, first.length);
        for (int j = 0; j < first.length; j++) {
            assertArrayEquals(first[j], again[j], 0.0);
            assertEquals(7.0 * j, first[j][0], 0.0);
            assertTrue(first[j][1] > 0.0);
        }
        assertFalse(sameChlorophyll(first, QuellmarData.generate(demo, 12L)), "another seed");
        assertFalse(sameChlorophyll(first, QuellmarData.generate(QuellmarScenario.buoy(6), 11L)), "another buoy");
        double[][] shortSeason = QuellmarData.generate(demo, 11L, 12);
        assertEquals(12, shortSeason.length);
        for (int j = 0; j < shortSeason.length; j++) {
            // Same stream, drawn in day order, and the same dynamics up to the last short day.
            assertEquals(first[j][1], shortSeason[j][1], 1e-6 * first[j][1]);
        }
    }

    private static boolean sameChlorophyll(double[][] a, double[][] b) {
        for (int j = 0; j < a.length; j++) {
            if (a[j][1] != b[j][1]) {
                return false;
            }
        }
        return true;
    }

    @Test
    @DisplayName("the CSV says the data is synthetic on its first line and reads back exactly")
    void csv() {
        QuellmarBuoy buoy = QuellmarScenario.buoy(3);
        double[][] rows = QuellmarData.generate(buoy, 99L, 6);
        String[] lines = QuellmarData.toCsv(buoy, 99L, rows).split("\n");
        assertTrue(lines[0].startsWith("# Synthetic data:"), lines[0]);
        assertTrue(lines[0].contains("not real measurements"), lines[0]);
        assertTrue(lines[1].startsWith("#") && lines[1].contains("buoy-03") && lines[1].contains("fictional"), lines[1]);
        assertEquals("day,chlorophyll", lines[2]);
        assertEquals(3 + rows.length, lines.length);
        for (int j = 0; j < rows.length; j++) {
            String[] fields = lines[3 + j].split(",");
            assertEquals(rows[j][0], Double.parseDouble(fields[0]), 0.0);
            assertEquals(rows[j][1], Double.parseDouble(fields[1]), 0.0);
        }
    }

    @Test
    @DisplayName("standardised log residuals of all buoys pass a Kolmogorov-Smirnov test against N(0, 1)")
    void noiseIsLogNormal() {
        List<Double> residuals = new ArrayList<>();
        for (QuellmarBuoy buoy : QuellmarScenario.buoys()) {
            double[][] rows = QuellmarData.generate(buoy, 7L);
            double[] mean = QuellmarScenario.dynamics(buoy, rows.length).chlorophyll(buoy.trueParameters());
            double sigma = buoy.trueParameter("sigma");
            for (int j = 0; j < rows.length; j++) {
                residuals.add(StrictMath.log(rows[j][1] / mean[j]) / sigma);
            }
        }
        double[] sample = residuals.stream().mapToDouble(Double::doubleValue).toArray();
        // Commons Math's exact/asymptotic KS p-value; a false alarm has probability 0.001.
        double p = new KolmogorovSmirnovTest().kolmogorovSmirnovTest(new NormalDistribution(0, 1), sample);
        assertTrue(p > 0.001, "KS p-value " + p + " over " + sample.length + " residuals");
    }
}
