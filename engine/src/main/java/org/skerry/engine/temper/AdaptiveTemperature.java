package org.skerry.engine.temper;

import org.skerry.engine.math.ExactSum;
import org.skerry.engine.population.TemperingInputs;

/**
 * Adaptive tempering: the next temperature is found by bisection so that the conditional
 * effective sample size of the incremental weights, as a fraction of N, equals a target
 * (Zhou, Johansen &amp; Aston 2016, JCGS 25(3); adaptive tempering after Jasra, Stephens,
 * Doucet &amp; Tsagaris 2011, Scand. J. Stat. 38):
 * <pre>
 *   CESS(Δ)/N = (Σ W_i g_i)² / Σ W_i g_i²,   g_i = L_i^Δ,  W the current normalised weights.
 * </pre>
 * When even the jump to φ = 1 keeps the fraction at or above the target, the rule returns 1.
 * Sums are exact and exponentials come from {@link StrictMath}, so the chosen temperature is the
 * same whatever the order of the particles.
 */
public final class AdaptiveTemperature implements TemperatureRule {

    /** Default target fraction of N for the conditional ESS (common practice). */
    public static final double DEFAULT_TARGET = 0.5;

    private static final int BISECTION_STEPS = 64;

    private final double target;

    /** @param target the conditional-ESS fraction to hit, in (0, 1) */
    public AdaptiveTemperature(double target) {
        if (!(target > 0 && target < 1)) {
            throw new IllegalArgumentException("conditional ESS target must be in (0, 1), was " + target);
        }
        this.target = target;
    }

    public double target() {
        return target;
    }

    @Override
    public double next(double current, TemperingInputs inputs, double logTotal) {
        int n = inputs.size();
        double[] logWeight = inputs.logWeight();
        double[] logLikelihood = inputs.logLikelihood();
        // Keep only particles with positive weight and likelihood: the others have g_i = 0.
        double[] weight = new double[n];
        double[] centred = new double[n];
        double maxLogLikelihood = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (logWeight[i] != Double.NEGATIVE_INFINITY && logLikelihood[i] != Double.NEGATIVE_INFINITY) {
                maxLogLikelihood = Math.max(maxLogLikelihood, logLikelihood[i]);
            }
        }
        int alive = 0;
        for (int i = 0; i < n; i++) {
            if (logWeight[i] != Double.NEGATIVE_INFINITY && logLikelihood[i] != Double.NEGATIVE_INFINITY) {
                weight[alive] = StrictMath.exp(logWeight[i] - logTotal);
                centred[alive] = logLikelihood[i] - maxLogLikelihood;
                alive++;
            }
        }
        if (alive == 0) {
            // Every particle dies whatever the step; let the sampler report it.
            return Math.min(1.0, current + (1.0 - current));
        }
        double span = 1.0 - current;
        if (conditionalFraction(weight, centred, alive, span) >= target) {
            return 1.0;
        }
        double low = 0.0;
        double high = span;
        for (int step = 0; step < BISECTION_STEPS; step++) {
            double middle = 0.5 * (low + high);
            if (middle <= low || middle >= high) {
                break;
            }
            if (conditionalFraction(weight, centred, alive, middle) >= target) {
                low = middle;
            } else {
                high = middle;
            }
        }
        double next = current + (low > 0 ? low : high);
        return next >= 1.0 ? 1.0 : next;
    }

    /** The conditional ESS fraction for a temperature step {@code delta}. */
    static double conditionalFraction(double[] weight, double[] centredLogLikelihood, int count, double delta) {
        ExactSum first = new ExactSum();
        ExactSum second = new ExactSum();
        for (int i = 0; i < count; i++) {
            double g = StrictMath.exp(delta * centredLogLikelihood[i]);
            double wg = weight[i] * g;
            first.add(wg);
            second.add(wg * g);
        }
        double numerator = first.doubleValue();
        double denominator = second.doubleValue();
        if (!(denominator > 0)) {
            return 0.0;
        }
        return numerator * numerator / denominator;
    }

    /**
     * The conditional ESS fraction of a step {@code delta} for the given inputs, computed directly
     * from its definition; exposed for tests and diagnostics.
     */
    public static double conditionalEssFraction(TemperingInputs inputs, double logTotal, double delta) {
        int n = inputs.size();
        ExactSum first = new ExactSum();
        ExactSum second = new ExactSum();
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (inputs.logWeight()[i] != Double.NEGATIVE_INFINITY) {
                max = Math.max(max, delta * inputs.logLikelihood()[i]);
            }
        }
        for (int i = 0; i < n; i++) {
            double w = StrictMath.exp(inputs.logWeight()[i] - logTotal);
            if (w == 0.0) {
                continue;
            }
            double g = StrictMath.exp(TemperedTarget.logIncrement(inputs.logLikelihood()[i], delta) - max);
            first.add(w * g);
            second.add(w * g * g);
        }
        double numerator = first.doubleValue();
        return numerator * numerator / second.doubleValue();
    }

    @Override
    public String toString() {
        return "adaptive(conditional ESS fraction " + target + ")";
    }
}
