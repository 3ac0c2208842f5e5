package org.skerry.cli;

import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.settings.ModelSettings;

/**
 * A test model named by class in run files: θ ~ N(0, 2²), log-likelihood −(θ − 1)²/2 plus a
 * little simulator noise, failing as its settings say: {@code above} (throws for θ above it),
 * {@code nan-below} (NaN for θ below it), {@code everywhere} (always throws), {@code flaky}
 * (throws on the first call of an evaluation whose first noise draw exceeds 2 in size, and
 * succeeds when the same draw comes again).
 */
public final class FailingTestModel implements Model {

    static final String REASON = "solver diverged";

    private final double above;
    private final double nanBelow;
    private final boolean everywhere;
    private final boolean flaky;
    private final Set<Long> seen = ConcurrentHashMap.newKeySet();
    private final Prior prior = IndependentPrior.of(Normal.of(0.0, 2.0));

    public FailingTestModel(ModelSettings settings) {
        this.above = settings.getDouble("above", Double.POSITIVE_INFINITY);
        this.nanBelow = settings.getDouble("nan-below", Double.NEGATIVE_INFINITY);
        this.everywhere = settings.getBoolean("everywhere", false);
        this.flaky = settings.getBoolean("flaky", false);
    }

    @Override
    public ParameterSpace parameters() {
        return ParameterSpace.of(List.of("theta"), List.of(Support.real()));
    }

    @Override
    public Prior prior() {
        return prior;
    }

    @Override
    public double logLikelihood(double[] x, LikelihoodContext context) {
        double noise = context.random().nextNormal();
        if (everywhere || x[0] > above) {
            throw new IllegalStateException(REASON);
        }
        if (x[0] < nanBelow) {
            return Double.NaN;
        }
        if (flaky && Math.abs(noise) > 2 && seen.add(Double.doubleToRawLongBits(noise))) {
            throw new IllegalStateException("simulator node busy");
        }
        return -0.5 * (x[0] - 1) * (x[0] - 1) + 0.01 * noise;
    }
}
