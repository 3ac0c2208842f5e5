package org.skerry.engine.reference;

import org.apache.commons.math3.distribution.BetaDistribution;
import org.apache.commons.math3.special.Beta;
import org.apache.commons.math3.util.CombinatoricsUtils;

/**
 * Closed forms for binomial counts kᵢ ~ Binomial(nᵢ, p) under p ~ Beta(a, b) (Gelman et al.,
 * Bayesian Data Analysis, 3rd ed., §2.4): posterior {@code Beta(a + K, b + N − K)} with
 * {@code K = Σkᵢ}, {@code N = Σnᵢ}; evidence
 * {@code Σ log C(nᵢ, kᵢ) + log B(a + K, b + N − K) − log B(a, b)}, with Commons Math's
 * {@link Beta#logBeta} and {@link CombinatoricsUtils#binomialCoefficientLog}.
 */
public final class BetaBinomialExact {

    private final int[] successes;
    private final int[] trials;
    private final double a;
    private final double b;
    private final long sumK;
    private final long sumN;

    public BetaBinomialExact(int[] successes, int[] trials, double a, double b) {
        this.successes = successes.clone();
        this.trials = trials.clone();
        this.a = a;
        this.b = b;
        long k = 0;
        long n = 0;
        for (int i = 0; i < successes.length; i++) {
            k += successes[i];
            n += trials[i];
        }
        this.sumK = k;
        this.sumN = n;
    }

    public BetaBinomialExact(int k, int n, double a, double b) {
        this(new int[] {k}, new int[] {n}, a, b);
    }

    public double logEvidence() {
        double logC = 0.0;
        for (int i = 0; i < successes.length; i++) {
            logC += CombinatoricsUtils.binomialCoefficientLog(trials[i], successes[i]);
        }
        return logC + Beta.logBeta(a + sumK, b + sumN - sumK) - Beta.logBeta(a, b);
    }

    public BetaDistribution posterior() {
        return new BetaDistribution(a + sumK, b + sumN - sumK);
    }

    public double posteriorMean() {
        return (a + sumK) / (a + b + sumN);
    }

    /** The posterior's {@code probability}-quantile. */
    public double posteriorQuantile(double probability) {
        return posterior().inverseCumulativeProbability(probability);
    }
}
