package org.skerry.engine.model.builtin;

import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.random.Philox4x32;

/**
 * A synthetic model for scaling studies: the conjugate normal-mean model with one observation per
 * coordinate ({@link NormalMeanModel}, so posterior and evidence are closed forms), whose every
 * likelihood evaluation first does a calibrated amount of {@link BusyWork}. In the straggler mode a
 * fraction of the evaluations costs {@code slowFactor} times more; which ones is decided from the
 * particle index and iteration alone, so runs stay reproducible and the answer never depends on
 * the cost. Immutable and thread-safe.
 */
public final class CostlyNormalModel implements Model {

    /** Philox key for choosing slow evaluations (any fixed value; not a sampler stream). */
    private static final int SLOW_KEY_0 = 0x5CA1E5;
    private static final int SLOW_KEY_1 = 0x51077;

    private final NormalMeanModel target;
    private final double costMicros;
    private final long units;
    private final long slowUnits;
    private final double slowFraction;
    private final double slowFactor;

    private CostlyNormalModel(NormalMeanModel target, double costMicros, double slowFraction, double slowFactor) {
        this.target = target;
        this.costMicros = costMicros;
        this.units = BusyWork.unitsFor(costMicros);
        this.slowUnits = BusyWork.unitsFor(costMicros * slowFactor);
        this.slowFraction = slowFraction;
        this.slowFactor = slowFactor;
    }

    /**
     * @param dimension    d ≥ 1 parameters {@code mu1 … mud} (or {@code mu} when d = 1)
     * @param costMicros   busy work per evaluation, in microseconds of one idle core (≥ 0)
     * @param slowFraction share of evaluations that are slow, in [0, 1)
     * @param slowFactor   how many times the cost a slow evaluation takes (≥ 1)
     * @param observation  the observed value of every coordinate
     * @param sigma        the known observation standard deviation
     * @param priorMean    prior mean of every coordinate
     * @param priorSd      prior standard deviation of every coordinate
     */
    public static CostlyNormalModel of(int dimension, double costMicros, double slowFraction, double slowFactor,
            double observation, double sigma, double priorMean, double priorSd) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        if (!(costMicros >= 0) || Double.isInfinite(costMicros)) {
            throw new IllegalArgumentException("costMicros must be finite and >= 0, was " + costMicros);
        }
        if (!(slowFraction >= 0 && slowFraction < 1)) {
            throw new IllegalArgumentException("slowFraction must be in [0, 1), was " + slowFraction);
        }
        if (!(slowFactor >= 1) || Double.isInfinite(slowFactor)) {
            throw new IllegalArgumentException("slowFactor must be finite and >= 1, was " + slowFactor);
        }
        double[] row = new double[dimension];
        java.util.Arrays.fill(row, observation);
        return new CostlyNormalModel(NormalMeanModel.of(new double[][] {row}, sigma, priorMean, priorSd),
                costMicros, slowFraction, slowFactor);
    }

    /** The model with the defaults {@code skerry models} lists: N(1, 1) data, N(0, 3²) prior. */
    public static CostlyNormalModel of(int dimension, double costMicros) {
        return of(dimension, costMicros, 0, 1, 1.0, 1.0, 0.0, 3.0);
    }

    /** The target without its cost: the closed forms of posterior and evidence hold for it. */
    public NormalMeanModel target() {
        return target;
    }

    /** Mean busy work per evaluation in microseconds, counting the slow ones. */
    public double meanCostMicros() {
        return costMicros * (1 - slowFraction + slowFraction * slowFactor);
    }

    @Override
    public ParameterSpace parameters() {
        return target.parameters();
    }

    @Override
    public Prior prior() {
        return target.prior();
    }

    @Override
    public double logLikelihood(double[] mu, LikelihoodContext context) {
        long spent = BusyWork.work(isSlow(context.particleIndex(), context.iteration()) ? slowUnits : units);
        // spent is never exactly Long.MIN_VALUE + 1 in practice; the test keeps the work alive.
        return target.logLikelihood(mu, context) + (spent == Long.MIN_VALUE + 1 ? Double.MIN_VALUE : 0.0);
    }

    /**
     * Whether the evaluation of this particle in this iteration is a slow one (public so that a
     * benchmark can count the exact work a run made).
     */
    public boolean isSlow(long particleIndex, int iteration) {
        if (slowFraction == 0) {
            return false;
        }
        int[] bits = new int[4];
        Philox4x32.block((int) particleIndex, (int) (particleIndex >>> 32), iteration, 0, SLOW_KEY_0, SLOW_KEY_1, bits);
        double uniform = ((bits[0] & 0xFFFFFFFFL) << 21 ^ (bits[1] & 0xFFFFFFFFL)) * 0x1.0p-53;
        return uniform < slowFraction;
    }

    @Override
    public String toString() {
        return "costly-normal(d=" + parameters().dimension() + ", cost=" + costMicros + " us"
                + (slowFraction > 0 ? ", " + slowFraction + " slow x" + slowFactor : "") + ")";
    }
}
