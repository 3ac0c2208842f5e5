package org.skerry.engine.move;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.CholeskyDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.stat.correlation.Covariance;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

class ProposalFitTest {

    @Test
    @DisplayName("random-walk covariance is (2.38^2/d) Σ̂ (Roberts, Gelman & Gilks 1997); factor checked with Commons Math")
    void randomWalkCovariance() {
        int d = 3;
        int n = 500;
        SplittableRandom random = new SplittableRandom(5);
        double[][] data = new double[n][d];
        MomentSums sums = new MomentSums(d);
        for (int i = 0; i < n; i++) {
            data[i][0] = random.nextGaussian();
            data[i][1] = 0.5 * data[i][0] + random.nextGaussian();
            data[i][2] = 10 + 3 * random.nextGaussian();
            sums.add(1.0 / n, data[i]);
        }
        // Commons Math's covariance is the unbiased form; ours is weight-normalised (divide by n).
        RealMatrix reference = new Covariance(data, false).getCovarianceMatrix();
        double factor = 0.8 * 0.8 * 2.38 * 2.38 / d;
        Proposal proposal = ProposalFit.fit(MoveKernel.RANDOM_WALK, sums, 0.8);
        double[] lower = proposal.cholesky();
        RealMatrix expected = new CholeskyDecomposition(reference.scalarMultiply(factor)).getL();
        for (int a = 0; a < d; a++) {
            for (int b = 0; b < d; b++) {
                assertEquals(expected.getEntry(a, b), lower[a * d + b], 1e-12 * (1 + Math.abs(expected.getEntry(a, b))));
            }
        }
    }

    @Test
    @DisplayName("singular covariance is regularised, not refused")
    void singularCovariance() {
        MomentSums sums = new MomentSums(2);
        for (int i = 0; i < 10; i++) {
            sums.add(0.1, new double[] {i, 2.0 * i});
        }
        Proposal proposal = ProposalFit.fit(MoveKernel.RANDOM_WALK, sums, 1.0);
        double[] l = proposal.cholesky();
        assertEquals(true, l[0] > 0 && l[3] > 0);
    }

    @Test
    @DisplayName("independence proposal log ratio equals the Gaussian density ratio (Commons Math MultivariateNormalDistribution)")
    void independenceRatio() {
        double[] mean = {1.0, -2.0};
        double[][] cov = {{2.0, 0.3}, {0.3, 0.5}};
        double[] l = new CholeskyDecomposition(new Array2DRowRealMatrix(cov)).getL().getData()[0].length == 2
                ? flatten(new CholeskyDecomposition(new Array2DRowRealMatrix(cov)).getL().getData()) : null;
        Proposal proposal = new Proposal(MoveKernel.INDEPENDENCE, mean, l);
        org.apache.commons.math3.distribution.MultivariateNormalDistribution q =
                new org.apache.commons.math3.distribution.MultivariateNormalDistribution(mean, cov);
        double[] current = {0.3, -1.0};
        double[] proposed = new double[2];
        proposal.propose(current, new RandomStream(1, StreamPurpose.TESTING, 0, 0), new double[2], proposed);
        double expected = Math.log(q.density(current)) - Math.log(q.density(proposed));
        assertEquals(expected, proposal.logProposalRatio(current, proposed, new double[2]), 1e-12);
    }

    private static double[] flatten(double[][] m) {
        double[] out = new double[m.length * m.length];
        for (int a = 0; a < m.length; a++) {
            System.arraycopy(m[a], 0, out, a * m.length, m.length);
        }
        return out;
    }
}
