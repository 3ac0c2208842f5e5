package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.SimulationOnlyModel;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.Gamma;
import org.skerry.engine.model.prior.IndependentPrior;

/**
 * Poisson counts with a Gamma prior as a simulator: {@code λ ~ Gamma(a, b)} (shape, rate), n
 * counts {@code yⱼ ~ Poisson(λ)}, summarised by their total (sufficient; an integer, so with
 * unit distance weight and a tolerance below 1 ABC accepts only the observed total and its
 * posterior is the conjugate {@code Gamma(a + Σy, b + n)}, Gelman et al., Bayesian Data Analysis,
 * 3rd ed., §2.6). A simulation draws the total at once, as {@code Poisson(nλ)}, which has the
 * total's distribution. Immutable and thread-safe.
 */
public final class PoissonSumSimulator extends SimulationOnlyModel {

    private final int count;
    private final long total;

    private PoissonSumSimulator(long[] counts, double shape, double rate) {
        super("poisson-sum-simulator", ParameterSpace.of(List.of("lambda"), List.of(Support.positive())),
                IndependentPrior.of(Gamma.of(shape, rate)));
        if (counts.length < 1) {
            throw new IllegalArgumentException("poisson-sum-simulator needs at least one count");
        }
        long sum = 0;
        for (long y : counts) {
            if (y < 0) {
                throw new IllegalArgumentException("counts must be >= 0, one was " + y);
            }
            sum += y;
        }
        this.count = counts.length;
        this.total = sum;
    }

    /** The simulator for these counts and a {@code Gamma(shape, rate)} prior. */
    public static PoissonSumSimulator of(long[] counts, double shape, double rate) {
        return new PoissonSumSimulator(counts.clone(), shape, rate);
    }




    @Override
    public List<String> summaryNames() {
        return List.of("total");
    }

    @Override
    public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
        summaries[0] = PoissonDraw.draw(count * parameters[0], context.random());
    }

    @Override
    public double[] observedSummaries() {
        return new double[] {total};
    }

    /** Counts n. */
    public int count() {
        return count;
    }

    /** The observed total. */
    public long total() {
        return total;
    }
}
