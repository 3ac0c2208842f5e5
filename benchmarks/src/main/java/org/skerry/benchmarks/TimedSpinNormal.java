package org.skerry.benchmarks;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.settings.ModelSettings;

/**
 * The in-JVM side of {@code benchmarks/program-vs-jvm.py}: the likelihood of benchmarks/program-worker.py
 * (every coordinate observed at 1, known sd 1, normal(0, 3) priors) after a timed busy wait of
 * {@code cost-micros}. A timed wait, unlike the engine's BusyWork, costs the same wall time in Java
 * and in Python whatever either language's speed, so the two runs differ only by the protocol.
 */
public final class TimedSpinNormal implements Model {

    private static final double CONSTANT = -0.5 * Math.log(2 * Math.PI);

    private final ParameterSpace space;
    private final IndependentPrior prior;
    private final long costNanos;

    public TimedSpinNormal(ModelSettings settings) {
        int dimension = settings.getInt("dimension", 2);
        List<String> names = new ArrayList<>();
        List<Support> supports = new ArrayList<>();
        for (int i = 1; i <= dimension; i++) {
            names.add("mu" + i);
            supports.add(Support.real());
        }
        this.space = ParameterSpace.of(names, supports);
        this.prior = IndependentPrior.iid(Normal.of(0, 3), dimension);
        this.costNanos = Math.round(settings.getDouble("cost-micros", 1000) * 1000);
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
    public double logLikelihood(double[] mu, LikelihoodContext context) {
        long until = System.nanoTime() + costNanos;
        while (System.nanoTime() < until) {
            Thread.onSpinWait();
        }
        double total = 0;
        for (double value : mu) {
            double z = 1.0 - value;
            total += CONSTANT - 0.5 * z * z;
        }
        return total;
    }
}
