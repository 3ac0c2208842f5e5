package org.skerry.engine.model.plankton;

import java.util.Arrays;
import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.SimulationOnlyModel;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.builtin.PoissonDraw;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Uniform;
import org.skerry.engine.random.RandomStream;

/**
 * The demo's simulator: zooplankton counts in weekly net tows at one Lake Quellmar station
 * (invented scenario), from a stochastic Ricker population model with Poisson sampling (Wood
 * 2010, Nature 466): {@code Nₜ₊₁ = r·Nₜ·exp(−Nₜ + eₜ)}, {@code eₜ ~ N(0, σ²)}, and the count of a
 * tow {@code yₜ ~ Poisson(φ·Nₜ)}, N₀ = 1 and a burn-in of {@link #BURN_IN} weeks before the first
 * tow. Its likelihood is intractable (the population is never seen); it is calibrated by ABC on
 * summaries in the spirit of Wood's: the mean count, the number of empty tows, the
 * autocorrelations of the counts at lags 1 and 2, and the two coefficients of the regression of
 * {@code yₜ₊₁^0.3} on {@code yₜ^0.3} and {@code yₜ^0.6} (our selection of six). Parameters
 * {@code log_r}, {@code sigma}, {@code phi}, with uniform priors. Immutable and thread-safe.
 */
public final class ZooplanktonRicker extends SimulationOnlyModel {

    /** Weeks simulated before the first tow, so the start N₀ = 1 is forgotten. */
    public static final int BURN_IN = 50;
    /** Parameter names, in order. */
    public static final List<String> PARAMETER_NAMES = List.of("log_r", "sigma", "phi");
    /** Summary names, in order. */
    public static final List<String> SUMMARY_NAMES = List.of("mean", "empty_tows", "acf1", "acf2", "reg_linear",
            "reg_quadratic");

    /** The demo's stated true parameters ({@code log_r, sigma, phi}), from which its synthetic tows are drawn. */
    public static final double[] TRUE_PARAMETERS = {3.8, 0.3, 10.0};
    /** Weekly tows in the demo season. */
    public static final int DEMO_WEEKS = 40;
    /** The demo's data file, in {@code conf/demo/data}. */
    public static final String DEMO_FILE = "tows-north-basin.csv";

    private final int weeks;
    private final double[] observed;

    private ZooplanktonRicker(int weeks, double[] counts) {
        super("zooplankton-ricker", ParameterSpace.of(PARAMETER_NAMES,
                List.of(Support.interval(2, 5), Support.interval(0.05, 0.8), Support.interval(2, 20))),
                IndependentPrior.of(Uniform.of(2, 5), Uniform.of(0.05, 0.8), Uniform.of(2, 20)));
        if (weeks < 5) {
            throw new IllegalArgumentException("zooplankton-ricker needs at least 5 weekly tows, had " + weeks);
        }
        this.weeks = weeks;
        this.observed = counts == null ? null : summaries(counts);
    }

    /** The simulator for the observed tow counts {@code counts} (whole numbers, one per week). */
    public static ZooplanktonRicker of(double[] counts) {
        for (double c : counts) {
            if (!(c >= 0) || c != Math.rint(c)) {
                throw new IllegalArgumentException("tow counts are whole numbers >= 0, one was " + c);
            }
        }
        return new ZooplanktonRicker(counts.length, counts.clone());
    }

    /** The simulator for {@code weeks} tows without observed counts (for generating data). */
    public static ZooplanktonRicker withoutData(int weeks) {
        return new ZooplanktonRicker(weeks, null);
    }




    @Override
    public List<String> summaryNames() {
        return SUMMARY_NAMES;
    }

    @Override
    public double[] observedSummaries() {
        return observed == null ? null : observed.clone();
    }

    @Override
    public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
        double[] counts = counts(parameters, weeks, context.random());
        System.arraycopy(summaries(counts), 0, summaries, 0, SUMMARY_NAMES.size());
    }

    /** The weekly tow counts of one simulated season at {@code parameters} ({@code log_r, sigma, phi}). */
    public static double[] counts(double[] parameters, int weeks, RandomStream random) {
        double r = StrictMath.exp(parameters[0]);
        double sigma = parameters[1];
        double phi = parameters[2];
        double n = 1.0;
        double[] counts = new double[weeks];
        for (int t = 0; t < BURN_IN + weeks; t++) {
            n = r * n * StrictMath.exp(-n + sigma * random.nextNormal());
            if (t >= BURN_IN) {
                counts[t - BURN_IN] = PoissonDraw.draw(phi * n, random);
            }
        }
        return counts;
    }

    /** The six summaries of a season's counts, in the order of {@link #SUMMARY_NAMES}. */
    public static double[] summaries(double[] y) {
        int n = y.length;
        double mean = 0;
        int empty = 0;
        for (double v : y) {
            mean += v;
            empty += v == 0 ? 1 : 0;
        }
        mean /= n;
        double variance = 0;
        for (double v : y) {
            variance += (v - mean) * (v - mean);
        }
        double acf1 = 0;
        double acf2 = 0;
        for (int t = 0; t + 1 < n; t++) {
            acf1 += (y[t] - mean) * (y[t + 1] - mean);
        }
        for (int t = 0; t + 2 < n; t++) {
            acf2 += (y[t] - mean) * (y[t + 2] - mean);
        }
        acf1 = variance > 0 ? acf1 / variance : 0;
        acf2 = variance > 0 ? acf2 / variance : 0;
        // Least squares of y_{t+1}^0.3 on (y_t^0.3, y_t^0.6), no intercept, from the 2×2 normal equations.
        double a11 = 0;
        double a12 = 0;
        double a22 = 0;
        double b1 = 0;
        double b2 = 0;
        for (int t = 0; t + 1 < n; t++) {
            double x1 = StrictMath.pow(y[t], 0.3);
            double x2 = x1 * x1;
            double z = StrictMath.pow(y[t + 1], 0.3);
            a11 += x1 * x1;
            a12 += x1 * x2;
            a22 += x2 * x2;
            b1 += x1 * z;
            b2 += x2 * z;
        }
        double det = a11 * a22 - a12 * a12;
        double linear = 0;
        double quadratic = 0;
        if (det > 1e-12 * Math.max(1, a11 * a22)) {
            linear = (a22 * b1 - a12 * b2) / det;
            quadratic = (a11 * b2 - a12 * b1) / det;
        }
        return new double[] {mean, empty, acf1, acf2, linear, quadratic};
    }

    /**
     * The demo's synthetic season as CSV text: a notice that the data are synthetic and from which
     * parameters, a header {@code week,count}, then the {@link #DEMO_WEEKS} counts drawn from
     * {@link #TRUE_PARAMETERS} with the stream keyed by {@code seed}.
     */
    public static String demoCsv(long seed) {
        double[] counts = counts(TRUE_PARAMETERS, DEMO_WEEKS,
                new RandomStream(seed, org.skerry.engine.random.StreamPurpose.DATA_GENERATION, 0, 0));
        StringBuilder text = new StringBuilder();
        text.append("# Synthetic data: generated by skerry's Lake Quellmar generator from stated true parameters; "
                + "not real measurements.\n");
        text.append("# Lake Quellmar (fictional), north basin, weekly zooplankton net tows, seed ").append(seed)
                .append(", stochastic Ricker model with Poisson sampling, true log_r = ").append(TRUE_PARAMETERS[0])
                .append(", sigma = ").append(TRUE_PARAMETERS[1]).append(", phi = ").append(TRUE_PARAMETERS[2])
                .append('\n');
        text.append("week,count\n");
        for (int t = 0; t < counts.length; t++) {
            text.append(t + 1).append(',').append((long) counts[t]).append('\n');
        }
        return text.toString();
    }

    @Override
    public String toString() {
        return "zooplankton-ricker(" + weeks + " tows, observed " + Arrays.toString(observed) + ")";
    }
}
