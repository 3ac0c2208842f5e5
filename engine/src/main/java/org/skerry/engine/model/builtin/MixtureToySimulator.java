package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.SimulationOnlyModel;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Uniform;

/**
 * The toy mixture of Sisson, Fan &amp; Tanaka (2007, PNAS 104(6)) as a simulator (from memory):
 * {@code θ ~ U(−10, 10)}, one observation {@code x | θ ~ ½·N(θ, 1) + ½·N(θ, 1/100)}, observed
 * x = 0; the summary is x itself. Its posterior has a narrow spike on a broad base, which a
 * tolerance sequence must resolve. Immutable and thread-safe.
 */
public final class MixtureToySimulator extends SimulationOnlyModel {

    private final double observed;

    private MixtureToySimulator(double observed) {
        super("mixture-toy-simulator", ParameterSpace.of(List.of("theta"), List.of(Support.interval(-10, 10))),
                IndependentPrior.of(Uniform.of(-10, 10)));
        this.observed = observed;
    }

    /** The toy with observation {@code observed} (0 in the paper). */
    public static MixtureToySimulator of(double observed) {
        return new MixtureToySimulator(observed);
    }




    @Override
    public List<String> summaryNames() {
        return List.of("x");
    }

    @Override
    public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
        double sd = context.random().nextDouble() < 0.5 ? 1.0 : 0.1;
        summaries[0] = parameters[0] + sd * context.random().nextNormal();
    }

    @Override
    public double[] observedSummaries() {
        return new double[] {observed};
    }
}
