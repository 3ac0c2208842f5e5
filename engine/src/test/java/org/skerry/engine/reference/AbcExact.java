package org.skerry.engine.reference;

import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.special.Gamma;

/**
 * Exact ABC posteriors at a fixed tolerance with the uniform kernel, for the checks of the ABC
 * sampler: an unnormalised density on an interval, whose mean, sd and quantiles come from
 * Commons Math quadrature (a composite 10-point Legendre–Gauss rule on 4 000 panels: fixed, since
 * an adaptive rule never meets a relative goal on a difference of normal CDFs that cancels in
 * the tails) and root finding (Brent). The ABC posterior is
 * {@code π(θ)·P(d(x, y) ≤ ε | θ)}, from the definition of ABC (Pritchard et al. 1999, Mol. Biol.
 * Evol. 16; Beaumont, Zhang &amp; Balding 2002, Genetics 162).
 */
public final class AbcExact {

    private static final int PANELS = 4000;
    private static final GaussIntegratorFactory FACTORY = new GaussIntegratorFactory();

    private final DoubleUnaryOperator density;
    private final double lower;
    private final double upper;
    private final double[] cumulative;
    private final double mass;
    private final double mean;
    private final double sd;

    private AbcExact(DoubleUnaryOperator density, double lower, double upper) {
        this.density = density;
        this.lower = lower;
        this.upper = upper;
        this.cumulative = new double[PANELS + 1];
        double width = (upper - lower) / PANELS;
        for (int p = 0; p < PANELS; p++) {
            cumulative[p + 1] = cumulative[p] + rule(density, lower + p * width, lower + (p + 1) * width);
        }
        this.mass = cumulative[PANELS];
        this.mean = integrate(t -> t * density.applyAsDouble(t)) / mass;
        double m = mean;
        this.sd = Math.sqrt(integrate(t -> (t - m) * (t - m) * density.applyAsDouble(t)) / mass);
    }

    private static double rule(DoubleUnaryOperator f, double from, double to) {
        GaussIntegrator gauss = FACTORY.legendre(10, from, to);
        return gauss.integrate(f::applyAsDouble);
    }

    private double integrate(DoubleUnaryOperator f) {
        double width = (upper - lower) / PANELS;
        double total = 0;
        for (int p = 0; p < PANELS; p++) {
            total += rule(f, lower + p * width, lower + (p + 1) * width);
        }
        return total;
    }

    /**
     * Normal mean with known σ, n observations, prior {@code N(μ₀, τ²)}, sample mean summary x̄,
     * distance |x̄_sim − x̄| (weight 1): density {@code N(θ; μ₀, τ²)·[Φ((x̄+ε−θ)/s) − Φ((x̄−ε−θ)/s)]},
     * s = σ/√n.
     */
    public static AbcExact normalMean(double observedMean, double sigma, int n, double priorMean, double priorSd,
            double tolerance) {
        NormalDistribution prior = new NormalDistribution(priorMean, priorSd);
        NormalDistribution unit = new NormalDistribution(0, 1);
        double s = sigma / Math.sqrt(n);
        return new AbcExact(t -> prior.density(t) * (unit.cumulativeProbability((observedMean + tolerance - t) / s)
                - unit.cumulativeProbability((observedMean - tolerance - t) / s)),
                observedMean - 10 * s - tolerance, observedMean + 10 * s + tolerance);
    }

    /**
     * The toy mixture of Sisson, Fan &amp; Tanaka (2007), θ ~ U(−10, 10), x | θ ~ ½N(θ, 1) + ½N(θ, 0.1²),
     * observed x: density {@code Σ ½·[Φ((x+ε−θ)/σᵢ) − Φ((x−ε−θ)/σᵢ)]} on [−10, 10].
     */
    public static AbcExact mixtureToy(double observed, double tolerance) {
        NormalDistribution unit = new NormalDistribution(0, 1);
        return new AbcExact(t -> 0.5 * (unit.cumulativeProbability(observed + tolerance - t)
                - unit.cumulativeProbability(observed - tolerance - t))
                + 0.5 * (unit.cumulativeProbability((observed + tolerance - t) / 0.1)
                        - unit.cumulativeProbability((observed - tolerance - t) / 0.1)), -10, 10);
    }

    /**
     * Poisson counts (n of them, total T), prior Gamma(a, b) (shape, rate), summary the total,
     * weight 1: the accepted totals k are the integers with |k − T| ≤ ε, and the density is
     * {@code Gamma(λ; a, b)·Σₖ Poisson(k; nλ)}, a finite mixture of Gamma(a + k, b + n) (Gelman et
     * al., BDA3 §2.6, for each component); for ε &lt; 1 only k = T, the conjugate posterior.
     */
    public static AbcExact poissonSum(long total, int n, double shape, double rate, double tolerance) {
        long low = Math.max(0, (long) Math.ceil(total - tolerance));
        long high = (long) Math.floor(total + tolerance);
        DoubleUnaryOperator density = lambda -> {
            if (lambda <= 0) {
                return 0.0;
            }
            double sum = 0;
            for (long k = low; k <= high; k++) {
                sum += Math.exp(shape * Math.log(rate) - Gamma.logGamma(shape) + (shape - 1) * Math.log(lambda)
                        - rate * lambda + k * Math.log(n * lambda) - n * lambda - Gamma.logGamma(k + 1.0));
            }
            return sum;
        };
        double centre = (shape + total) / (rate + n);
        double spread = Math.sqrt(shape + high) / (rate + n);
        return new AbcExact(density, 1e-12, centre + 15 * spread + (high - total) / (rate + n));
    }

    public double mean() {
        return mean;
    }

    public double sd() {
        return sd;
    }

    /** The p-quantile: the panel where the cumulative integral crosses p, then Brent's method within it. */
    public double quantile(double p) {
        double goal = p * mass;
        int k = 0;
        while (cumulative[k + 1] < goal) {
            k++;
        }
        double width = (upper - lower) / PANELS;
        double from = lower + k * width;
        double base = cumulative[k];
        DoubleUnaryOperator cdf = x -> base + (x > from ? rule(density, from, x) : 0.0) - goal;
        return new BrentSolver(1e-12).solve(1000, cdf::applyAsDouble, from, from + width);
    }
}
