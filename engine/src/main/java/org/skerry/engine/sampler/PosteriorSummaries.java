package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.List;
import java.util.function.IntFunction;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.population.FinalParticles;

/**
 * Weighted posterior summaries from the final particles, on the driver at the end of a run, one
 * parameter's column at a time. Sums are exact and ties in sorting are broken by particle
 * position, so the summaries depend only on the particles, not on any grouping.
 */
public final class PosteriorSummaries {

    private static final double[] PROBABILITIES = {0.025, 0.05, 0.25, 0.5, 0.75, 0.95, 0.975};

    private PosteriorSummaries() {
    }

    public static List<ParameterSummary> summarise(FinalParticles particles, double[] weights, ParameterSpace space) {
        int n = particles.size();
        int d = particles.dimension();
        return summarise(a -> {
            double[] column = new double[n];
            for (int i = 0; i < n; i++) {
                column[i] = particles.value(i, a);
            }
            return column;
        }, n, d, weights, space);
    }

    /**
     * Summaries from {@code columns}, which gives parameter {@code a} of every particle in
     * canonical order; only one column is held at a time.
     */
    public static List<ParameterSummary> summarise(IntFunction<double[]> columns, int n, int d, double[] weights,
            ParameterSpace space) {
        List<ParameterSummary> summaries = new ArrayList<>(d);
        for (int a = 0; a < d; a++) {
            double[] column = columns.apply(a);
            ExactSum weightSum = new ExactSum();
            ExactSum first = new ExactSum();
            for (int i = 0; i < n; i++) {
                if (weights[i] > 0) {
                    weightSum.add(weights[i]);
                    first.add(weights[i] * column[i]);
                }
            }
            double total = weightSum.doubleValue();
            double mean = first.doubleValue() / total;
            ExactSum second = new ExactSum();
            for (int i = 0; i < n; i++) {
                if (weights[i] > 0) {
                    double deviation = column[i] - mean;
                    second.add(weights[i] * deviation * deviation);
                }
            }
            double sd = StrictMath.sqrt(Math.max(0.0, second.doubleValue() / total));
            double[] q = weightedQuantiles(column, weights, n, total, PROBABILITIES);
            summaries.add(new ParameterSummary(space.name(a), mean, sd, q[0], q[1], q[2], q[3], q[4], q[5], q[6]));
        }
        return summaries;
    }

    /**
     * Inverse of the weighted empirical distribution function at each probability: the smallest
     * value whose cumulative weight (in value order, ties by position) reaches {@code p·total}.
     * Only particles of positive weight count; they are put in order by {@link ValueOrder}.
     */
    public static double[] weightedQuantiles(double[] values, double[] weights, int n, double total,
            double[] probabilities) {
        int[] order = ValueOrder.positiveByValue(values, weights, n);
        double[] result = new double[probabilities.length];
        ExactSum cumulative = new ExactSum();
        int next = 0;
        int last = -1;
        for (int k = 0; k < order.length && next < probabilities.length; k++) {
            int i = order[k];
            cumulative.add(weights[i]);
            last = i;
            double reached = cumulative.doubleValue();
            while (next < probabilities.length && reached >= probabilities[next] * total) {
                result[next++] = values[i];
            }
        }
        while (next < probabilities.length) {
            result[next++] = last >= 0 ? values[last] : Double.NaN;
        }
        return result;
    }
}
