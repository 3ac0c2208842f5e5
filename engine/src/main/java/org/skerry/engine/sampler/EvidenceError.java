package org.skerry.engine.sampler;

import java.util.Arrays;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.population.FinalParticles;

/**
 * The single-run estimate of the evidence's relative variance from the genealogy of the final
 * particles (Lee &amp; Whiteley 2018, "Variance estimation in the particle filter", Biometrika
 * 105(3)):
 * <pre>
 *   V = 1 − (N/(N−1))^(n+1) · (1 − Σ_e (Σ_{i: E_i = e} W_i)²)
 * </pre>
 * with W the final normalised weights, E_i the Eve index (iteration-0 ancestor) of particle i and
 * n the number of resampling steps. The estimator was derived for multinomial resampling at
 * every step; with other schemes and adaptive resampling it is the usual approximation. It
 * degenerates as the Eve indices coalesce, which is what the reliability flag watches.
 */
public final class EvidenceError {

    private EvidenceError() {
    }

    public static EvidenceEstimate estimate(double logEvidence, FinalParticles particles, double[] weights,
            int resamplingSteps, int minimumDistinctEves) {
        int n = particles.size();
        long[] eve = particles.eve();
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (i, j) -> Long.compare(eve[i], eve[j]));
        ExactSum sumOfSquares = new ExactSum();
        long distinct = 0;
        int k = 0;
        while (k < n) {
            long current = eve[order[k]];
            ExactSum group = new ExactSum();
            boolean positive = false;
            while (k < n && eve[order[k]] == current) {
                double w = weights[order[k]];
                group.add(w);
                positive |= w > 0;
                k++;
            }
            if (positive) {
                double g = group.doubleValue();
                sumOfSquares.add(g * g);
                distinct++;
            }
        }
        double ratio = (double) n / (n - 1);
        double inflation = StrictMath.pow(ratio, resamplingSteps + 1);
        double relativeVariance = 1.0 - inflation * (1.0 - sumOfSquares.doubleValue());
        relativeVariance = Math.max(0.0, relativeVariance);
        double standardError = StrictMath.sqrt(StrictMath.log1p(relativeVariance));
        boolean reliable = distinct >= minimumDistinctEves;
        String warning = reliable ? null
                : "only " + distinct + " distinct iteration-0 ancestors remain (fewer than " + minimumDistinctEves
                        + "): the single-run evidence error is unreliable; replicate the run over seeds instead";
        return new EvidenceEstimate(logEvidence, relativeVariance, standardError, distinct, reliable, warning, 0,
                Double.NaN);
    }
}
