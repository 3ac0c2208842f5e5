package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.resample.ResamplingScheme;

/**
 * The single-run estimate of the evidence's relative variance from the genealogy of the final
 * particles (Lee &amp; Whiteley 2018, "Variance estimation in the particle filter", Biometrika
 * 105(3)):
 * <pre>
 *   V = 1 − (N/(N−1))^(n+1) · (1 − Σ_e (Σ_{i: E_i = e} W_i)²)
 * </pre>
 * with W the final normalised weights, E_i the Eve index (iteration-0 ancestor) of particle i and
 * n the number of resampling steps. The estimator was derived for multinomial resampling, and
 * that is where it holds: over eight closed-form cases and 40 seeds each its mean matched the
 * observed variance of log Ẑ under multinomial resampling (pooled ratio of standard deviations
 * 1.03), but under systematic resampling it was 0.39–0.76 of the observed spread (pooled 0.57),
 * although the spread itself was the same under both schemes (benchmarks/RESULTS.md). Lower-variance
 * schemes keep more distinct Eves without making log Ẑ less variable, so the Eve-based formula reads
 * them as a smaller error; no single-run estimator is known for them. The estimate is therefore
 * marked unreliable, with the reason, when a non-multinomial scheme resampled at least once, when
 * it is not positive (the formula is a difference of nearly equal terms and can fall to or below
 * zero when few Eves remain), or when too few distinct Eves survive.
 */
public final class EvidenceError {

    private EvidenceError() {
    }

    /**
     * The estimate for a run's final particles.
     *
     * @param scheme              the resampling scheme the run used
     * @param resamplingSteps     how many times the population was resampled
     * @param minimumDistinctEves fewer distinct Eves than this marks the estimate unreliable
     */
    public static EvidenceEstimate estimate(double logEvidence, FinalParticles particles, double[] weights,
            ResamplingScheme scheme, int resamplingSteps, int minimumDistinctEves) {
        return estimate(logEvidence, particles.eve(), particles.size(), weights, scheme, resamplingSteps,
                minimumDistinctEves);
    }

    /**
     * The estimate from the Eve indices and normalised weights of {@code n} particles in canonical
     * order: all it needs of the final population (16 bytes a particle).
     */
    public static EvidenceEstimate estimate(double logEvidence, long[] eve, int n, double[] weights,
            ResamplingScheme scheme, int resamplingSteps, int minimumDistinctEves) {
        // Sort (Eve, index) pairs packed in one long each: groups in Eve order, members in
        // canonical order, with no object per particle.
        long[] order = new long[n];
        for (int i = 0; i < n; i++) {
            if (eve[i] < 0 || eve[i] > Integer.MAX_VALUE) {
                throw new IllegalArgumentException("eve[" + i + "] must be in [0, 2^31), was " + eve[i]);
            }
            order[i] = (eve[i] << 32) | i;
        }
        Arrays.sort(order);
        ExactSum sumOfSquares = new ExactSum();
        ExactSum group = new ExactSum();
        long distinct = 0;
        int k = 0;
        while (k < n) {
            long current = order[k] >>> 32;
            group.reset();
            boolean positive = false;
            while (k < n && (order[k] >>> 32) == current) {
                double w = weights[(int) order[k]];
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
        List<String> reasons = new ArrayList<>();
        if (distinct < minimumDistinctEves) {
            reasons.add("only " + distinct + " distinct iteration-0 ancestors remain (fewer than "
                    + minimumDistinctEves + ")");
        }
        if (!(relativeVariance > 0)) {
            reasons.add("the estimated variance is not positive (" + relativeVariance + ")");
            relativeVariance = Double.NaN;
        }
        if (scheme != ResamplingScheme.MULTINOMIAL && resamplingSteps > 0) {
            reasons.add("the estimate assumes multinomial resampling and understates the error under "
                    + scheme.name().toLowerCase(Locale.ROOT) + " resampling (set sampler.resampling.scheme = multinomial)");
        }
        double standardError = relativeVariance > 0 ? StrictMath.sqrt(StrictMath.log1p(relativeVariance)) : Double.NaN;
        boolean reliable = reasons.isEmpty();
        String warning = reliable ? null
                : "the single-run evidence error is unreliable: " + String.join("; ", reasons)
                        + "; replicate the run over seeds to judge the error";
        return new EvidenceEstimate(logEvidence, relativeVariance, standardError, distinct, reliable, warning, 0,
                Double.NaN);
    }
}
