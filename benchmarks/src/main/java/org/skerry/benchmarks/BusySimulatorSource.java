package org.skerry.benchmarks;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.builtin.BusyWork;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;

/**
 * A portable source of a costly simulator for the ABC benchmarks: μ ~ N(0, 3²), the summary the
 * mean of ten N(μ, 1) draws, observed 1.0, and the same calibrated busy work per simulation as the
 * {@code costly-normal} model does per likelihood evaluation, so an ABC run and a likelihood run
 * of the same number of calls cost the same.
 */
public final class BusySimulatorSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final long costMicros;

    public BusySimulatorSource(long costMicros) {
        this.costMicros = costMicros;
    }

    @Override
    public Model create() {
        return new Simulator(BusyWork.unitsFor(costMicros));
    }

    @Override
    public String id() {
        return "benchmark-busy-simulator(cost=" + costMicros + "us)";
    }

    /** The simulator itself. */
    static final class Simulator implements SummarySimulator {
        private final ParameterSpace space = ParameterSpace.of(List.of("mu"), List.of(Support.real()));
        private final Prior prior = IndependentPrior.of(Normal.of(0, 3));
        private final long units;

        Simulator(long units) {
            this.units = units;
        }

        @Override
        public ParameterSpace parameters() {
            return space;
        }

        @Override
        public Prior prior() {
            return prior;
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new UnsupportedOperationException("a simulator");
        }

        @Override
        public List<String> summaryNames() {
            return List.of("mean");
        }

        @Override
        public double[] observedSummaries() {
            return new double[] {1.0};
        }

        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            long sink = BusyWork.work(units);
            double total = 0;
            for (int j = 0; j < 10; j++) {
                total += parameters[0] + context.random().nextNormal();
            }
            // The busy work's result enters as 0·sink, so the JIT cannot drop it.
            summaries[0] = total / 10 + 0.0 * sink;
        }
    }
}
