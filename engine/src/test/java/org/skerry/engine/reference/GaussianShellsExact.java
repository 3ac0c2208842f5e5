package org.skerry.engine.reference;

import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.special.Gamma;

/**
 * The evidence of the two-shell problem of Feroz, Hobson &amp; Bridges, MNRAS 398, 1601–1614
 * (2009), §6.2, when both shells lie wholly inside the prior box and do not overlap: in spherical
 * coordinates about a centre each shell integrates to
 * {@code S_{D−1}·∫₀^∞ ρ^{D−1} N(ρ; r, w²) dρ}, with {@code S_{D−1} = 2π^{D/2}/Γ(D/2)} the area of
 * the unit sphere in D dimensions, so {@code Z = 2·S_{D−1}·M/(2·bound)^D}. The radial integral
 * is done with Commons Math's Legendre–Gauss integrator, Γ with Commons Math.
 *
 * <p>{@link #publishedLogEvidence} gives the analytic values printed in the paper's table for the
 * problem (r = 2, w = 0.1, centres ±3.5, bound 6), quoted here from memory to the paper's two
 * decimals.
 */
public final class GaussianShellsExact {

    private GaussianShellsExact() {
    }

    public static double logEvidence(int dimension, double radius, double width, double bound) {
        NormalDistribution radial = new NormalDistribution(radius, width);
        IterativeLegendreGaussIntegrator integrator = new IterativeLegendreGaussIntegrator(16, 1e-13, 1e-300);
        double lower = Math.max(0.0, radius - 40.0 * width);
        double moment = integrator.integrate(100_000,
                rho -> Math.pow(rho, dimension - 1) * radial.density(rho), lower, radius + 40.0 * width);
        double logSphere = Math.log(2.0) + 0.5 * dimension * Math.log(Math.PI) - Gamma.logGamma(0.5 * dimension);
        return Math.log(2.0) + logSphere + Math.log(moment) - dimension * Math.log(2.0 * bound);
    }

    /** The paper's analytic log Z for D = 2, 5 or 10 (from memory, two decimals). */
    public static double publishedLogEvidence(int dimension) {
        switch (dimension) {
            case 2:
                return -1.75;
            case 5:
                return -5.67;
            case 10:
                return -14.59;
            default:
                throw new IllegalArgumentException("no published value remembered for dimension " + dimension);
        }
    }
}
