package org.skerry.engine.reference;

import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;

/**
 * The log-density of a multivariate normal, {@code −(n/2) log 2π − ½ log|Σ| − ½ rᵀΣ⁻¹r}, built on
 * Commons Math's {@link CholeskyDecomposition}. Commons Math's own multivariate normal gives only
 * the density, which underflows for the data-set sizes the evidence tests use.
 */
public final class Gaussians {

    private Gaussians() {
    }

    public static double logDensity(double[] x, double[] mean, double[][] covariance) {
        RealMatrix sigma = new Array2DRowRealMatrix(covariance);
        CholeskyDecomposition cholesky = new CholeskyDecomposition(sigma, 1e-12, 1e-14);
        RealVector r = new ArrayRealVector(x).subtract(new ArrayRealVector(mean));
        double quadratic = r.dotProduct(cholesky.getSolver().solve(r));
        RealMatrix l = cholesky.getL();
        double logDet = 0.0;
        for (int i = 0; i < x.length; i++) {
            logDet += 2.0 * Math.log(l.getEntry(i, i));
        }
        return -0.5 * x.length * Math.log(2.0 * Math.PI) - 0.5 * logDet - 0.5 * quadratic;
    }
}
