package org.skerry.benchmarks;

import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.builtin.CostlyNormalModel;

/**
 * A portable source of the engine's synthetic {@link CostlyNormalModel} (N(1, 1) data, N(0, 3²)
 * prior, calibrated busy work per evaluation), so the Spark backend can rebuild the model on each
 * executor. Two sources with the same dimension and cost build the same model and share an id,
 * which lets an executor keep one model for both.
 */
public final class BusyModelSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final int dimension;
    private final long costMicros;

    public BusyModelSource(int dimension, long costMicros) {
        if (dimension < 1 || costMicros < 0) {
            throw new IllegalArgumentException("dimension must be >= 1 and cost >= 0, were " + dimension + ", "
                    + costMicros);
        }
        this.dimension = dimension;
        this.costMicros = costMicros;
    }

    @Override
    public Model create() {
        return CostlyNormalModel.of(dimension, costMicros);
    }

    @Override
    public String id() {
        return "benchmark-busy(d=" + dimension + ", cost=" + costMicros + "us)";
    }
}
