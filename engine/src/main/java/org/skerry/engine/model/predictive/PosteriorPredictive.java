package org.skerry.engine.model.predictive;

import java.util.Arrays;
import java.util.stream.IntStream;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * The posterior predictive distribution of a model's observed values from a weighted
 * population: M posterior draws chosen by {@link PosteriorDraws}, one replicate data set
 * simulated at each, summarised per value as a {@link PredictiveSummary} (Gelman et al.,
 * Bayesian Data Analysis, 3rd ed., §6.3). A pure function of its arguments: replicate {@code k}
 * draws from the stream {@code (seed, PREDICTIVE, iteration 0, particle index k, step 0)}, so the
 * same particles, weights and seed give the same summary bit for bit.
 */
public final class PosteriorPredictive {

    /** A draw count that makes the 95 % band's ends settle to a few percent of its width. */
    public static final int DEFAULT_DRAWS = 400;

    /** The step of the {@code PREDICTIVE} stream that replicate {@code k} draws from. */
    static final int REPLICATE_STEP = 0;

    private PosteriorPredictive() {
    }

    /**
     * Summarises the predictive distribution at the final particles.
     *
     * @param weights the particles' normalised weights, in the particles' order
     * @throws IllegalArgumentException as {@link #summarise(PredictiveModel, double[], int, double[], int, long)}
     */
    public static PredictiveSummary summarise(PredictiveModel model, FinalParticles particles, double[] weights,
            int draws, long seed) {
        if (particles == null) {
            throw new IllegalArgumentException("particles must not be null");
        }
        if (particles.dimension() != model.dimension()) {
            throw new IllegalArgumentException("particles have dimension " + particles.dimension() + ", model "
                    + model + " has " + model.dimension());
        }
        return summarise(model, particles.values(), particles.size(), weights, draws, seed);
    }

    /**
     * Summarises the predictive distribution at {@code size} parameter vectors held back to back
     * in {@code values} (vector {@code i} at {@code [i·d, i·d + d)}, {@code d} the model's
     * dimension) with normalised weights {@code weights[0 .. size)}.
     *
     * @throws IllegalArgumentException if the model is null, {@code values} holds fewer than
     *     {@code size} vectors, {@code draws < 2}, or the weights are as {@link PosteriorDraws#choose}
     *     refuses
     * @throws IllegalStateException naming the draw and particle if a replicate fails or holds a
     *     value that is not finite
     */
    public static PredictiveSummary summarise(PredictiveModel model, double[] values, int size, double[] weights,
            int draws, long seed) {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        int d = model.dimension();
        if (values == null || size < 1 || values.length < (long) size * d) {
            throw new IllegalArgumentException("values must hold " + size + " vectors of " + d + " parameters, was "
                    + (values == null ? "null" : "of length " + values.length));
        }
        if (draws < 2) {
            throw new IllegalArgumentException("draws must be >= 2 for a standard deviation, was " + draws);
        }
        int[] chosen = PosteriorDraws.choose(weights, size, draws, seed);
        int n = model.observedCount();
        if ((long) n * draws > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("draws " + draws + " × " + n + " observed values of model " + model
                    + " do not fit one array; ask for fewer draws");
        }
        // By value, then by draw, so each value's replicates are contiguous for its sort.
        double[] replicates = new double[n * draws];
        // Draws are independent and each has its own keyed stream, so they run in parallel with
        // the same result bit for bit; a report's cost is mostly these simulations (one ODE solve each).
        RuntimeException[] failures = new RuntimeException[draws];
        IntStream.range(0, draws).parallel().forEach(k -> {
            double[] parameters = new double[d];
            double[] replicate = new double[n];
            System.arraycopy(values, chosen[k] * d, parameters, 0, d);
            RandomStream random = new RandomStream(seed, StreamPurpose.PREDICTIVE, 0, k, REPLICATE_STEP);
            try {
                simulate(model, parameters, random, replicate, k, chosen[k]);
            } catch (RuntimeException e) {
                failures[k] = e;
                return;
            }
            for (int j = 0; j < n; j++) {
                replicates[j * draws + k] = replicate[j];
            }
        });
        // The first failing draw in draw order, whichever thread met it first: the same message every time.
        for (RuntimeException failure : failures) {
            if (failure != null) {
                throw failure;
            }
        }
        return summary(model, replicates, n, draws);
    }

    private static void simulate(PredictiveModel model, double[] parameters, RandomStream random, double[] out,
            int draw, int particle) {
        try {
            model.replicate(parameters, random, out);
        } catch (RuntimeException e) {
            throw new IllegalStateException("replicate of draw " + draw + " (particle " + particle + ", parameters "
                    + Arrays.toString(parameters) + ") failed: " + e.getMessage(), e);
        }
        for (int j = 0; j < model.observedCount(); j++) {
            if (!Double.isFinite(out[j])) {
                throw new IllegalStateException("replicate of draw " + draw + " (particle " + particle
                        + ", parameters " + Arrays.toString(parameters) + ") gave value " + j + " = " + out[j]);
            }
        }
    }

    private static PredictiveSummary summary(PredictiveModel model, double[] replicates, int n, int draws) {
        double[] mean = new double[n];
        double[] sd = new double[n];
        double[][] quantiles = new double[PredictiveSummary.PROBABILITIES.size()][n];
        double[] sorted = new double[draws];
        for (int j = 0; j < n; j++) {
            System.arraycopy(replicates, j * draws, sorted, 0, draws);
            double sum = 0.0;
            for (double x : sorted) {
                sum += x;
            }
            double m = sum / draws;
            // Two passes: the centred sum of squares does not cancel as Σx² − M·m² would.
            double squares = 0.0;
            for (double x : sorted) {
                squares += (x - m) * (x - m);
            }
            mean[j] = m;
            sd[j] = StrictMath.sqrt(squares / (draws - 1));
            Arrays.sort(sorted);
            for (int q = 0; q < quantiles.length; q++) {
                quantiles[q][j] = quantile(sorted, PredictiveSummary.PROBABILITIES.get(q));
            }
        }
        double[] positions = model.positions();
        double[] observed = model.observedValues();
        if (positions.length != n || observed.length != n) {
            throw new IllegalStateException("model " + model + " gives " + observed.length + " observed values and "
                    + positions.length + " positions, but observedCount() is " + n);
        }
        return new PredictiveSummary(draws, model.observedQuantity(), model.positionQuantity(), positions, observed,
                mean, sd, quantiles);
    }

    /** Hyndman &amp; Fan's definition 7: {@code h = (M − 1)p}, interpolate between x_⌊h⌋ and x_⌊h⌋+1. */
    static double quantile(double[] sorted, double p) {
        double h = (sorted.length - 1) * p;
        int low = (int) h;
        if (low + 1 >= sorted.length) {
            return sorted[sorted.length - 1];
        }
        return sorted[low] + (h - low) * (sorted[low + 1] - sorted[low]);
    }
}
