package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * The log-normal distribution: {@code log X ~ N(meanlog, sdlog²)}, on (0, ∞); Johnson, Kotz
 * &amp; Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed. (1994), ch. 14.
 */
public final class LogNormal implements UnivariateDistribution {

    private final double meanlog;
    private final double sdlog;
    private final double logNormaliser;

    private LogNormal(double meanlog, double sdlog) {
        this.meanlog = meanlog;
        this.sdlog = sdlog;
        this.logNormaliser = -StrictMath.log(sdlog) - Normal.LOG_SQRT_2PI;
    }

    /**
     * @throws IllegalArgumentException if {@code meanlog} is not finite or {@code sdlog} is not
     *     finite and positive
     */
    public static LogNormal of(double meanlog, double sdlog) {
        return new LogNormal(Checks.finite("meanlog", meanlog), Checks.positive("sdlog", sdlog));
    }

    public double meanlog() {
        return meanlog;
    }

    public double sdlog() {
        return sdlog;
    }

    @Override
    public Support support() {
        return Support.positive();
    }

    @Override
    public double sample(RandomStream random) {
        double x;
        do {
            // exp can overflow or underflow for extreme settings; such a draw is outside (0, ∞).
            x = StrictMath.exp(meanlog + sdlog * random.nextNormal());
        } while (!(x > 0.0 && x < Double.POSITIVE_INFINITY));
        return x;
    }

    @Override
    public double logDensity(double x) {
        if (!(x > 0.0 && x < Double.POSITIVE_INFINITY)) {
            return Double.NEGATIVE_INFINITY;
        }
        double logX = StrictMath.log(x);
        double z = (logX - meanlog) / sdlog;
        return logNormaliser - logX - 0.5 * z * z;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof LogNormal)) {
            return false;
        }
        LogNormal that = (LogNormal) other;
        return Double.compare(meanlog, that.meanlog) == 0 && Double.compare(sdlog, that.sdlog) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Double.hashCode(meanlog) + Double.hashCode(sdlog);
    }

    @Override
    public String toString() {
        return "lognormal(meanlog=" + meanlog + ", sdlog=" + sdlog + ")";
    }
}
