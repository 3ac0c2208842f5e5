package org.skerry.engine.move;

import java.io.Serializable;
import org.skerry.engine.random.RandomStream;

/**
 * A fitted Metropolis–Hastings proposal on the unconstrained scale: the kernel, a mean (used by
 * the independence kernel) and the lower Cholesky factor of the proposal covariance. Immutable and
 * small (O(d²)); fitted on the driver, sent to every block.
 */
public final class Proposal implements Serializable {

    private static final long serialVersionUID = 1L;

    private final MoveKernel kernel;
    private final int dimension;
    private final double[] mean;
    private final double[] cholesky;
    private final double[] rungFactors;

    /**
     * @param cholesky lower-triangular factor L of the proposal covariance, row-major d×d
     */
    public Proposal(MoveKernel kernel, double[] mean, double[] cholesky) {
        this(kernel, mean, cholesky, null);
    }

    private Proposal(MoveKernel kernel, double[] mean, double[] cholesky, double[] rungFactors) {
        int d = mean.length;
        if (cholesky.length != d * d) {
            throw new IllegalArgumentException("cholesky must have " + d * d + " entries, had " + cholesky.length);
        }
        for (int a = 0; a < d; a++) {
            if (!(cholesky[a * d + a] > 0) || !Double.isFinite(cholesky[a * d + a])) {
                throw new IllegalArgumentException("cholesky diagonal entry " + a + " must be positive and finite, was "
                        + cholesky[a * d + a]);
            }
        }
        this.kernel = kernel;
        this.dimension = d;
        this.mean = mean.clone();
        this.cholesky = cholesky.clone();
        this.rungFactors = rungFactors == null ? null : rungFactors.clone();
    }

    /**
     * This random walk with a ladder of step-size factors: particle {@code i} steps with factor
     * {@code rungFactors[rungOf(i)]}, a choice made from its index alone, never from its state, so
     * each particle's kernel still leaves the target invariant. A pilot step on a ladder measures
     * the acceptance at several scales at once (population-based tuning after Fearnhead &amp;
     * Taylor 2013, Bayesian Analysis 8(2)).
     *
     * @throws IllegalArgumentException if this is not a random walk or a factor is not positive and finite
     */
    public Proposal withRungs(double[] factors) {
        if (kernel != MoveKernel.RANDOM_WALK) {
            throw new IllegalArgumentException("a ladder of scales needs the random-walk kernel, was " + kernel);
        }
        if (factors.length == 0) {
            throw new IllegalArgumentException("factors must not be empty");
        }
        for (double f : factors) {
            if (!(f > 0) || !Double.isFinite(f)) {
                throw new IllegalArgumentException("every factor must be positive and finite, was " + f);
            }
        }
        return new Proposal(kernel, mean, cholesky, factors);
    }

    /** Number of rungs of the ladder; 1 without one. */
    public int rungs() {
        return rungFactors == null ? 1 : rungFactors.length;
    }

    /** The rung particle {@code index} steps on: its index modulo the number of rungs. */
    public int rungOf(long index) {
        return rungFactors == null ? 0 : (int) Math.floorMod(index, (long) rungFactors.length);
    }

    public MoveKernel kernel() {
        return kernel;
    }

    public int dimension() {
        return dimension;
    }

    public double[] mean() {
        return mean.clone();
    }

    /** The lower Cholesky factor, row-major. */
    public double[] cholesky() {
        return cholesky.clone();
    }

    /**
     * Draws a proposal {@code out} from the current point {@code z}, using {@code noise} (length d)
     * as scratch for the standard normal draws.
     */
    public void propose(double[] z, RandomStream random, double[] noise, double[] out) {
        propose(z, random, noise, out, 0);
    }

    /** As {@link #propose(double[], RandomStream, double[], double[])}, with the step of ladder rung {@code rung}. */
    public void propose(double[] z, RandomStream random, double[] noise, double[] out, int rung) {
        int d = dimension;
        double factor = rungFactors == null ? 1.0 : rungFactors[rung];
        for (int a = 0; a < d; a++) {
            noise[a] = random.nextNormal();
        }
        boolean randomWalk = kernel == MoveKernel.RANDOM_WALK;
        for (int a = 0; a < d; a++) {
            double step = 0.0;
            int row = a * d;
            for (int b = 0; b <= a; b++) {
                step += cholesky[row + b] * noise[b];
            }
            out[a] = (randomWalk ? z[a] : mean[a]) + factor * step;
        }
    }

    /**
     * {@code log q(current | proposed) − log q(proposed | current)}: zero for the symmetric random
     * walk; for the independence kernel the ratio of its Gaussian densities. {@code scratch} has
     * length d.
     */
    public double logProposalRatio(double[] current, double[] proposed, double[] scratch) {
        if (kernel == MoveKernel.RANDOM_WALK) {
            return 0.0;
        }
        return 0.5 * (mahalanobisSquared(proposed, scratch) - mahalanobisSquared(current, scratch));
    }

    private double mahalanobisSquared(double[] z, double[] scratch) {
        int d = dimension;
        double total = 0.0;
        for (int a = 0; a < d; a++) {
            double value = z[a] - mean[a];
            int row = a * d;
            for (int b = 0; b < a; b++) {
                value -= cholesky[row + b] * scratch[b];
            }
            value /= cholesky[row + a];
            scratch[a] = value;
            total += value * value;
        }
        return total;
    }
}
