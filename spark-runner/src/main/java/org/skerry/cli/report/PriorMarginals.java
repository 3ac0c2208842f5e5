package org.skerry.cli.report;

import java.util.ArrayList;
import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.MultivariateNormalPrior;

/**
 * Each parameter's prior density, for the overlay on its posterior histogram: the model is built
 * again from the run's {@code run.conf} by the code the run used ({@link RebuiltModel}), and the
 * marginals are read off an independent or multivariate normal prior. Any other prior, or a model
 * that cannot be built here (a data file moved, a class not on the class path), gives no overlay
 * and a note saying why: the report does not need it.
 *
 * @param densities per parameter, the marginal density (not its log); empty when {@code note} says why
 * @param note      why there is no overlay; null when there is one
 */
record PriorMarginals(List<DoubleUnaryOperator> densities, String note) {

    PriorMarginals {
        densities = List.copyOf(densities);
    }

    boolean available() {
        return note == null;
    }

    static PriorMarginals of(RebuiltModel rebuilt, List<String> parameters) {
        if (rebuilt.model() == null) {
            return none(rebuilt.note());
        }
        Model model = rebuilt.model();
        Prior prior = model.prior();
        List<DoubleUnaryOperator> densities = new ArrayList<>();
        if (prior instanceof IndependentPrior independent) {
            for (int i = 0; i < parameters.size(); i++) {
                var marginal = independent.marginal(i);
                densities.add(x -> Math.exp(marginal.logDensity(x)));
            }
        } else if (prior instanceof MultivariateNormalPrior normal) {
            for (int i = 0; i < parameters.size(); i++) {
                double mean = normal.mean()[i];
                double sd = Math.sqrt(normal.covariance()[i][i]);
                densities.add(x -> Math.exp(-0.5 * ((x - mean) / sd) * ((x - mean) / sd)) / (sd * Math.sqrt(2 * Math.PI)));
            }
        } else {
            return none("the model's prior (" + prior.getClass().getSimpleName()
                    + ") has no marginal densities the report knows how to draw");
        }
        return new PriorMarginals(densities, null);
    }

    private static PriorMarginals none(String why) {
        return new PriorMarginals(List.of(), why);
    }
}
