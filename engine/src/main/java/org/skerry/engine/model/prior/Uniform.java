package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The continuous uniform distribution on the open interval (lower, upper), density
 * {@code 1/(upper − lower)}; Johnson, Kotz &amp; Balakrishnan, Continuous Univariate
 * Distributions vol. 2, 2nd ed. (1995), ch. 26.
 */
public final class Uniform implements UnivariateDistribution {

    private final double lower;
    private final double upper;
    private final double width;
    private final double logDensity;
    private final Support support;

    private Uniform(double lower, double upper) {
        this.lower = lower;
        this.upper = upper;
        this.width = upper - lower;
        this.logDensity = -StrictMath.log(width);
        this.support = Support.interval(lower, upper);
    }

    /**
     * @throws IllegalArgumentException if a bound is not finite, {@code lower >= upper}, or the
     *     width overflows
     */
    public static Uniform of(double lower, double upper) {
        Checks.finite("lower", lower);
        Checks.finite("upper", upper);
        if (!(lower < upper)) {
            throw new IllegalArgumentException(
                    "lower must be < upper, was lower=" + lower + ", upper=" + upper);
        }
        if (upper - lower == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException(
                    "upper - lower must be finite, was lower=" + lower + ", upper=" + upper);
        }
        return new Uniform(lower, upper);
    }

    public double lower() {
        return lower;
    }

    public double upper() {
        return upper;
    }

    @Override
    public Support support() {
        return support;
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            // lower + width·u rounds onto a bound for u near 0 or 1; the support is open.
            x = lower + width * random.nextOpenDouble();
        } while (!(x > lower && x < upper));
        return x;
    }

    @Override
    public double logDensity(double x) {
        return x > lower && x < upper ? logDensity : Double.NEGATIVE_INFINITY;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof Uniform)) {
            return false;
        }
        Uniform that = (Uniform) other;
        return Double.compare(lower, that.lower) == 0 && Double.compare(upper, that.upper) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(lower) + Double.hashCode(upper);
    }

    @Override
    public String toString() {
        return "uniform(lower=" + lower + ", upper=" + upper + ")";
    }
}
