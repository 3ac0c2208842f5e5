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

    /**
     * Step-size factors of the pilot step's ladder: a quarter to twice the current scale, so one
     * pilot can shrink the scale fourfold or double it (our choice).
     */
    private static final double[] LADDER = {0.25, 0.5, 1.0, 2.0};

    private MoveAdaptation() {
    }

    /** The pilot ladder's step-size factors, smallest first. */
    public static double[] ladder() {
        return LADDER.clone();
    }

    /**
     * The random-walk scale and the acceptance expected at it, chosen from a pilot step on the
     * {@link #ladder()}: acceptance falls as the step grows, so the rungs whose acceptance brackets
     * {@code target} are interpolated linearly in (log factor, acceptance); when every rung accepts
     * more than the target the largest step is taken, when every rung accepts less the smallest.
     * Rungs without proposals are skipped; with none at all the scale is kept.
     *
     * @return the scale, kept in [{@link #MIN_SCALE}, {@link #MAX_SCALE}], and the acceptance expected there
     */
    public static LadderChoice scaleFromLadder(double scale, long[] proposedByRung, long[] acceptedByRung,
            double target) {
        if (proposedByRung == null || acceptedByRung == null || proposedByRung.length != LADDER.length
                || acceptedByRung.length != LADDER.length) {
            throw new IllegalArgumentException("need counts for the " + LADDER.length + " rungs of the ladder");
        }
        int used = 0;
        double[] logFactor = new double[LADDER.length];
        double[] acceptance = new double[LADDER.length];
        for (int k = 0; k < LADDER.length; k++) {
            if (proposedByRung[k] > 0) {
                logFactor[used] = StrictMath.log(LADDER[k]);
                acceptance[used] = (double) acceptedByRung[k] / proposedByRung[k];
                used++;
            }
        }
        if (used == 0) {
            return new LadderChoice(scale, 0.0);
        }
        double chosenLog;
        double expected;
        if (acceptance[used - 1] >= target) {
            chosenLog = logFactor[used - 1];
            expected = acceptance[used - 1];
        } else if (acceptance[0] <= target) {
            chosenLog = logFactor[0];
            expected = acceptance[0];
        } else {
            // Walk up to the first rung below the target; noise can make acceptance non-monotone,
            // so the first crossing from the small-step end decides.
            int k = 1;
            while (acceptance[k] > target) {
                k++;
            }
            double a0 = acceptance[k - 1];
            double a1 = acceptance[k];
            double t = (a0 - target) / (a0 - a1);
            chosenLog = logFactor[k - 1] + t * (logFactor[k] - logFactor[k - 1]);
            expected = target;
        }
        double next = scale * StrictMath.exp(chosenLog);
        return new LadderChoice(Math.min(MAX_SCALE, Math.max(MIN_SCALE, next)), expected);
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
