package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The half-normal distribution, |Z|·sd for standard normal Z, on (0, ∞): density
 * {@code 2/(sd√(2π)) exp(−x²/(2sd²))}; Johnson, Kotz &amp; Balakrishnan, Continuous Univariate
 * Distributions vol. 1, 2nd ed. (1994), §13.10 (folded normal with zero mean).
 */
public final class HalfNormal implements UnivariateDistribution {

    private final double sd;
    private final double logNormaliser;

    private HalfNormal(double sd) {
        this.sd = sd;
        this.logNormaliser = StrictMath.log(2.0) - StrictMath.log(sd) - Normal.LOG_SQRT_2PI;
    }

    /** @throws IllegalArgumentException if {@code sd} is not finite and positive */
    public static HalfNormal of(double sd) {
        return new HalfNormal(Checks.positive("sd", sd));
    }

    public double sd() {
        return sd;
    }

    @Override
    public Support support() {
        return Support.positive();
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            x = StrictMath.abs(random.nextNormal()) * sd;
        } while (!(x > 0.0 && x < Double.POSITIVE_INFINITY));
        return x;
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0.0 && x < Double.POSITIVE_INFINITY)) {
            return Double.NEGATIVE_INFINITY;
        }
        double z = x / sd;
        return logNormaliser - 0.5 * z * z;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof HalfNormal && Double.compare(sd, ((HalfNormal) other).sd) == 0;
    }

    @Override
    public int hashCode() {
        return Double.hashCode(sd);
    }

    @Override
    public String toString() {
        return "half-normal(sd=" + sd + ")";
    }
}
