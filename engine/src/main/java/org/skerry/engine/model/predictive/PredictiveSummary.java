package org.skerry.engine.model.predictive;

import java.util.List;
import org.skerry.engine.model.Quantity;

/**
 * The posterior predictive distribution of each observed value, summarised from replicate data
 * sets at equally weighted posterior draws: mean, standard deviation, the 2.5, 25, 50, 75 and
 * 97.5 % quantiles, and the standardised residual {@code (observed − mean) / sd} (Gelman et al.,
 * Bayesian Data Analysis, 3rd ed., §6.3), beside the observed values and their positions.
 * Immutable: every array accessor returns a copy.
 */
public final class PredictiveSummary {

    /** The probabilities of {@link #quantile(int)}, in order. */
    public static final List<Double> PROBABILITIES = List.of(0.025, 0.25, 0.5, 0.75, 0.975);

    private final int draws;
    private final Quantity observedQuantity;
    private final Quantity positionQuantity;
    private final double[] positions;
    private final double[] observed;
    private final double[] mean;
    private final double[] sd;
    private final double[][] quantiles;

    PredictiveSummary(int draws, Quantity observedQuantity, Quantity positionQuantity, double[] positions,
            double[] observed, double[] mean, double[] sd, double[][] quantiles) {
        this.draws = draws;
        this.observedQuantity = observedQuantity;
        this.positionQuantity = positionQuantity;
        this.positions = positions;
        this.observed = observed;
        this.mean = mean;
        this.sd = sd;
        this.quantiles = quantiles;
    }

    /** The number M of posterior draws, one replicate each. */
    public int draws() {
        return draws;
    }

    /** The number of observed values. */
    public int size() {
        return observed.length;
    }

    public Quantity observedQuantity() {
        return observedQuantity;
    }

    public Quantity positionQuantity() {
        return positionQuantity;
    }

    public double[] positions() {
        return positions.clone();
    }

    public double[] observed() {
        return observed.clone();
    }

    /** The predictive mean of each value: the mean of its M replicates. */
    public double[] mean() {
        return mean.clone();
    }

    /** The predictive standard deviation of each value: that of its M replicates (divisor M − 1). */
    public double[] sd() {
        return sd.clone();
    }

    /**
     * The quantile at {@code PROBABILITIES.get(level)} of each value, by linear interpolation
     * between order statistics (Hyndman &amp; Fan 1996, The American Statistician 50(4), 361–365,
     * definition 7).
     *
     * @throws IllegalArgumentException if {@code level} is not an index of {@link #PROBABILITIES}
     */
    public double[] quantile(int level) {
        if (level < 0 || level >= quantiles.length) {
            throw new IllegalArgumentException("level must be in [0, " + quantiles.length + ") for "
                    + PROBABILITIES + ", was " + level);
        }
        return quantiles[level].clone();
    }

    /**
     * {@code (observed − mean) / sd} per value; NaN where the predictive sd is 0 (every replicate
     * equal, as for a count out of zero trials).
     */
    public double[] residuals() {
        double[] out = new double[observed.length];
        for (int j = 0; j < out.length; j++) {
            out[j] = sd[j] > 0.0 ? (observed[j] - mean[j]) / sd[j] : Double.NaN;
        }
        return out;
    }
}
