package org.skerry.cli;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.builtin.NormalMeanModel;

/**
 * A test model that stands for a model whose jar is on the driver's class path but was not
 * shipped to the executors: built outside a Spark task (the driver) it works; built inside one
 * (an executor, here Spark's local-mode executor) it fails as the JVM does when a class the model
 * needs is missing there.
 */
public final class MissingOnExecutorsModel implements Model {

    /** The class the "executors" lack. */
    public static final String MISSING = "com.example.OnlyOnTheDriver";

    private final Model shape = NormalMeanModel.of(new double[][] {{0.0}}, 1.0, 0.0, 1.0);

    public MissingOnExecutorsModel() {
        if (org.apache.spark.TaskContext.get() != null) {
            throw new NoClassDefFoundError(MISSING.replace('.', '/'));
        }
    }

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
        return shape.logLikelihood(parameters, context);
    }
}
