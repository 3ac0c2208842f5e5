package org.skerry.engine.reference;

import org.apache.commons.math3.distribution.NormalDistribution;

/**
 * Moments of a normal distribution N(m, s²) truncated to an interval (a, b), from Commons Math's
 * normal density and distribution function. With α = (a − m)/s, β = (b − m)/s and
 * Z = Φ(β) − Φ(α): mean {@code m + s (φ(α) − φ(β))/Z}, variance
 * {@code s² [1 + (α φ(α) − β φ(β))/Z − ((φ(α) − φ(β))/Z)²]} (Johnson, Kotz &amp; Balakrishnan,
 * Continuous Univariate Distributions, vol. 1, 2nd ed. (1994), §13.10; quoted from memory, and
 * checked in ClosedFormsTest against numerical integration). {@code Z} itself is the mass the
 * interval keeps, so a posterior truncated to it has evidence {@code Z} times the untruncated one.
 */
public final class TruncatedNormalExact {

    private static final NormalDistribution STANDARD = new NormalDistribution(null, 0.0, 1.0);

    private final double mean;
    private final double sd;
    private final double alpha;
    private final double beta;

    /** N(mean, sd²) restricted to (low, high); either bound may be infinite. */
    public TruncatedNormalExact(double mean, double sd, double low, double high) {
        this.mean = mean;
        this.sd = sd;
        this.alpha = (low - mean) / sd;
        this.beta = (high - mean) / sd;
    }

    private static double density(double z) {
        return Double.isInfinite(z) ? 0.0 : STANDARD.density(z);
    }

    private static double zTimesDensity(double z) {
        return Double.isInfinite(z) ? 0.0 : z * STANDARD.density(z);
    }

    /** The probability the untruncated distribution gives the interval. */
    public double mass() {
        return STANDARD.cumulativeProbability(beta) - STANDARD.cumulativeProbability(alpha);
    }

    public double mean() {
        return mean + sd * (density(alpha) - density(beta)) / mass();
    }

    public double sd() {
        double z = mass();
        double shift = (density(alpha) - density(beta)) / z;
        return sd * Math.sqrt(1 + (zTimesDensity(alpha) - zTimesDensity(beta)) / z - shift * shift);
    }
}
