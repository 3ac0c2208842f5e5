package org.skerry.engine.model.builtin;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.random.RandomStream;

/**
 * Bayesian linear regression {@code y ~ N(Xw, σ²I)} with σ known and a multivariate normal
 * prior on the weights, {@code w ~ N(m₀, S₀)}; posterior and evidence are closed forms (Bishop,
 * Pattern Recognition and Machine Learning (2006), §3.3 and §3.5). Immutable and thread-safe.
 *
 * <p>The log-likelihood keeps every constant. When X has full column rank it is evaluated in
 * O(p²) from a Householder QR factorisation {@code X = QR} computed once (Golub &amp; Van Loan,
 * Matrix Computations, 4th ed., §5.2): {@code |y − Xw|² = |Rw − c|² + ρ} with {@code c} the first
 * p entries of {@code Qᵀy} and {@code ρ} the squared norm of the rest, which avoids the
 * cancellation of the normal-equations form. Otherwise it loops over the data.
 *
 * <p>Observation {@code i} is row {@code i} of X with response {@code yᵢ}, in the order given.
 * The whole range is the full likelihood, bit for bit; a shorter range sums the squared
 * residuals {@code (yᵢ − xᵢᵀw)²} over its rows, which agrees with the factorised whole range to
 * the rounding of the factorisation (relative error of order ε times the condition number of X).
 *
 * <p>As a {@link PredictiveModel} its observed values are the responses in row order, positioned
 * at their row number; a replicate draws {@code xᵢᵀw + σ·εᵢ} in that order.
 */
public final class LinearRegressionModel implements ObservationLikelihood, PredictiveModel {

    private static final Quantity OBSERVED = Quantity.unitless("y");

    // A diagonal entry of R this small relative to the largest one marks X as rank-deficient.
    private static final double RANK_TOLERANCE = 1e-10;

    private final ParameterSpace parameters;
    private final MultivariateNormalPrior prior;
    private final int rows;
    private final int columns;
    private final double sigma;
    private final double logConstant;
    private final double logScale;
    private final double halfPrecision;
    private final double[] design;
    private final double[] response;
    // Packed upper triangle of R (row i holds columns i..p-1), c and ρ; null when rank-deficient.
    private final double[][] upper;
    private final double[] projected;
    private final double residualSquares;

    private LinearRegressionModel(List<String> names, double[][] x, double[] y, double sigma,
            MultivariateNormalPrior prior) {
        this.rows = x.length;
        this.columns = names.size();
        List<Support> supports = new ArrayList<>();
        for (int j = 0; j < columns; j++) {
            supports.add(Support.real());
        }
        this.parameters = ParameterSpace.of(names, supports);
        this.prior = prior;
        this.sigma = sigma;
        this.logScale = StrictMath.log(sigma) + 0.5 * StrictMath.log(2.0 * StrictMath.PI);
        this.logConstant = -rows * logScale;
        this.halfPrecision = 0.5 / (sigma * sigma);
        this.design = new double[rows * columns];
        for (int i = 0; i < rows; i++) {
            System.arraycopy(x[i], 0, design, i * columns, columns);
        }
        this.response = y.clone();

        double[][] a = new double[columns][rows];
        for (int i = 0; i < rows; i++) {
            for (int j = 0; j < columns; j++) {
                a[j][i] = x[i][j];
            }
        }
        double[] qty = y.clone();
        boolean fullRank = rows >= columns && householder(a, qty);
        if (fullRank) {
            double largest = 0.0;
            for (int j = 0; j < columns; j++) {
                largest = StrictMath.max(largest, StrictMath.abs(a[j][j]));
            }
            for (int j = 0; j < columns; j++) {
                if (!(StrictMath.abs(a[j][j]) > RANK_TOLERANCE * largest)) {
                    fullRank = false;
                }
            }
        }
        if (fullRank) {
            upper = new double[columns][];
            for (int i = 0; i < columns; i++) {
                upper[i] = new double[columns - i];
                for (int j = i; j < columns; j++) {
                    upper[i][j - i] = a[j][i];
                }
            }
            projected = new double[columns];
            System.arraycopy(qty, 0, projected, 0, columns);
            double rest = 0.0;
            for (int i = columns; i < rows; i++) {
                rest += qty[i] * qty[i];
            }
            residualSquares = rest;
        } else {
            upper = null;
            projected = null;
            residualSquares = Double.NaN;
        }
    }

    /**
     * Reduces the columns {@code a[j]} to upper-triangular form in place and applies the same
     * reflections to {@code b}; returns false on an exactly zero column.
     */
    private static boolean householder(double[][] a, double[] b) {
        int n = b.length;
        for (int j = 0; j < a.length; j++) {
            double[] col = a[j];
            double norm = 0.0;
            for (int i = j; i < n; i++) {
                norm += col[i] * col[i];
            }
            norm = StrictMath.sqrt(norm);
            if (norm == 0.0) {
                return false;
            }
            double alpha = col[j] > 0 ? -norm : norm;
            // v = col[j..n) − alpha·e₁, kept in col itself; vᵀv = 2·norm·(norm + |col[j]|).
            col[j] -= alpha;
            double vv = 0.0;
            for (int i = j; i < n; i++) {
                vv += col[i] * col[i];
            }
            for (int k = j + 1; k < a.length; k++) {
                reflect(col, a[k], j, vv);
            }
            reflect(col, b, j, vv);
            for (int i = j + 1; i < n; i++) {
                col[i] = 0.0;
            }
            col[j] = alpha;
        }
        return true;
    }

    private static void reflect(double[] v, double[] target, int from, double vv) {
        double dot = 0.0;
        for (int i = from; i < target.length; i++) {
            dot += v[i] * target[i];
        }
        double scale = 2.0 * dot / vv;
        for (int i = from; i < target.length; i++) {
            target[i] -= scale * v[i];
        }
    }

    /**
     * @param design the n × p design matrix X (include a column of ones for an intercept)
     * @param response the n responses y
     * @param sigma the known noise standard deviation
     * @param prior the prior on the p weights
     * @param names the p weight names, in column order
     * @throws IllegalArgumentException if sizes disagree, the data are not finite, or sigma is
     *     not finite and positive
     */
    public static LinearRegressionModel of(double[][] design, double[] response, double sigma,
            MultivariateNormalPrior prior, List<String> names) {
        if (design.length == 0) {
            throw new IllegalArgumentException("design must have at least one row");
        }
        if (response.length != design.length) {
            throw new IllegalArgumentException("response has " + response.length
                    + " values but design has " + design.length + " rows");
        }
        int p = names.size();
        for (int i = 0; i < design.length; i++) {
            if (design[i].length != p) {
                throw new IllegalArgumentException("design row " + i + " has " + design[i].length
                        + " columns, expected " + p + " to match names " + names);
            }
        }
        if (prior.dimension() != p) {
            throw new IllegalArgumentException("prior has dimension " + prior.dimension()
                    + ", expected " + p + " to match names " + names);
        }
        Data.requireFinite("design", design);
        Data.requireFinite("response", new double[][] {response});
        Data.positive("sigma", sigma);
        return new LinearRegressionModel(names, design, response, sigma, prior);
    }

    @Override
    public ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    public double sigma() {
        return sigma;
    }

    /** A copy of the design matrix X, n × p. */
    public double[][] design() {
        double[][] x = new double[rows][];
        for (int i = 0; i < rows; i++) {
            x[i] = new double[columns];
            System.arraycopy(design, i * columns, x[i], 0, columns);
        }
        return x;
    }

    /** A copy of the responses y. */
    public double[] response() {
        return response.clone();
    }

    @Override
    public double logLikelihood(double[] w, LikelihoodContext context) {
        double squares;
        if (upper != null) {
            squares = residualSquares;
            for (int i = 0; i < columns; i++) {
                double[] row = upper[i];
                double e = -projected[i];
                for (int j = i; j < columns; j++) {
                    e += row[j - i] * w[j];
                }
                squares += e * e;
            }
        } else {
            squares = 0.0;
            for (int i = 0; i < rows; i++) {
                double e = response[i];
                int base = i * columns;
                for (int j = 0; j < columns; j++) {
                    e -= design[base + j] * w[j];
                }
                squares += e * e;
            }
        }
        return logConstant - halfPrecision * squares;
    }

    /** The number n of observations (rows of X). */
    @Override
    public int observationCount() {
        return rows;
    }

    @Override
    public double logLikelihood(double[] w, int fromObservation, int toObservation, LikelihoodContext context) {
        ObservationLikelihood.checkRange(fromObservation, toObservation, rows);
        if (fromObservation == toObservation) {
            return 0.0;
        }
        if (fromObservation == 0 && toObservation == rows) {
            return logLikelihood(w, context);
        }
        double squares = 0.0;
        for (int i = fromObservation; i < toObservation; i++) {
            double e = response[i];
            int base = i * columns;
            for (int j = 0; j < columns; j++) {
                e -= design[base + j] * w[j];
            }
            squares += e * e;
        }
        return -(toObservation - fromObservation) * logScale - halfPrecision * squares;
    }

    @Override
    public int observedCount() {
        return rows;
    }

    @Override
    public double[] observedValues() {
        return response.clone();
    }

    @Override
    public Quantity observedQuantity() {
        return OBSERVED;
    }

    @Override
    public void replicate(double[] w, RandomStream random, double[] out) {
        PredictiveModel.checkReplicate(out, rows);
        for (int i = 0; i < rows; i++) {
            double mean = 0.0;
            int base = i * columns;
            for (int j = 0; j < columns; j++) {
                mean += design[base + j] * w[j];
            }
            out[i] = mean + sigma * random.nextNormal();
        }
    }

    @Override
    public String toString() {
        return "linear-regression(n=" + rows + ", weights=" + parameters.names() + ", sigma=" + sigma + ")";
    }
}
