package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The gamma distribution with density {@code rate^shape x^(shape−1) e^(−rate·x) / Γ(shape)} on
 * (0, ∞); Johnson, Kotz &amp; Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed.
 * (1994), ch. 17.
 *
 * <p>Draws use Marsaglia &amp; Tsang, "A simple method for generating gamma variables", ACM
 * Transactions on Mathematical Software 26(3), 363–372 (2000): a squeeze-and-reject method on a
 * cubed normal, with the paper's boost {@code Gamma(shape) = Gamma(shape+1)·U^(1/shape)} for
 * shape below 1. Log-gamma comes from Commons Math, which is pure Java and so agrees on every JVM.
 */
public final class Gamma implements UnivariateDistribution {

    private final double shape;
    private final double rate;
    private final double logNormaliser;
    // Marsaglia–Tsang constants for the shape actually sampled (shape, or shape + 1 when boosted).
    private final boolean boosted;
    private final double d;
    private final double c;

    private Gamma(double shape, double rate) {
        this.shape = shape;
        this.rate = rate;
        this.logNormaliser = shape * StrictMath.log(rate)
                - org.apache.commons.math3.special.Gamma.logGamma(shape);
        this.boosted = shape < 1.0;
        this.d = (boosted ? shape + 1.0 : shape) - 1.0 / 3.0;
        this.c = 1.0 / StrictMath.sqrt(9.0 * d);
    }

    /** @throws IllegalArgumentException if {@code shape} or {@code rate} is not finite and positive */
    public static Gamma of(double shape, double rate) {
        return new Gamma(Checks.positive("shape", shape), Checks.positive("rate", rate));
    }

    public double shape() {
        return shape;
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
            x = (boosted ? StrictMath.exp(logStandardSample(random)) : marsagliaTsang(random)) / rate;
        } while (!(x > 0.0 && x < Double.POSITIVE_INFINITY));
        return x;
    }

    /**
     * The logarithm of a Gamma(shape, 1) draw. Working in logs keeps small shapes usable: their
     * draws underflow as numbers long before their logarithms do.
     */
    double logStandardSample(RandomStream random) {
        double logG = StrictMath.log(marsagliaTsang(random));
        return boosted ? logG + StrictMath.log(random.nextOpenDouble()) / shape : logG;
    }

    private double marsagliaTsang(RandomStream random) {
        while (true) {
            double x;
            double v;
            do {
                x = random.nextNormal();
                v = 1.0 + c * x;
            } while (v <= 0.0);
            v = v * v * v;
            double u = random.nextOpenDouble();
            double x2 = x * x;
            if (u < 1.0 - 0.0331 * x2 * x2) {
                return d * v;
            }
            if (StrictMath.log(u) < 0.5 * x2 + d * (1.0 - v + StrictMath.log(v))) {
                return d * v;
            }
        }
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0.0 && x < Double.POSITIVE_INFINITY)) {
            return Double.NEGATIVE_INFINITY;
        }
        return logNormaliser + (shape - 1.0) * StrictMath.log(x) - rate * x;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof Gamma)) {
            return false;
        }
        Gamma that = (Gamma) other;
        return Double.compare(shape, that.shape) == 0 && Double.compare(rate, that.rate) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(shape) + Double.hashCode(rate);
    }

    @Override
    public String toString() {
        return "gamma(shape=" + shape + ", rate=" + rate + ")";
    }
}
