package org.skerry.engine.model.predictive;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** Systematic choice of posterior draws: its defining property, zero weights, determinism, refusals. */
class PosteriorDrawsTest {

    @Test
    @DisplayName("each particle is drawn ⌊M·w⌋ or ⌈M·w⌉ times, never with weight 0, in increasing order")
    void floorOrCeiling() {
        // The defining property of systematic resampling (Kitagawa 1996; Douc, Cappé & Moulines
        // 2005, "Comparison of resampling schemes for particle filtering", ISPA, §2.4).
        SplittableRandom random = new SplittableRandom(12);
        for (int trial = 0; trial < 50; trial++) {
            int size = 1 + random.nextInt(300);
            int draws = 1 + random.nextInt(500);
            double[] weights = new double[size];
            double total = 0;
            for (int i = 0; i < size; i++) {
                weights[i] = random.nextInt(4) == 0 ? 0.0 : random.nextDouble() * random.nextDouble();
                total += weights[i];
            }
            if (total == 0) {
                weights[size - 1] = 1.0;
                total = 1.0;
            }
            int[] chosen = PosteriorDraws.choose(weights, size, draws, trial);
            assertEquals(draws, chosen.length);
            int[] counts = new int[size];
            for (int k = 0; k < draws; k++) {
                counts[chosen[k]]++;
                assertTrue(k == 0 || chosen[k] >= chosen[k - 1], "increasing order");
            }
            for (int i = 0; i < size; i++) {
                double expected = draws * weights[i] / total;
                // 1e-9 allows the rounding of the cumulative sums at an exact boundary.
                assertTrue(counts[i] >= StrictMath.floor(expected - 1e-9) && counts[i] <= StrictMath.ceil(expected + 1e-9),
                        "particle " + i + " drawn " + counts[i] + " times, M·w = " + expected);
                if (weights[i] == 0) {
                    assertEquals(0, counts[i], "particle " + i + " has weight 0");
                }
            }
        }
    }

    @Test
    @DisplayName("the same seed gives the same draws; the weights need only be proportional")
    void deterministic() {
        double[] weights = {0.1, 0.4, 0.2, 0.3};
        double[] scaled = {1, 4, 2, 3};
        assertArrayEquals(PosteriorDraws.choose(weights, 4, 7, 3), PosteriorDraws.choose(weights, 4, 7, 3));
        assertArrayEquals(PosteriorDraws.choose(weights, 4, 7, 3), PosteriorDraws.choose(scaled, 4, 7, 3));
    }

    @Test
    @DisplayName("bad weights, sizes and counts are refused, naming them")
    void refuses() {
        assertMessage(() -> PosteriorDraws.choose(new double[] {1, -1}, 2, 3, 0), "weights[1]");
        assertMessage(() -> PosteriorDraws.choose(new double[] {1, Double.POSITIVE_INFINITY}, 2, 3, 0), "weights[1]");
        assertMessage(() -> PosteriorDraws.choose(new double[] {0, 0}, 2, 3, 0), "weights");
        assertMessage(() -> PosteriorDraws.choose(new double[] {1}, 2, 3, 0), "size");
        assertMessage(() -> PosteriorDraws.choose(new double[] {1}, 1, 0, 0), "draws");
    }

    private static void assertMessage(org.junit.jupiter.api.function.Executable call, String part) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, call);
        assertTrue(e.getMessage().contains(part), e.getMessage());
    }
}
