package org.skerry.engine.reference;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.MatrixUtils;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;

/**
 * Closed forms for Bayesian linear regression y ~ N(Xw, σ²I), w ~ N(m₀, S₀), computed with
 * Commons Math linear algebra. Posterior (Bishop, Pattern Recognition and Machine Learning
 * (2006), §3.3.1, eqs. 3.49–3.51): {@code S_N⁻¹ = S₀⁻¹ + XᵀX/σ²},
 * {@code m_N = S_N(S₀⁻¹m₀ + Xᵀy/σ²)}. Evidence (ibid. §3.5.1, eq. 3.86 for the isotropic case;
 * in general the linear-Gaussian marginal of §2.3.3, eq. 2.115):
 * {@code y ~ N(Xm₀, σ²I + XS₀Xᵀ)}.
 *
 * <p>The likelihood of rows {@code [from, to)} is {@code log N(y_range; X_range·w, σ²I)}, by
 * {@link Gaussians#logDensity} (Cholesky) with Commons Math's matrix product.
 */
public final class LinearRegressionExact {

    private final RealMatrix x;
    private final RealVector y;
    private final double sigma;
    private final RealVector m0;
    private final RealMatrix s0;

    public LinearRegressionExact(double[][] design, double[] response, double sigma, double[] priorMean,
            double[][] priorCovariance) {
        this.x = new Array2DRowRealMatrix(design);
        this.y = new ArrayRealVector(response);
        this.sigma = sigma;
        this.m0 = new ArrayRealVector(priorMean);
        this.s0 = new Array2DRowRealMatrix(priorCovariance);
    }

    private RealMatrix posteriorPrecision() {
        RealMatrix s0Inverse = new LUDecomposition(s0).getSolver().getInverse();
        return s0Inverse.add(x.transpose().multiply(x).scalarMultiply(1.0 / (sigma * sigma)));
    }

    /** S_N, eq. 3.51. */
    public double[][] posteriorCovariance() {
        return new LUDecomposition(posteriorPrecision()).getSolver().getInverse().getData();
    }

    /** m_N, eq. 3.50. */
    public double[] posteriorMean() {
        RealMatrix s0Inverse = new LUDecomposition(s0).getSolver().getInverse();
        RealVector right = s0Inverse.operate(m0).add(x.transpose().operate(y).mapMultiply(1.0 / (sigma * sigma)));
        return new LUDecomposition(posteriorPrecision()).getSolver().solve(right).toArray();
    }

    /** log N(y; Xm₀, σ²I + XS₀Xᵀ). */
    public double logEvidence() {
        int n = y.getDimension();
        RealMatrix covariance = x.multiply(s0).multiply(x.transpose())
                .add(MatrixUtils.createRealIdentityMatrix(n).scalarMultiply(sigma * sigma));
        return Gaussians.logDensity(y.toArray(), x.operate(m0).toArray(), covariance.getData());
    }

    /**
     * Bishop's eq. 3.86 for the zero-mean isotropic prior S₀ = I/α (β = 1/σ²): an algebraically
     * different route to the same number, used to check {@link #logEvidence}.
     */
    public static double logEvidenceIsotropic(double[][] design, double[] response, double sigma, double alpha) {
        RealMatrix phi = new Array2DRowRealMatrix(design);
        RealVector t = new ArrayRealVector(response);
        int n = design.length;
        int m = design[0].length;
        double beta = 1.0 / (sigma * sigma);
        RealMatrix a = MatrixUtils.createRealIdentityMatrix(m).scalarMultiply(alpha)
                .add(phi.transpose().multiply(phi).scalarMultiply(beta));
        LUDecomposition lu = new LUDecomposition(a);
        RealVector mN = lu.getSolver().solve(phi.transpose().operate(t)).mapMultiply(beta);
        RealVector residual = t.subtract(phi.operate(mN));
        double energy = 0.5 * beta * residual.dotProduct(residual) + 0.5 * alpha * mN.dotProduct(mN);
        return 0.5 * m * Math.log(alpha) + 0.5 * n * Math.log(beta) - energy - 0.5 * Math.log(lu.getDeterminant())
                - 0.5 * n * Math.log(2.0 * Math.PI);
    }

    /** log N(y[from..to); X[from..to)·w, σ²I). */
    public double logLikelihood(double[] w, int from, int to) {
        int size = to - from;
        RealMatrix rows = x.getSubMatrix(from, to - 1, 0, x.getColumnDimension() - 1);
        double[][] covariance = MatrixUtils.createRealIdentityMatrix(size).scalarMultiply(sigma * sigma).getData();
        return Gaussians.logDensity(y.getSubVector(from, size).toArray(), rows.operate(w), covariance);
    }
}
