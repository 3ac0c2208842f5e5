package org.skerry.engine.abc;

/**
 * The weighted Euclidean distance between simulated and observed summaries,
 * {@code d = √Σₖ (wₖ·(sₖ − yₖ))²}, and the log of the mean kernel over a particle's M
 * simulations, {@code log (1/M)·Σₘ K_ε(dₘ)}: the number the ABC target uses where a likelihood
 * run uses the log-likelihood. Used alike on the blocks and on the driver, so both compute the
 * same bits.
 */
public final class Distance {

    private Distance() {
    }

    /** The distance of the summaries at {@code summaries[offset ..]} from {@code observed}, weights {@code weights}. */
    public static double of(double[] summaries, int offset, double[] observed, double[] weights) {
        double total = 0.0;
        for (int k = 0; k < observed.length; k++) {
            double e = weights[k] * (summaries[offset + k] - observed[k]);
            total += e * e;
        }
        return StrictMath.sqrt(total);
    }

    /**
     * {@code log (1/M)·Σₘ K_ε(dₘ)} for the {@code simulations} summary vectors at
     * {@code summaries[offset ..]}, one after the other; 0 at ε = +∞ (weights may then be null).
     */
    public static double logMeanKernel(double[] summaries, int offset, int simulations, double[] observed,
            double[] weights, double tolerance, AbcKernel kernel) {
        if (tolerance == Double.POSITIVE_INFINITY) {
            return 0.0;
        }
        int s = observed.length;
        if (kernel == AbcKernel.UNIFORM) {
            int within = 0;
            for (int m = 0; m < simulations; m++) {
                if (of(summaries, offset + m * s, observed, weights) <= tolerance) {
                    within++;
                }
            }
            return within == 0 ? Double.NEGATIVE_INFINITY
                    : simulations == 1 ? 0.0 : StrictMath.log((double) within / simulations);
        }
        double max = Double.NEGATIVE_INFINITY;
        for (int m = 0; m < simulations; m++) {
            max = Math.max(max, kernel.logKernel(of(summaries, offset + m * s, observed, weights), tolerance));
        }
        if (simulations == 1 || max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        double sum = 0.0;
        for (int m = 0; m < simulations; m++) {
            sum += StrictMath.exp(kernel.logKernel(of(summaries, offset + m * s, observed, weights), tolerance) - max);
        }
        return max + StrictMath.log(sum / simulations);
    }
}
