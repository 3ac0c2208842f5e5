package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The exponential distribution with density {@code rate·exp(−rate·x)} on (0, ∞); Johnson, Kotz
 * &amp; Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed. (1994), ch. 19.
 */
public final class Exponential implements UnivariateDistribution {

    private final double rate;
    private final double logRate;

    private Exponential(double rate) {
        this.rate = rate;
        this.logRate = StrictMath.log(rate);
    }

    /** @throws IllegalArgumentException if {@code rate} is not finite and positive */
    public static Exponential of(double rate) {
        return new Exponential(Checks.positive("rate", rate));
    }

    public double rate() {
        return rate;
    }

    @Override
    public Support support() {
        return Support.positive();
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            x = random.nextExponential() / rate;
        } while (!(x > 0.0 && x < Double.POSITIVE_INFINITY));
        return x;
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0.0 && x < Double.POSITIVE_INFINITY)) {
            return Double.NEGATIVE_INFINITY;
        }
        return logRate - rate * x;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof Exponential && Double.compare(rate, ((Exponential) other).rate) == 0;
    }

    @Override
    public int hashCode() {
        return Double.hashCode(rate);
    }

    @Override
    public String toString() {
        return "exponential(rate=" + rate + ")";
    }
}
