package org.skerry.engine.abc;

import java.util.Arrays;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.target.Target;

/**
 * A target of adaptive ABC-SMC: {@code π(θ)·Πₘ f(xₘ | θ)·(1/M)·Σₘ K_ε(d(xₘ, y))} over the
 * parameters and M simulated data sets (Del Moral, Doucet &amp; Jasra 2012, Statistics and
 * Computing 22). A particle carries its M summary vectors as auxiliary values and, in the place
 * of a log-likelihood, {@code log (1/M)·Σₘ K_ε(dₘ)}; the distance weights each summary by
 * {@code weights}. At ε = +∞ (the first target) it is the prior. Its progress along the sequence is
 * kept apart from ε: when the distance weights are estimated again, ε is in new units and may
 * even grow, while the progress only grows, reaching 1 at the final tolerance. Immutable and
 * serialisable.
 */
public final class AbcTarget implements Target {

    private static final long serialVersionUID = 1L;

    private final double tolerance;
    private final double progress;
    private final double[] weights;
    private final double[] observed;
    private final AbcKernel kernel;
    private final int simulations;

    /**
     * @param tolerance      ε, +∞ for the first target
     * @param progress       progress along the sequence, in [0, 1]
     * @param weights        a weight per summary, null only at ε = +∞ before any is known
     * @param observed       the observed summaries
     * @param simulations    M, simulations per particle
     */
    public AbcTarget(double tolerance, double progress, double[] weights, double[] observed, AbcKernel kernel,
            int simulations) {
        if (!(tolerance > 0)) {
            throw new IllegalArgumentException("tolerance must be positive, was " + tolerance);
        }
        if (!(progress >= 0 && progress <= 1)) {
            throw new IllegalArgumentException("progress must be in [0, 1], was " + progress);
        }
        if (weights == null && tolerance != Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("a finite tolerance needs distance weights");
        }
        if (weights != null && weights.length != observed.length) {
            throw new IllegalArgumentException(weights.length + " weights for " + observed.length + " summaries");
        }
        if (simulations < 1) {
            throw new IllegalArgumentException("simulations must be >= 1, was " + simulations);
        }
        this.tolerance = tolerance;
        this.progress = progress;
        this.weights = weights == null ? null : weights.clone();
        this.observed = observed.clone();
        this.kernel = kernel;
        this.simulations = simulations;
    }

    /** ε. */
    public double tolerance() {
        return tolerance;
    }

    /** The distance weight of each summary (null at the first target). */
    public double[] weights() {
        return weights == null ? null : weights.clone();
    }

    public double[] observed() {
        return observed.clone();
    }

    public AbcKernel kernel() {
        return kernel;
    }

    /** M, simulations per particle. */
    public int simulations() {
        return simulations;
    }

    /** Auxiliary values per particle: M summary vectors. */
    public int width() {
        return simulations * observed.length;
    }

    /** {@code log (1/M)·Σₘ K_ε(dₘ)} of the summaries at {@code summaries[offset ..]}. */
    public double logMeanKernel(double[] summaries, int offset) {
        return Distance.logMeanKernel(summaries, offset, simulations, observed, weights, tolerance, kernel);
    }

    @Override
    public double progress() {
        return progress;
    }

    @Override
    public double logDensity(double logPrior, double logLikelihood) {
        return logPrior + logLikelihood;
    }

    /** Simulates M data sets at {@code parameters} and returns their log mean kernel (keeps no summaries). */
    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        double[] summaries = new double[width()];
        SimulationTerm.simulate(SummarySimulator.of(model), parameters, context, summaries, 0, simulations,
                new double[observed.length]);
        return logMeanKernel(summaries, 0);
    }

    @Override
    public boolean wholeLikelihood() {
        return false;
    }

    @Override
    public boolean usesLikelihood() {
        return true;
    }

    /** ε and the weights, for a checkpoint: {@code [ε, w₁ … w_s]}, or {@code [ε]} without weights. */
    double[] state() {
        double[] state = new double[1 + (weights == null ? 0 : weights.length)];
        state[0] = tolerance;
        if (weights != null) {
            System.arraycopy(weights, 0, state, 1, weights.length);
        }
        return state;
    }

    @Override
    public String toString() {
        return "tolerance " + tolerance + (weights == null ? "" : " (distance weights " + Arrays.toString(weights) + ")");
    }
}
