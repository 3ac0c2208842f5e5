package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.SimulationOnlyModel;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;

/**
 * The normal mean with known σ as a simulator: {@code μ ~ N(μ₀, τ²)}, n observations
 * {@code yⱼ ~ N(μ, σ²)}, summarised by their sample mean (sufficient, so the ABC posterior tends
 * to the conjugate posterior of Gelman et al., Bayesian Data Analysis, 3rd ed., §2.5, as the
 * tolerance shrinks). A simulation draws the n observations and averages them. Its likelihood is
 * not offered: it is there to check ABC against closed forms. Immutable and thread-safe.
 */
public final class NormalMeanSimulator extends SimulationOnlyModel {

    private final int count;
    private final double sigma;
    private final double observedMean;

    private NormalMeanSimulator(double[] observations, double sigma, double priorMean, double priorSd) {
        super("normal-mean-simulator", ParameterSpace.of(List.of("mu"), List.of(Support.real())),
                IndependentPrior.of(Normal.of(priorMean, priorSd)));
        if (observations.length < 1) {
            throw new IllegalArgumentException("normal-mean-simulator needs at least one observation");
        }
        if (!(sigma > 0)) {
            throw new IllegalArgumentException("sigma must be positive, was " + sigma);
        }
        this.count = observations.length;
        this.sigma = sigma;
        double total = 0;
        for (double y : observations) {
            total += y;
        }
        this.observedMean = total / count;
    }

    /** The simulator for these observations, σ and prior. */
    public static NormalMeanSimulator of(double[] observations, double sigma, double priorMean, double priorSd) {
        return new NormalMeanSimulator(observations.clone(), sigma, priorMean, priorSd);
    }




    @Override
    public List<String> summaryNames() {
        return List.of("mean");
    }

    @Override
    public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
        double total = 0;
        for (int j = 0; j < count; j++) {
            total += parameters[0] + sigma * context.random().nextNormal();
        }
        summaries[0] = total / count;
    }

    @Override
    public double[] observedSummaries() {
        return new double[] {observedMean};
    }

    /** Observations n. */
    public int count() {
        return count;
    }
}
