package org.skerry.engine.model.prior;

import org.skerry.engine.model.Prior;
import org.skerry.engine.random.RandomStream;

/**
 * The multivariate normal distribution N(mean, covariance) as a prior on the whole real space.
 * The Cholesky factor {@code L} of the covariance ({@code LLᵀ = Σ}) is computed once, with the
 * Cholesky–Banachiewicz recurrence (Golub &amp; Van Loan, Matrix Computations, 4th ed., §4.2),
 * together with its inverse: a draw is {@code mean + Lz} for standard normal {@code z}, and the
 * log-density is {@code −(d/2) log 2π − Σ log Lᵢᵢ − |L⁻¹(x − mean)|²/2}, a sum of squares that
 * needs no scratch array. Immutable.
 */
public final class MultivariateNormalPrior implements Prior {

    // Relative asymmetry tolerated in the covariance, for matrices computed in floating point.
    private static final double SYMMETRY_TOLERANCE = 1e-12;

    private final int dimension;
    private final double[] mean;
    private final double[][] covariance;
    // Lower triangles, row by row: row i holds columns 0..i.
    private final double[][] factor;
    private final double[][] inverseFactor;
    private final double logNormaliser;

    private MultivariateNormalPrior(double[] mean, double[][] covariance, double[][] factor,
            double[][] inverseFactor, double logNormaliser) {
        this.dimension = mean.length;
        this.mean = mean;
        this.covariance = covariance;
        this.factor = factor;
        this.inverseFactor = inverseFactor;
        this.logNormaliser = logNormaliser;
    }

    /**
     * @throws IllegalArgumentException if {@code mean} is empty or holds a non-finite value, the
     *     covariance is not square of the same size, not symmetric, or not positive definite
     */
    public static MultivariateNormalPrior of(double[] mean, double[][] covariance) {
        int d = mean.length;
        if (d == 0) {
            throw new IllegalArgumentException("mean must not be empty");
        }
        for (int i = 0; i < d; i++) {
            Checks.finite("mean[" + i + "]", mean[i]);
        }
        if (covariance.length != d) {
            throw new IllegalArgumentException("covariance must be " + d + " x " + d
                    + " to match mean, had " + covariance.length + " rows");
        }
        double[][] sigma = new double[d][];
        for (int i = 0; i < d; i++) {
            if (covariance[i].length != d) {
                throw new IllegalArgumentException("covariance must be " + d + " x " + d
                        + ", row " + i + " had " + covariance[i].length + " entries");
            }
            sigma[i] = covariance[i].clone();
            for (int j = 0; j < d; j++) {
                Checks.finite("covariance[" + i + "][" + j + "]", sigma[i][j]);
            }
        }
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < i; j++) {
                double scale = StrictMath.max(StrictMath.abs(sigma[i][j]), StrictMath.abs(sigma[j][i]));
                if (StrictMath.abs(sigma[i][j] - sigma[j][i]) > SYMMETRY_TOLERANCE * scale) {
                    throw new IllegalArgumentException("covariance must be symmetric, but covariance["
                            + i + "][" + j + "]=" + sigma[i][j] + " and covariance[" + j + "][" + i
                            + "]=" + sigma[j][i]);
                }
            }
        }
        double[][] l = cholesky(sigma);
        double logDet = 0.0;
        for (int i = 0; i < d; i++) {
            logDet += StrictMath.log(l[i][i]);
        }
        double logNormaliser = -d * Normal.LOG_SQRT_2PI - logDet;
        return new MultivariateNormalPrior(mean.clone(), sigma, l, invertLower(l), logNormaliser);
    }

    /** Uses the lower triangle only; fails on a non-positive pivot. */
    private static double[][] cholesky(double[][] sigma) {
        int d = sigma.length;
        double[][] l = new double[d][];
        for (int i = 0; i < d; i++) {
            l[i] = new double[i + 1];
            for (int j = 0; j <= i; j++) {
                double sum = sigma[i][j];
                for (int k = 0; k < j; k++) {
                    sum -= l[i][k] * l[j][k];
                }
                if (i == j) {
                    if (!(sum > 0.0)) {
                        throw new IllegalArgumentException(
                                "covariance must be positive definite, pivot " + i + " was " + sum);
                    }
                    l[i][i] = StrictMath.sqrt(sum);
                } else {
                    l[i][j] = sum / l[j][j];
                }
            }
        }
        return l;
    }

    /** Forward substitution, column by column, for the inverse of a lower-triangular matrix. */
    private static double[][] invertLower(double[][] l) {
        int d = l.length;
        double[][] inv = new double[d][];
        for (int i = 0; i < d; i++) {
            inv[i] = new double[i + 1];
        }
        for (int j = 0; j < d; j++) {
            inv[j][j] = 1.0 / l[j][j];
            for (int i = j + 1; i < d; i++) {
                double sum = 0.0;
                for (int k = j; k < i; k++) {
                    sum -= l[i][k] * inv[k][j];
                }
                inv[i][j] = sum / l[i][i];
            }
        }
        return inv;
    }

    @Override
    public int dimension() {
        return dimension;
    }

    /** A copy of the mean vector. */
    public double[] mean() {
        return mean.clone();
    }

    /** A copy of the covariance matrix (symmetric, as given). */
    public double[][] covariance() {
        double[][] copy = new double[dimension][];
        for (int i = 0; i < dimension; i++) {
            copy[i] = covariance[i].clone();
        }
        return copy;
    }

    @Override
    public void sample(RandomStream random, double[] out) {
        for (int i = 0; i < dimension; i++) {
            out[i] = random.nextNormal();
        }
        // Row i of L·z reads z[0..i] only, so filling from the last row down works in place.
        for (int i = dimension - 1; i >= 0; i--) {
            double[] row = factor[i];
            double sum = 0.0;
            for (int k = 0; k <= i; k++) {
                sum += row[k] * out[k];
            }
            out[i] = mean[i] + sum;
        }
    }

    @Override
    public double logDensity(double[] parameters) {
        double squares = 0.0;
        for (int i = 0; i < dimension; i++) {
            double[] row = inverseFactor[i];
            double z = 0.0;
            for (int k = 0; k <= i; k++) {
                z += row[k] * (parameters[k] - mean[k]);
            }
            squares += z * z;
        }
        if (!Double.isFinite(squares)) {
            return Double.NEGATIVE_INFINITY;
        }
        return logNormaliser - 0.5 * squares;
    }

    @Override
    public String toString() {
        return "multivariate-normal(dimension=" + dimension + ")";
    }
}
