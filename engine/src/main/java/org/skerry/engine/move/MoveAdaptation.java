package org.skerry.engine.move;

/**
 * Driver-side rules that tune the moves from observed acceptance: how many Metropolis–Hastings
 * steps to make, and how to rescale the random walk. Both are pure functions of exact counts, so
 * every grouping of particles adapts identically.
 */
public final class MoveAdaptation {

    /** Acceptance the random-walk scale is steered towards (Roberts, Gelman &amp; Gilks 1997). */
    public static final double TARGET_ACCEPTANCE = 0.234;
    /** Bounds on the random-walk scale λ. */
    public static final double MIN_SCALE = 1e-3;
    public static final double MAX_SCALE = 10.0;

    private MoveAdaptation() {
    }

    /**
     * Number of steps so that a particle stays put throughout with probability at most
     * {@code stayProbability}: {@code R = ⌈log c / log(1 − acceptance)⌉} (Drovandi &amp; Pettitt
     * 2011, Biometrics 67(1)), at least 1 and at most {@code maxSteps}.
     */
    public static int steps(double acceptance, double stayProbability, int maxSteps) {
        if (!(stayProbability > 0 && stayProbability < 1)) {
            throw new IllegalArgumentException("stayProbability must be in (0, 1), was " + stayProbability);
        }
        if (maxSteps < 1) {
            throw new IllegalArgumentException("maxSteps must be >= 1, was " + maxSteps);
        }
        if (!(acceptance > 0)) {
            return maxSteps;
        }
        if (acceptance >= 1) {
            return 1;
        }
        double exact = StrictMath.log(stayProbability) / StrictMath.log1p(-acceptance);
        if (exact >= maxSteps) {
            return maxSteps;
        }
        return Math.max(1, (int) StrictMath.ceil(exact));
    }

    /**
     * The next random-walk scale: {@code λ·exp(2·(acceptance − target))}, kept in
     * [{@link #MIN_SCALE}, {@link #MAX_SCALE}]. A stochastic-approximation style update on the log
     * scale (our choice of gain; common practice rather than a published constant).
     */
    public static double nextScale(double scale, double acceptance, double target) {
        double next = scale * StrictMath.exp(2.0 * (acceptance - target));
        return Math.min(MAX_SCALE, Math.max(MIN_SCALE, next));
    }
}
