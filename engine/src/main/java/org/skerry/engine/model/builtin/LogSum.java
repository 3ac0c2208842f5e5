package org.skerry.engine.model.builtin;

/** log(eᵃ + eᵇ) without overflow, for the two-component likelihoods. */
final class LogSum {

    private LogSum() {
    }

    static double of(double a, double b) {
        double max = StrictMath.max(a, b);
        if (max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        return max + StrictMath.log1p(StrictMath.exp(StrictMath.min(a, b) - max));
    }
}
