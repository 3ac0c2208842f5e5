package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.resample.ResamplingScheme;

/** The Lee &amp; Whiteley (2018) estimate on populations whose value follows from the formula by hand. */
class EvidenceErrorTest {

    private static FinalParticles particles(long[] eve) {
        int n = eve.length;
        long[] index = new long[n];
        for (int i = 0; i < n; i++) {
            index[i] = i;
        }
        return new FinalParticles(1, n, new double[n], new double[n], new double[n], new double[n], index, eve);
    }

    @Test
    @DisplayName("no resampling, equal weights: V = 1 − N/(N−1)·(1 − 1/N) = 0, flagged and never printed as ± 0")
    void zeroEstimateIsUnreliable() {
        int n = 50;
        long[] eve = new long[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            eve[i] = i;
            w[i] = 1.0 / n;
        }
        EvidenceEstimate e = EvidenceError.estimate(-1.0, particles(eve), w, ResamplingScheme.MULTINOMIAL, 0, 20);
        assertFalse(e.reliable());
        assertTrue(Double.isNaN(e.standardError()), "no figure for a non-positive estimate");
        assertTrue(e.warning().contains("not positive"), e.warning());
    }

    @Test
    @DisplayName("two Eve groups of unequal weight: V = 1 − (N/(N−1))^(n+1)·(1 − Σ group²), by hand")
    void twoGroupsByHand() {
        int n = 40;
        long[] eve = new long[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            eve[i] = i < 10 ? 3 : 17;
            w[i] = i < 10 ? 0.03 : 0.7 / 30;
        }
        EvidenceEstimate e = EvidenceError.estimate(0.0, particles(eve), w, ResamplingScheme.MULTINOMIAL, 2, 1);
        double groups = 0.3 * 0.3 + 0.7 * 0.7;
        double expected = 1 - Math.pow(40.0 / 39.0, 3) * (1 - groups);
        assertEquals(expected, e.relativeVariance(), 1e-12);
        assertEquals(Math.sqrt(Math.log1p(expected)), e.standardError(), 1e-12);
        assertEquals(2, e.distinctEves());
        assertTrue(e.reliable());
    }

    @Test
    @DisplayName("few distinct Eves or a scheme the estimator was not derived for: flagged with the reason")
    void reasonsNamed() {
        int n = 40;
        long[] eve = new long[n];
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            eve[i] = i % 2;
            w[i] = 1.0 / n;
        }
        EvidenceEstimate few = EvidenceError.estimate(0.0, particles(eve), w, ResamplingScheme.MULTINOMIAL, 3, 20);
        assertFalse(few.reliable());
        assertTrue(few.warning().contains("only 2 distinct"), few.warning());
        EvidenceEstimate systematic = EvidenceError.estimate(0.0, particles(eve), w, ResamplingScheme.SYSTEMATIC, 3, 1);
        assertFalse(systematic.reliable());
        assertTrue(systematic.warning().contains("systematic"), systematic.warning());
        EvidenceEstimate neverResampled = EvidenceError.estimate(0.0, particles(eve), w, ResamplingScheme.SYSTEMATIC, 0,
                1);
        assertTrue(neverResampled.reliable(), "without resampling the scheme plays no part");
    }
}
