package org.skerry.engine.model.builtin;

import java.util.List;
import org.apache.commons.math3.util.CombinatoricsUtils;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.Beta;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.random.RandomStream;

/**
 * A success probability p from binomial counts {@code kᵢ ~ Binomial(nᵢ, p)} under the conjugate
 * prior {@code p ~ Beta(a, b)} (Gelman et al., Bayesian Data Analysis, 3rd ed., §2.4): posterior
 * {@code Beta(a + Σk, b + Σn − Σk)}. The log-likelihood keeps the binomial coefficients, so the
 * evidence is that of the counts themselves. Immutable and thread-safe.
 *
 * <p>Observation {@code i} is the count pair {@code (kᵢ, nᵢ)}, in the order given. A range sums
 * its binomial coefficients in that order from 0 and its counts as whole numbers, which for the
 * whole range is exactly the full likelihood's arithmetic: the two agree bit for bit.
 *
 * <p>As a {@link PredictiveModel} its observed values are the success counts kᵢ in row order,
 * positioned at their row number; a replicate draws {@code Binomial(nᵢ, p)} counts in that order
 * ({@link BinomialDraw}), so at posterior draws of p they follow the beta-binomial predictive.
 */
public final class BetaBinomialModel implements ObservationLikelihood, PredictiveModel {

    private static final Quantity OBSERVED = Quantity.unitless("successes");

    private static final ParameterSpace PARAMETERS =
            ParameterSpace.of(List.of("p"), List.of(Support.interval(0.0, 1.0)));

    private final IndependentPrior prior;
    private final long successes;
    private final long failures;
    private final double logCoefficients;
    private final int[] successCounts;
    private final int[] failureCounts;
    private final double[] logCoefficient;

    private BetaBinomialModel(int[] k, int[] n, double a, double b) {
        this.prior = IndependentPrior.of(Beta.of(a, b));
        this.successCounts = k;
        this.failureCounts = new int[k.length];
        this.logCoefficient = new double[k.length];
        long sumK = 0;
        long sumN = 0;
        double logC = 0.0;
        for (int i = 0; i < k.length; i++) {
            sumK += k[i];
            sumN += n[i];
            failureCounts[i] = n[i] - k[i];
            logCoefficient[i] = CombinatoricsUtils.binomialCoefficientLog(n[i], k[i]);
            logC += logCoefficient[i];
        }
        this.successes = sumK;
        this.failures = sumN - sumK;
        this.logCoefficients = logC;
    }

    /**
     * @param successes the counts kᵢ
     * @param trials the trial numbers nᵢ, with {@code 0 <= kᵢ <= nᵢ}
     * @param a the prior's first shape
     * @param b the prior's second shape
     * @throws IllegalArgumentException if the arrays are empty or differ in length, a count is
     *     out of range, or a shape is not finite and positive
     */
    public static BetaBinomialModel of(int[] successes, int[] trials, double a, double b) {
        if (successes.length == 0) {
            throw new IllegalArgumentException("successes must not be empty");
        }
        if (successes.length != trials.length) {
            throw new IllegalArgumentException("successes has " + successes.length
                    + " counts but trials has " + trials.length);
        }
        for (int i = 0; i < successes.length; i++) {
            if (trials[i] < 0 || successes[i] < 0 || successes[i] > trials[i]) {
                throw new IllegalArgumentException("need 0 <= successes <= trials, was successes["
                        + i + "]=" + successes[i] + ", trials[" + i + "]=" + trials[i]);
            }
        }
        Data.positive("a", a);
        Data.positive("b", b);
        return new BetaBinomialModel(successes.clone(), trials.clone(), a, b);
    }

    /** One count: {@code k} successes in {@code n} trials. */
    public static BetaBinomialModel of(int k, int n, double a, double b) {
        return of(new int[] {k}, new int[] {n}, a, b);
    }

    @Override
    public ParameterSpace parameters() {
        return PARAMETERS;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    /** Σ kᵢ. */
    public long totalSuccesses() {
        return successes;
    }

    /** Σ (nᵢ − kᵢ). */
    public long totalFailures() {
        return failures;
    }

    @Override
    public double logLikelihood(double[] parameters, LikelihoodContext context) {
        double p = parameters[0];
        if (!(p > 0.0 && p < 1.0)) {
            return Double.NEGATIVE_INFINITY;
        }
        return logCoefficients + successes * StrictMath.log(p) + failures * StrictMath.log1p(-p);
    }

    @Override
    public int observationCount() {
        return successCounts.length;
    }

    @Override
    public double logLikelihood(double[] parameters, int fromObservation, int toObservation,
            LikelihoodContext context) {
        ObservationLikelihood.checkRange(fromObservation, toObservation, successCounts.length);
        if (fromObservation == toObservation) {
            return 0.0;
        }
        double p = parameters[0];
        if (!(p > 0.0 && p < 1.0)) {
            return Double.NEGATIVE_INFINITY;
        }
        long rangeSuccesses = 0;
        long rangeFailures = 0;
        double logC = 0.0;
        for (int i = fromObservation; i < toObservation; i++) {
            rangeSuccesses += successCounts[i];
            rangeFailures += failureCounts[i];
            logC += logCoefficient[i];
        }
        return logC + rangeSuccesses * StrictMath.log(p) + rangeFailures * StrictMath.log1p(-p);
    }

    @Override
    public int observedCount() {
        return successCounts.length;
    }

    @Override
    public double[] observedValues() {
        double[] out = new double[successCounts.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = successCounts[i];
        }
        return out;
    }

    @Override
    public Quantity observedQuantity() {
        return OBSERVED;
    }

    @Override
    public void replicate(double[] parameters, RandomStream random, double[] out) {
        PredictiveModel.checkReplicate(out, successCounts.length);
        double p = parameters[0];
        for (int i = 0; i < successCounts.length; i++) {
            out[i] = BinomialDraw.draw(successCounts[i] + failureCounts[i], p, random);
        }
    }

    @Override
    public String toString() {
        return "beta-binomial(successes=" + successes + ", failures=" + failures + ", prior "
                + prior.marginal(0) + ")";
    }
}
