package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The normal distribution N(mean, sd²) on the real line; the standard density, e.g. Johnson,
 * Kotz &amp; Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed. (1994), ch. 13.
 */
public final class Normal implements UnivariateDistribution {

    /** log √(2π), the normal density's constant. */
    static final double LOG_SQRT_2PI = 0.5 * StrictMath.log(2.0 * StrictMath.PI);

    private final double mean;
    private final double sd;
    private final double logNormaliser;

    private Normal(double mean, double sd) {
        this.mean = mean;
        this.sd = sd;
        this.logNormaliser = -StrictMath.log(sd) - LOG_SQRT_2PI;
    }

    /**
     * @throws IllegalArgumentException if {@code mean} is not finite or {@code sd} is not finite
     *     and positive
     */
    public static Normal of(double mean, double sd) {
        return new Normal(Checks.finite("mean", mean), Checks.positive("sd", sd));
    }

    public double mean() {
        return mean;
    }

    public double sd() {
        return sd;
    }

    @Override
    public Support support() {
        return Support.real();
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            x = mean + sd * random.nextNormal();
        } while (!Double.isFinite(x));
        return x;
    }

    @Override
    public double logDensity(double x) {
        if (!Double.isFinite(x)) {
            return Double.NEGATIVE_INFINITY;
        }
        double z = (x - mean) / sd;
        return logNormaliser - 0.5 * z * z;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof Normal)) {
            return false;
        }
        Normal that = (Normal) other;
        return Double.compare(mean, that.mean) == 0 && Double.compare(sd, that.sd) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(mean) + Double.hashCode(sd);
    }

    @Override
    public String toString() {
        return "normal(mean=" + mean + ", sd=" + sd + ")";
    }
}
