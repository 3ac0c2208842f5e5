package org.skerry.engine.model;

/**
 * A model that can only be simulated: its parameters and prior, summaries from
 * {@link SummarySimulator#simulate}, and no likelihood — a call for one is refused, naming the
 * model and how to run it (ABC). The base of the built-in simulators.
 */
public abstract class SimulationOnlyModel implements SummarySimulator {

    private final String name;
    private final ParameterSpace parameters;
    private final Prior prior;

    /**
     * @param name       the model's name, for the refusal of a likelihood call
     * @param parameters the parameters and their supports
     * @param prior      the prior over them
     */
    protected SimulationOnlyModel(String name, ParameterSpace parameters, Prior prior) {
        if (name == null || parameters == null || prior == null) {
            throw new IllegalArgumentException("name, parameters and prior must not be null, were " + name + ", "
                    + parameters + ", " + prior);
        }
        this.name = name;
        this.parameters = parameters;
        this.prior = prior;
    }

    @Override
    public final ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public final Prior prior() {
        return prior;
    }

    @Override
    public final double logLikelihood(double[] parameters, LikelihoodContext context) {
        throw new UnsupportedOperationException(name + " offers no likelihood to evaluate: run it with "
                + "sampler.sequence = abc");
    }
}
