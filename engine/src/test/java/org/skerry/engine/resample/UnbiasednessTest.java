package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * E[offspring_i] = N W_i for every scheme: the defining property compared across schemes by
 * Douc, Cappé &amp; Moulines (2005), "Comparison of resampling schemes for particle filtering".
 *
 * <p>Replications: R = 20,000 seeds per scheme and weight vector. Each particle's mean count is
 * compared with N W_i in units of its standard error estimated from the replications (R is large
 * enough that the t and normal quantiles agree). The threshold is Bonferroni-corrected so that
 * the whole class raises a false alarm with probability at most 1e-3 (normal quantile from
 * Commons Math). The chi-square checks (Commons Math ChiSquareTest) use level 1e-4 each.
 */
class UnbiasednessTest {

    private static final int REPLICATIONS = 20_000;
    private static final double FAMILY_ALPHA = 1e-3;
    private static final double CHI_SQUARE_ALPHA = 1e-4;

    // Weights (not logs) of the two cases; 0 is a particle with log-weight -infinity.
    private static final double[] TEN = {0.3, 1.0, 2.0, 0.05, 0.0, 0.7, 1.9, 0.45, 1.2, 0.4};
    private static final double[] TWO = {0.3, 0.7};
    private static final int COMPARISONS = ResamplingScheme.values().length * (TEN.length + TWO.length);
    private static final double Z = new NormalDistribution()
            .inverseCumulativeProbability(1 - FAMILY_ALPHA / (2.0 * COMPARISONS));

    @Test
    @DisplayName("mean offspring within Bonferroni z bound of N W_i (Douc, Cappé & Moulines 2005)")
    void meansMatchExpectedCounts() {
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            for (double[] weights : new double[][] {TEN, TWO}) {
                double[] logWeights = logs(weights);
                int n = weights.length;
                double sum = 0;
                for (double w : weights) {
                    sum += w;
                }
                double[] total = new double[n];
                double[] totalSquares = new double[n];
                for (int r = 0; r < REPLICATIONS; r++) {
                    int[] o = Resampling.offspring(scheme, logWeights, n, 1000 + r, r % 5);
                    for (int i = 0; i < n; i++) {
                        total[i] += o[i];
                        totalSquares[i] += (double) o[i] * o[i];
                    }
                }
                for (int i = 0; i < n; i++) {
                    double expected = n * weights[i] / sum;
                    double mean = total[i] / REPLICATIONS;
                    double variance = (totalSquares[i] - REPLICATIONS * mean * mean) / (REPLICATIONS - 1);
                    String where = scheme + " n=" + n + " particle " + i;
                    if (variance <= 0) {
                        // Every replication gave the same count; then it must be the expected one.
                        assertEquals(expected, mean, 1e-9, where);
                    } else {
                        double z = (mean - expected) / Math.sqrt(variance / REPLICATIONS);
                        assertTrue(Math.abs(z) < Z, where + ": mean " + mean + " vs " + expected + ", z = " + z);
                    }
                }
            }
        }
    }

    @Test
    @DisplayName("multinomial pooled counts are Multinomial(R N, W): chi-square (Commons Math)")
    void multinomialPooledCountsFitChiSquare() {
        int n = TEN.length;
        double sum = 0;
        for (double w : TEN) {
            sum += w;
        }
        long[] observed = new long[n - 1];
        double[] expected = new double[n - 1];
        for (int r = 0; r < REPLICATIONS; r++) {
            int[] o = Resampling.offspring(ResamplingScheme.MULTINOMIAL, logs(TEN), n, 5000 + r, 3);
            assertEquals(0, o[4], "zero weight, no copies");
            for (int i = 0, c = 0; i < n; i++) {
                if (TEN[i] > 0) {
                    observed[c++] += o[i];
                }
            }
        }
        for (int i = 0, c = 0; i < n; i++) {
            if (TEN[i] > 0) {
                expected[c++] = (double) REPLICATIONS * n * TEN[i] / sum;
            }
        }
        double p = new ChiSquareTest().chiSquareTest(expected, observed);
        assertTrue(p > CHI_SQUARE_ALPHA, "p = " + p);
    }

    @Test
    @DisplayName("residual random copies are multinomial on the fractional parts (Liu & Chen 1998): chi-square")
    void residualRandomPartFitsChiSquare() {
        double[] logWeights = logs(TEN);
        int n = TEN.length;
        ExactWeights exact = new ExactWeights(logWeights, Resampling.logSumExp(logWeights, n));
        long floorSum = 0;
        for (int i = 0; i < n; i++) {
            floorSum += exact.floor(n, i);
        }
        double randomPoints = n - floorSum;
        long[] observed = new long[n - 1];
        double[] expected = new double[n - 1];
        double sum = 0;
        for (double w : TEN) {
            sum += w;
        }
        for (int r = 0; r < REPLICATIONS; r++) {
            int[] o = Resampling.offspring(ResamplingScheme.RESIDUAL, logWeights, n, 9000 + r, 1);
            for (int i = 0, c = 0; i < n; i++) {
                if (TEN[i] > 0) {
                    observed[c++] += o[i] - exact.floor(n, i);
                }
            }
        }
        for (int i = 0, c = 0; i < n; i++) {
            if (TEN[i] > 0) {
                double fraction = n * TEN[i] / sum - exact.floor(n, i);
                expected[c++] = REPLICATIONS * fraction;
            }
        }
        assertTrue(randomPoints > 0);
        double p = new ChiSquareTest().chiSquareTest(expected, observed);
        assertTrue(p > CHI_SQUARE_ALPHA, "p = " + p);
    }

    static double[] logs(double[] weights) {
        double[] logs = new double[weights.length];
        for (int i = 0; i < weights.length; i++) {
            logs[i] = Math.log(weights[i]);
        }
        return logs;
    }
}
