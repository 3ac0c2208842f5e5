package org.skerry.engine.model.builtin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/** Binomial counts by modal inversion against Commons Math's BinomialDistribution. */
class BinomialDrawTest {

    private static final int COUNTS = 20_000;

    @Test
    @DisplayName("counts pass a chi-square test against Commons Math's binomial probabilities")
    void matchesBinomial() {
        int[][] cases = {{1, 0}, {12, 0}, {30, 0}, {5000, 0}};
        double[] ps = {0.3, 0.5, 0.07, 0.01};
        for (int c = 0; c < cases.length; c++) {
            int n = cases[c][0];
            double p = ps[c];
            BinomialDistribution reference = new BinomialDistribution(null, n, p);
            long[] observed = new long[n + 1];
            RandomStream random = new RandomStream(c, StreamPurpose.TESTING, 0, 0);
            for (int i = 0; i < COUNTS; i++) {
                observed[BinomialDraw.draw(n, p, random)]++;
            }
            // Pool the tails so every cell expects at least 5 counts (Cochran's rule).
            int low = 0;
            while (reference.cumulativeProbability(low) * COUNTS < 5) {
                low++;
            }
            int high = n;
            while ((1 - reference.cumulativeProbability(high - 1)) * COUNTS < 5) {
                high--;
            }
            int cells = high - low + 1;
            double[] expected = new double[cells];
            long[] pooled = new long[cells];
            for (int k = 0; k <= n; k++) {
                int cell = Math.min(Math.max(k, low), high) - low;
                expected[cell] += reference.probability(k) * COUNTS;
                pooled[cell] += observed[k];
            }
            if (cells < 2) {
                continue;
            }
            double pValue = new ChiSquareTest().chiSquareTest(expected, pooled);
            assertTrue(pValue > 1e-4, "n = " + n + ", p = " + p + ": chi-square p-value " + pValue);
        }
    }

    @Test
    @DisplayName("edge cases: no trials, p = 0 and p = 1 are certain, and each draw takes one uniform")
    void edges() {
        RandomStream random = new RandomStream(1, StreamPurpose.TESTING, 0, 0);
        assertEquals(0, BinomialDraw.draw(0, 0.4, random));
        assertEquals(0, BinomialDraw.draw(9, 0.0, random));
        assertEquals(9, BinomialDraw.draw(9, 1.0, random));
        RandomStream fresh = new RandomStream(1, StreamPurpose.TESTING, 0, 0);
        for (int i = 0; i < 6; i++) {
            fresh.nextDouble();
        }
        BinomialDraw.draw(9, 0.5, random);
        BinomialDraw.draw(9, 0.5, random);
        BinomialDraw.draw(9, 0.5, random);
        assertEquals(fresh.nextDouble(), random.nextDouble(), 0.0);
    }
}
