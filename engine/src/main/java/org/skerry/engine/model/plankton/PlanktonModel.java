package org.skerry.engine.model.plankton;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.UnivariateDistribution;
import org.skerry.engine.random.RandomStream;

/**
 * A nutrient–phytoplankton–zooplankton model (Franks, Wroblewski &amp; Flierl 1986, Marine
 * Biology 91, 121–129) calibrated to a season of chlorophyll-a observations. The calibrated
 * parameters, in vector order, are {@code mu_max} (d⁻¹), {@code k_n} (mmol N m⁻³), {@code g_max}
 * (d⁻¹), {@code k_p} (mmol N m⁻³), {@code m_p} (d⁻¹) and {@code sigma}, the standard deviation of
 * log chlorophyll; see {@link NpzEquations} for the equations and {@link PlanktonConstants} for
 * the fixed quantities.
 *
 * <p>Observations are log-normal: {@code log y_j ~ N(log(ratio·P(t_j)), σ²)}. The log-likelihood
 * keeps every constant, the {@code 1/y} Jacobian included, so that the evidence of the two
 * {@link GrazingResponse} variants can be compared. Each evaluation is one
 * {@link PlanktonDynamics#SOLVER} solve in {@code (N, ln P, ln Z)}, so ln P is read off
 * directly and P cannot reach zero. A failed solve (more steps than the solver allows, a
 * non-finite state) throws, and the sampler counts the exception as an invalid evaluation with
 * its message as the reason. Immutable and thread-safe.
 *
 * <p>Observations are in time order (the days increase). A range of observations solves only up
 * to its last day, taking the very steps of the season's solve, so its terms are those of the
 * full solve bit for bit; the full likelihood is the whole range, so the two agree bit for bit.
 *
 * <p>As a {@link PredictiveModel} its observed values are the chlorophyll series, positioned at
 * its days; a replicate is one solve and, in day order, {@code y_j = ratio·P(t_j)·exp(σ·ε_j)}:
 * the likelihood's log-normal noise, as {@link QuellmarData#simulate} draws it.
 */
public final class PlanktonModel implements ObservationLikelihood, PredictiveModel {

    /** Index of μ_max, the maximum phytoplankton growth rate. */
    public static final int MU_MAX = 0;
    /** Index of k_N, the nutrient half-saturation constant. */
    public static final int K_N = 1;
    /** Index of g_max, the maximum grazing rate. */
    public static final int G_MAX = 2;
    /** Index of k_P, the grazing half-saturation constant. */
    public static final int K_P = 3;
    /** Index of m_P, the phytoplankton mortality. */
    public static final int M_P = 4;
    /** Index of σ, the standard deviation of log chlorophyll. */
    public static final int SIGMA = 5;

    /** The parameter names, in vector order. */
    public static final List<String> PARAMETER_NAMES = List.of("mu_max", "k_n", "g_max", "k_p", "m_p", "sigma");

    /** What the observed values measure. */
    public static final Quantity CHLOROPHYLL = new Quantity("chlorophyll-a", "mg m^-3");
    /** What the positions measure. */
    public static final Quantity DAY = new Quantity("day", "d");

    private static final double LOG_SQRT_2PI = 0.5 * StrictMath.log(2.0 * StrictMath.PI);

    private final PlanktonDynamics dynamics;
    private final IndependentPrior prior;
    private final ParameterSpace parameters;
    private final double[] chlorophyll;
    private final double[] logChlorophyll;
    private final double logRatio;

    private PlanktonModel(PlanktonDynamics dynamics, IndependentPrior prior, double[] chlorophyll) {
        this.dynamics = dynamics;
        this.prior = prior;
        List<Support> supports = new ArrayList<>();
        for (int i = 0; i < PARAMETER_NAMES.size(); i++) {
            supports.add(prior.support(i));
        }
        this.parameters = ParameterSpace.of(PARAMETER_NAMES, supports);
        this.chlorophyll = chlorophyll.clone();
        this.logChlorophyll = new double[chlorophyll.length];
        for (int j = 0; j < chlorophyll.length; j++) {
            logChlorophyll[j] = StrictMath.log(chlorophyll[j]);
        }
        this.logRatio = StrictMath.log(dynamics.constants().chlorophyllPerNitrogen());
    }

    /**
     * @param grazing     the grazing response
     * @param constants   the fixed quantities
     * @param prior       six independent marginals in {@link #PARAMETER_NAMES} order, each
     *                    supported inside (0, ∞); their supports become the parameters' supports
     * @param days        observation days, as for {@link PlanktonDynamics#of}
     * @param chlorophyll observed chlorophyll-a (mg m⁻³), finite and {@code > 0}, one per day
     * @throws IllegalArgumentException naming the data role, row and value, or the prior, that is wrong
     */
    public static PlanktonModel of(GrazingResponse grazing, PlanktonConstants constants, IndependentPrior prior,
            double[] days, double[] chlorophyll) {
        if (prior == null || chlorophyll == null) {
            throw new IllegalArgumentException("prior and chlorophyll must not be null");
        }
        if (prior.dimension() != PARAMETER_NAMES.size()) {
            throw new IllegalArgumentException("prior has dimension " + prior.dimension() + ", expected "
                    + PARAMETER_NAMES.size() + " for " + PARAMETER_NAMES);
        }
        for (int i = 0; i < prior.dimension(); i++) {
            requirePositiveSupport(PARAMETER_NAMES.get(i), prior.marginal(i));
        }
        PlanktonDynamics dynamics = PlanktonDynamics.of(grazing, constants, days);
        if (chlorophyll.length != days.length) {
            throw new IllegalArgumentException("data columns differ in length: role 'day' has " + days.length
                    + " values, role 'chlorophyll' has " + chlorophyll.length);
        }
        for (int j = 0; j < chlorophyll.length; j++) {
            double y = chlorophyll[j];
            if (!(y > 0.0 && y < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("data column for role 'chlorophyll' row " + j
                        + " must be finite and > 0, was " + y);
            }
        }
        return new PlanktonModel(dynamics, prior, chlorophyll);
    }

    /**
     * Fails unless the marginal puts all its mass in (0, ∞): the rates, constants and σ are
     * positive, and a prior reaching below zero would hand the equations a meaningless value.
     */
    static void requirePositiveSupport(String name, UnivariateDistribution marginal) {
        if (!(marginal.support().lower() >= 0.0)) {
            throw new IllegalArgumentException("prior of " + name + " must be supported in (0, inf), was "
                    + marginal + " on " + marginal.support());
        }
    }

    @Override
    public ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    public PlanktonDynamics dynamics() {
        return dynamics;
    }

    public GrazingResponse grazing() {
        return dynamics.grazing();
    }

    /** The observation days (a copy). */
    public double[] days() {
        return dynamics.days();
    }

    /** The observed chlorophyll-a (a copy). */
    public double[] chlorophyll() {
        return chlorophyll.clone();
    }

    @Override
    public double logLikelihood(double[] theta, LikelihoodContext context) {
        return logLikelihood(theta, 0, chlorophyll.length, context);
    }

    @Override
    public int observationCount() {
        return chlorophyll.length;
    }

    @Override
    public double logLikelihood(double[] theta, int fromObservation, int toObservation, LikelihoodContext context) {
        ObservationLikelihood.checkRange(fromObservation, toObservation, chlorophyll.length);
        if (fromObservation == toObservation) {
            return 0.0;
        }
        double[][] states = dynamics.integratedStates(theta, toObservation);
        // The log data and the squares are summed in one pass in day order from 0, which for the
        // whole season is the arithmetic the likelihood has always used, bit for bit.
        double sumLog = 0.0;
        double squares = 0.0;
        for (int j = fromObservation; j < toObservation; j++) {
            sumLog += logChlorophyll[j];
            double residual = logChlorophyll[j] - logRatio - states[j][1];
            squares += residual * residual;
        }
        return value(toObservation - fromObservation, sumLog, squares, theta[SIGMA]);
    }

    /** One solve up to the last day of the range, whatever its length. */
    @Override
    public void logLikelihoodTerms(double[] theta, int fromObservation, int toObservation, double[] terms,
            LikelihoodContext context) {
        ObservationLikelihood.checkTerms(fromObservation, toObservation, chlorophyll.length, terms);
        if (fromObservation == toObservation) {
            return;
        }
        double[][] states = dynamics.integratedStates(theta, toObservation);
        for (int j = fromObservation; j < toObservation; j++) {
            double residual = logChlorophyll[j] - logRatio - states[j][1];
            terms[j - fromObservation] = value(1, logChlorophyll[j], residual * residual, theta[SIGMA]);
        }
    }

    private static double value(int count, double sumLog, double squares, double sigma) {
        return -sumLog - count * LOG_SQRT_2PI - count * StrictMath.log(sigma) - 0.5 * squares / (sigma * sigma);
    }

    @Override
    public int observedCount() {
        return chlorophyll.length;
    }

    @Override
    public double[] observedValues() {
        return chlorophyll.clone();
    }

    @Override
    public Quantity observedQuantity() {
        return CHLOROPHYLL;
    }

    /** The observation days. */
    @Override
    public double[] positions() {
        return dynamics.days();
    }

    @Override
    public Quantity positionQuantity() {
        return DAY;
    }

    @Override
    public void replicate(double[] theta, RandomStream random, double[] out) {
        PredictiveModel.checkReplicate(out, chlorophyll.length);
        double[] simulated = QuellmarData.simulate(dynamics, theta, random);
        System.arraycopy(simulated, 0, out, 0, simulated.length);
    }

    @Override
    public String toString() {
        return "plankton-npz(" + dynamics.grazing().settingName() + ", " + chlorophyll.length + " observations, prior "
                + prior + ")";
    }
}
