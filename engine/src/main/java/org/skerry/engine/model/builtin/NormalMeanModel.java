package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.random.RandomStream;

/**
 * The mean μ of d-dimensional observations {@code yⱼ ~ N(μ, σ²I)} with σ known, under the
 * conjugate prior {@code μ ~ N(μ₀·1, τ²I)}: the textbook normal model with known variance
 * (Gelman et al., Bayesian Data Analysis, 3rd ed., §2.5 and §3.5), whose posterior and evidence
 * are closed forms. Immutable and thread-safe.
 *
 * <p>The log-likelihood is the full product of normal densities, constants included, evaluated
 * from sufficient statistics: {@code Σⱼ|yⱼ − μ|² = S + n|ȳ − μ|²} with {@code S} the centred
 * sum of squares, computed once in two passes so that it does not suffer cancellation.
 *
 * <p>Observation {@code j} is row {@code j}, in the order given. The whole range is answered
 * from the sufficient statistics, so it is the full likelihood bit for bit; a shorter range sums
 * {@code |yⱼ − μ|²} over its rows, which agrees with the whole range to rounding.
 *
 * <p>As a {@link PredictiveModel} its observed values are the n·d numbers row by row (coordinate
 * {@code k} of row {@code j} at {@code j·d + k}), positioned at their row number; a replicate
 * draws {@code μₖ + σ·ε} in that order.
 */
public final class NormalMeanModel implements ObservationLikelihood, PredictiveModel {

    private static final Quantity OBSERVED = Quantity.unitless("y");

    private final ParameterSpace parameters;
    private final IndependentPrior prior;
    private final int count;
    private final double sigma;
    private final double[] sampleMean;
    private final double centredSquares;
    private final double logConstant;
    private final double halfPrecision;
    private final double[] rows;
    private final double logScale;

    private NormalMeanModel(double[][] observations, double sigma, double priorMean, double priorSd) {
        int d = observations[0].length;
        this.parameters = d == 1 ? ParameterSpace.of(List.of("mu"), List.of(Support.real())) : ParameterSpace.real("mu", d);
        this.prior = IndependentPrior.iid(Normal.of(priorMean, priorSd), d);
        this.count = observations.length;
        this.sigma = sigma;
        this.sampleMean = new double[d];
        this.rows = new double[count * d];
        for (int j = 0; j < count; j++) {
            System.arraycopy(observations[j], 0, rows, j * d, d);
        }
        for (double[] row : observations) {
            for (int k = 0; k < d; k++) {
                sampleMean[k] += row[k];
            }
        }
        for (int k = 0; k < d; k++) {
            sampleMean[k] /= count;
        }
        double squares = 0.0;
        for (double[] row : observations) {
            for (int k = 0; k < d; k++) {
                double e = row[k] - sampleMean[k];
                squares += e * e;
            }
        }
        this.centredSquares = squares;
        this.logScale = StrictMath.log(sigma) + 0.5 * StrictMath.log(2.0 * StrictMath.PI);
        this.logConstant = -(double) count * d * logScale;
        this.halfPrecision = 0.5 / (sigma * sigma);
    }

    /**
     * @param observations n rows of d values each (n, d ≥ 1)
     * @param sigma the known observation standard deviation
     * @param priorMean μ₀, the prior mean of every coordinate
     * @param priorSd τ, the prior standard deviation of every coordinate
     * @throws IllegalArgumentException if the observations are empty, ragged or not finite, or a
     *     scale is not finite and positive
     */
    public static NormalMeanModel of(double[][] observations, double sigma, double priorMean, double priorSd) {
        if (observations.length == 0 || observations[0].length == 0) {
            throw new IllegalArgumentException("observations must hold at least one row of one value");
        }
        for (int i = 0; i < observations.length; i++) {
            if (observations[i].length != observations[0].length) {
                throw new IllegalArgumentException("observations must all have " + observations[0].length
                        + " values, row " + i + " has " + observations[i].length);
            }
        }
        Data.requireFinite("observations", observations);
        Data.positive("sigma", sigma);
        Data.finite("priorMean", priorMean);
        Data.positive("priorSd", priorSd);
        return new NormalMeanModel(observations, sigma, priorMean, priorSd);
    }

    @Override
    public ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    /** The number n of observations (rows). */
    @Override
    public int observationCount() {
        return count;
    }

    public double sigma() {
        return sigma;
    }

    @Override
    public double logLikelihood(double[] mu, LikelihoodContext context) {
        double distance = 0.0;
        for (int k = 0; k < sampleMean.length; k++) {
            double e = sampleMean[k] - mu[k];
            distance += e * e;
        }
        return logConstant - halfPrecision * (centredSquares + count * distance);
    }

    @Override
    public double logLikelihood(double[] mu, int fromObservation, int toObservation, LikelihoodContext context) {
        ObservationLikelihood.checkRange(fromObservation, toObservation, count);
        if (fromObservation == toObservation) {
            return 0.0;
        }
        if (fromObservation == 0 && toObservation == count) {
            return logLikelihood(mu, context);
        }
        int d = sampleMean.length;
        double squares = 0.0;
        for (int i = fromObservation * d; i < toObservation * d; i += d) {
            for (int k = 0; k < d; k++) {
                double e = rows[i + k] - mu[k];
                squares += e * e;
            }
        }
        return -(double) (toObservation - fromObservation) * d * logScale - halfPrecision * squares;
    }

    @Override
    public int observedCount() {
        return rows.length;
    }

    @Override
    public double[] observedValues() {
        return rows.clone();
    }

    @Override
    public Quantity observedQuantity() {
        return OBSERVED;
    }

    /** Each value's row number. */
    @Override
    public double[] positions() {
        int d = sampleMean.length;
        double[] out = new double[rows.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = i / d;
        }
        return out;
    }

    @Override
    public void replicate(double[] mu, RandomStream random, double[] out) {
        PredictiveModel.checkReplicate(out, rows.length);
        int d = sampleMean.length;
        for (int i = 0; i < rows.length; i++) {
            out[i] = mu[i % d] + sigma * random.nextNormal();
        }
    }

    @Override
    public String toString() {
        return "normal-mean(n=" + count + ", d=" + sampleMean.length + ", sigma=" + sigma + ", prior "
                + prior.marginal(0) + ")";
    }
}
