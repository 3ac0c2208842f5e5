package org.skerry.engine.sampler;

import org.skerry.engine.move.MoveKernel;

/**
 * The Metropolis–Hastings moves after resampling: the kernel, how many steps, and the random
 * walk's scale and the acceptance rate it is steered towards.
 *
 * @param kernel           the proposal kernel
 * @param fixedSteps       a fixed number of MH steps per iteration, or 0 to adapt it; in [0, 65535]
 * @param stayProbability  with adaptive steps: the accepted chance c that a particle never moves
 *                         in an iteration; in (0, 1)
 * @param maxSteps         cap on adaptive MH steps per iteration; in [1, 65535]
 * @param initialScale     initial random-walk scale λ (multiplies 2.38/√d); positive and finite
 * @param targetAcceptance acceptance rate the scale is steered towards, in (0, 1), or NaN for
 *                         automatic ({@link #targetAcceptance(int)})
 */
public record MoveSettings(MoveKernel kernel, int fixedSteps, double stayProbability, int maxSteps,
        double initialScale, double targetAcceptance) {

    /** Random walk, adaptive steps (c = 0.01, at most 20), λ = 1, automatic target acceptance. */
    public static final MoveSettings DEFAULTS = new MoveSettings(MoveKernel.RANDOM_WALK, 0, 0.01, 20, 1.0, Double.NaN);

    public MoveSettings {
        if (kernel == null) {
            throw new IllegalArgumentException("moveKernel must not be null");
        }
        if (fixedSteps < 0 || fixedSteps >= 65536) {
            throw new IllegalArgumentException("fixedSteps must be in [0, 65535], was " + fixedSteps);
        }
        if (!(stayProbability > 0 && stayProbability < 1)) {
            throw new IllegalArgumentException("stayProbability must be in (0, 1), was " + stayProbability);
        }
        if (maxSteps < 1 || maxSteps >= 65536) {
            throw new IllegalArgumentException("maxSteps must be in [1, 65535], was " + maxSteps);
        }
        if (!(initialScale > 0) || !Double.isFinite(initialScale)) {
            throw new IllegalArgumentException("initialScale must be positive and finite, was " + initialScale);
        }
        if (!Double.isNaN(targetAcceptance) && !(targetAcceptance > 0 && targetAcceptance < 1)) {
            throw new IllegalArgumentException("targetAcceptance must be in (0, 1) or NaN (automatic), was "
                    + targetAcceptance);
        }
    }

    /**
     * The acceptance rate the random walk is steered towards in {@code dimension} dimensions: the
     * set value, or when it is automatic (NaN) 0.44 in one dimension (Roberts &amp; Rosenthal 2001,
     * Statistical Science 16(4)), 0.234 from five dimensions on (Roberts, Gelman &amp; Gilks 1997),
     * and linear in between (common practice).
     */
    public double targetAcceptance(int dimension) {
        if (!Double.isNaN(targetAcceptance)) {
            return targetAcceptance;
        }
        if (dimension <= 1) {
            return 0.44;
        }
        if (dimension >= 5) {
            return 0.234;
        }
        return 0.44 + (0.234 - 0.44) * (dimension - 1) / 4.0;
    }
}
