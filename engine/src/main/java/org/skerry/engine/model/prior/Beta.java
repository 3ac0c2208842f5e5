package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The beta distribution with density {@code x^(a−1) (1−x)^(b−1) / B(a, b)} on (0, 1); Johnson,
 * Kotz &amp; Balakrishnan, Continuous Univariate Distributions vol. 2, 2nd ed. (1995), ch. 25.
 *
 * <p>A draw is {@code X/(X+Y)} for independent {@code X ~ Gamma(a, 1)} and {@code Y ~ Gamma(b, 1)}
 * (ibid. §25.2), formed from their logarithms as {@code 1/(1 + exp(log Y − log X))} so that small
 * shapes do not give 0/0. Log-beta comes from Commons Math (pure Java).
 */
public final class Beta implements UnivariateDistribution {

    private static final Support UNIT = Support.interval(0.0, 1.0);

    private final double a;
    private final double b;
    private final double logNormaliser;
    private final Gamma gammaA;
    private final Gamma gammaB;

    private Beta(double a, double b) {
        this.a = a;
        this.b = b;
        this.logNormaliser = -org.apache.commons.math3.special.Beta.logBeta(a, b);
        this.gammaA = Gamma.of(a, 1.0);
        this.gammaB = Gamma.of(b, 1.0);
    }

    /** @throws IllegalArgumentException if {@code a} or {@code b} is not finite and positive */
    public static Beta of(double a, double b) {
        return new Beta(Checks.positive("a", a), Checks.positive("b", b));
    }

    public double a() {
        return a;
    }

    public double b() {
        return b;
    }

    @Override
    public Support support() {
        return UNIT;
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            double logX = gammaA.logStandardSample(random);
            double logY = gammaB.logStandardSample(random);
            x = 1.0 / (1.0 + StrictMath.exp(logY - logX));
        } while (!(x > 0.0 && x < 1.0));
        return x;
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0.0 && x < 1.0)) {
            return Double.NEGATIVE_INFINITY;
        }
        return logNormaliser + (a - 1.0) * StrictMath.log(x) + (b - 1.0) * StrictMath.log1p(-x);
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof Beta)) {
            return false;
        }
        Beta that = (Beta) other;
        return Double.compare(a, that.a) == 0 && Double.compare(b, that.b) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(a) + Double.hashCode(b);
    }

    @Override
    public String toString() {
        return "beta(a=" + a + ", b=" + b + ")";
    }
}
