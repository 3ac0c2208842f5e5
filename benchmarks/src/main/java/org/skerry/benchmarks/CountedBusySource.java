package org.skerry.benchmarks;

import java.util.concurrent.atomic.LongAdder;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.builtin.CostlyNormalModel;

/**
 * The engine's {@link CostlyNormalModel} with stragglers, counting its evaluations and its slow
 * ones in this JVM, so a benchmark knows the exact busy work a run made (local mode only: the
 * executors must be threads of this JVM).
 */
final class CountedBusySource implements ModelSource {

    private static final long serialVersionUID = 1L;

    static final LongAdder EVALUATIONS = new LongAdder();
    static final LongAdder SLOW = new LongAdder();

    private final int dimension;
    private final double costMicros;
    private final double slowFraction;
    private final double slowFactor;

    CountedBusySource(int dimension, double costMicros, double slowFraction, double slowFactor) {
        this.dimension = dimension;
        this.costMicros = costMicros;
        this.slowFraction = slowFraction;
        this.slowFactor = slowFactor;
    }

    /** Busy work counted since the last reset, in microseconds of one idle core. */
    double workMicros() {
        long slow = SLOW.sum();
        return costMicros * ((EVALUATIONS.sum() - slow) + slow * slowFactor);
    }

    static void reset() {
        EVALUATIONS.reset();
        SLOW.reset();
    }

    @Override
    public Model create() {
        CostlyNormalModel model = CostlyNormalModel.of(dimension, costMicros, slowFraction, slowFactor, 1.0, 1.0, 0.0,
                3.0);
        return new Model() {
            @Override
            public ParameterSpace parameters() {
                return model.parameters();
            }

            @Override
            public Prior prior() {
                return model.prior();
            }

            @Override
            public double logLikelihood(double[] parameters, LikelihoodContext context) {
                EVALUATIONS.increment();
                if (model.isSlow(context.particleIndex(), context.iteration())) {
                    SLOW.increment();
                }
                return model.logLikelihood(parameters, context);
            }
        };
    }

    @Override
    public String id() {
        return "benchmark-counted-busy(d=" + dimension + ", cost=" + costMicros + "us, slow " + slowFraction + " x"
                + slowFactor + ")";
    }
}
