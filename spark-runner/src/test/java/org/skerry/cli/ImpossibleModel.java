package org.skerry.cli;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.builtin.NormalMeanModel;

/**
 * A test model whose likelihood is zero everywhere (log-likelihood −∞, a valid zero), so every
 * weight becomes zero and the run must fail; its prior is the normal-mean model's.
 */
public final class ImpossibleModel implements Model {

    private final Model shape = NormalMeanModel.of(new double[][] {{0.0}}, 1.0, 0.0, 1.0);

    @Override
    public ParameterSpace parameters() {
        return shape.parameters();
    }

    @Override
    public Prior prior() {
        return shape.prior();
    }

    @Override
    public double logLikelihood(double[] parameters, LikelihoodContext context) {
        return Double.NEGATIVE_INFINITY;
    }
}
