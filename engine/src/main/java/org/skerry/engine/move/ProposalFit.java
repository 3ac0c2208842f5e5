package org.skerry.engine.move;

import org.skerry.engine.population.MomentSums;

/**
 * Fits a {@link Proposal} to the weighted population on the driver, from the exact moment sums
 * the blocks send: random walk with covariance {@code λ²·(2.38²/d)·Σ̂} (Roberts, Gelman &amp;
 * Gilks 1997), or an independence Gaussian with covariance {@code INDEPENDENCE_INFLATION·Σ̂}.
 *
 * <p>A degenerate Σ̂ (few distinct particles, a parameter the data pins down exactly) is
 * regularised by adding a growing multiple of its mean diagonal until the Cholesky factorisation
 * succeeds; pure Java arithmetic keeps the result identical on every JVM.
 */
public final class ProposalFit {

    /**
     * Covariance inflation of the independence proposal, so its tails are heavier than the
     * target's (our choice, not from a paper: a factor near 2 is common practice).
     */
    public static final double INDEPENDENCE_INFLATION = 2.0;

    private static final double RANDOM_WALK_FACTOR = 2.38 * 2.38;

    private ProposalFit() {
    }

    /** Fits the proposal of the given kernel with random-walk scale {@code scale} (λ). */
    public static Proposal fit(MoveKernel kernel, MomentSums moments, double scale) {
        if (!(scale > 0) || !Double.isFinite(scale)) {
            throw new IllegalArgumentException("scale must be positive and finite, was " + scale);
        }
        int d = moments.dimension();
        double[][] covariance = moments.covariance();
        double factor = kernel == MoveKernel.RANDOM_WALK ? scale * scale * RANDOM_WALK_FACTOR / d
                : INDEPENDENCE_INFLATION;
        double[] scaled = new double[d * d];
        for (int a = 0; a < d; a++) {
            for (int b = 0; b < d; b++) {
                scaled[a * d + b] = factor * covariance[a][b];
            }
        }
        return new Proposal(kernel, moments.mean(), regularisedCholesky(scaled, d));
    }

    /** Lower Cholesky factor of a symmetric matrix, with diagonal loading when it is not positive definite. */
    static double[] regularisedCholesky(double[] matrix, int d) {
        double meanDiagonal = 0.0;
        for (int a = 0; a < d; a++) {
            double entry = matrix[a * d + a];
            meanDiagonal += Double.isFinite(entry) && entry > 0 ? entry : 0.0;
        }
        meanDiagonal /= d;
        if (!(meanDiagonal > 0)) {
            meanDiagonal = 1e-12;
        }
        double loading = 0.0;
        for (int attempt = 0; attempt < 40; attempt++) {
            double[] factor = cholesky(matrix, d, loading);
            if (factor != null) {
                return factor;
            }
            loading = loading == 0.0 ? 1e-10 * meanDiagonal : loading * 10.0;
        }
        double[] diagonal = new double[d * d];
        for (int a = 0; a < d; a++) {
            double entry = matrix[a * d + a];
            diagonal[a * d + a] = StrictMath.sqrt(Double.isFinite(entry) && entry > 0 ? entry : meanDiagonal);
        }
        return diagonal;
    }

    private static double[] cholesky(double[] matrix, int d, double loading) {
        double[] lower = new double[d * d];
        for (int a = 0; a < d; a++) {
            for (int b = 0; b <= a; b++) {
                double sum = matrix[a * d + b] + (a == b ? loading : 0.0);
                for (int k = 0; k < b; k++) {
                    sum -= lower[a * d + k] * lower[b * d + k];
                }
                if (a == b) {
                    if (!(sum > 0) || !Double.isFinite(sum)) {
                        return null;
                    }
                    lower[a * d + a] = StrictMath.sqrt(sum);
                } else {
                    lower[a * d + b] = sum / lower[b * d + b];
                }
            }
        }
        return lower;
    }
}
