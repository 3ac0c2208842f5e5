package org.skerry.spark;

import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.builtin.NormalMeanModel;

/** A portable source of the conjugate normal-mean model, for the Spark tests. */
final class NormalMeanSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final double[][] rows;
    private final double sigma;
    private final double priorMean;
    private final double priorSd;
    private final String id;

    NormalMeanSource(double[][] rows, double sigma, double priorMean, double priorSd) {
        this.rows = rows;
        this.sigma = sigma;
        this.priorMean = priorMean;
        this.priorSd = priorSd;
        this.id = "normal-mean-" + java.util.Arrays.deepHashCode(rows) + "-" + sigma + "-" + priorMean + "-" + priorSd;
    }

    @Override
    public Model create() {
        return NormalMeanModel.of(rows, sigma, priorMean, priorSd);
    }

    @Override
    public String id() {
        return id;
    }
}
