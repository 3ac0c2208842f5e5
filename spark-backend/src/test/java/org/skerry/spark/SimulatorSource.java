package org.skerry.spark;

import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.builtin.NormalMeanSimulator;

/** A portable source of the normal-mean simulator (no likelihood), for the ABC Spark tests. */
final class SimulatorSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final double[] data;

    SimulatorSource(double[] data) {
        this.data = data.clone();
    }

    @Override
    public Model create() {
        return NormalMeanSimulator.of(data, 1.0, 0.0, 3.0);
    }

    @Override
    public String id() {
        return "normal-mean-simulator-" + java.util.Arrays.hashCode(data);
    }
}
