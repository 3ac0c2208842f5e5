package org.skerry.engine.model.plankton;

import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;

/**
 * The right-hand side of a nutrient–phytoplankton–zooplankton model in the form of Franks,
 * Wroblewski &amp; Flierl (1986), Marine Biology 91, 121–129, with N, P, Z in mmol N m⁻³ and
 * time in days:
 * <pre>
 *   dN/dt = −μ·N/(k_N + N)·P + (1 − γ)·G(P)·Z + m_P·P + m_Z·Z
 *   dP/dt =  μ·N/(k_N + N)·P − G(P)·Z − m_P·P
 *   dZ/dt =  γ·G(P)·Z − m_Z·Z
 * </pre>
 * Nutrient uptake is Monod's (1949, Annual Review of Microbiology 3, 371–394); the grazing
 * response {@code G} is a {@link GrazingResponse}. Every loss returns to the nutrient pool, so
 * {@code N + P + Z} is conserved.
 *
 * <p>The integrated state is {@code (N, ln P, ln Z)}:
 * <pre>
 *   d ln P/dt = μ·N/(k_N + N) − (G(P)/P)·Z − m_P
 *   d ln Z/dt = γ·G(P) − m_Z
 * </pre>
 * P and Z then stay positive by construction and the error control acts on their relative
 * error, which is what a log-normal likelihood needs. In (N, P, Z) a grazed-out phytoplankton
 * stock falls below the absolute tolerance, may cross zero, and then grows as a negative bloom
 * towards the pole of G at P = −k_P. Uptake is evaluated at {@code max(N, 0)}, which leaves the
 * solution unchanged (it keeps N positive) and keeps trial stages finite. Immutable.
 */
public final class NpzEquations implements FirstOrderDifferentialEquations {

    private final GrazingResponse grazing;
    private final double maxGrowth;
    private final double nutrientHalfSaturation;
    private final double maxGrazing;
    private final double grazingHalfSaturation;
    private final double phytoplanktonMortality;
    private final double assimilation;
    private final double zooplanktonMortality;

    /**
     * @param grazing                the grazing response G
     * @param maxGrowth              μ_max, d⁻¹
     * @param nutrientHalfSaturation k_N, mmol N m⁻³
     * @param maxGrazing             g_max, d⁻¹
     * @param grazingHalfSaturation  k_P, mmol N m⁻³
     * @param phytoplanktonMortality m_P, d⁻¹
     * @param assimilation           γ, the fraction of grazed nitrogen the grazers keep, in [0, 1]
     * @param zooplanktonMortality   m_Z, d⁻¹
     */
    public NpzEquations(GrazingResponse grazing, double maxGrowth, double nutrientHalfSaturation,
            double maxGrazing, double grazingHalfSaturation, double phytoplanktonMortality,
            double assimilation, double zooplanktonMortality) {
        if (grazing == null) {
            throw new IllegalArgumentException("grazing must not be null");
        }
        this.grazing = grazing;
        this.maxGrowth = maxGrowth;
        this.nutrientHalfSaturation = nutrientHalfSaturation;
        this.maxGrazing = maxGrazing;
        this.grazingHalfSaturation = grazingHalfSaturation;
        this.phytoplanktonMortality = phytoplanktonMortality;
        this.assimilation = assimilation;
        this.zooplanktonMortality = zooplanktonMortality;
    }

    @Override
    public int getDimension() {
        return 3;
    }

    @Override
    public void computeDerivatives(double t, double[] y, double[] yDot) {
        double n = y[0];
        double p = StrictMath.exp(y[1]);
        double z = StrictMath.exp(y[2]);
        // The solution keeps N > 0, but a trial stage of a long step may not, and Monod uptake has a
        // pole at N = −k_N. Without the clamp such a stage returns NaN, and Commons Math accepts
        // a step whose error estimate is NaN; with it the estimate is large and the step is cut.
        double available = n > 0.0 ? n : 0.0;
        double growth = maxGrowth * available / (nutrientHalfSaturation + available);
        double grazingRate = grazing.rate(maxGrazing, grazingHalfSaturation, p);
        double grazingPerP = grazing.ratePerPrey(maxGrazing, grazingHalfSaturation, p);
        // Each flux is written out in the equation it enters (rather than dN = −dP − dZ), so
        // that the conservation test checks the bookkeeping instead of assuming it.
        yDot[0] = -growth * p + (1.0 - assimilation) * grazingRate * z + phytoplanktonMortality * p
                + zooplanktonMortality * z;
        yDot[1] = growth - grazingPerP * z - phytoplanktonMortality;
        yDot[2] = assimilation * grazingRate - zooplanktonMortality;
    }

    /** The integrated state {@code (N, ln P, ln Z)} of a state {@code (N, P, Z)}; P and Z must be positive. */
    public static double[] toIntegrated(double nutrient, double phytoplankton, double zooplankton) {
        return new double[] {nutrient, StrictMath.log(phytoplankton), StrictMath.log(zooplankton)};
    }

    @Override
    public String toString() {
        return "npz(" + grazing.settingName() + ", mu_max=" + maxGrowth + ", k_n=" + nutrientHalfSaturation
                + ", g_max=" + maxGrazing + ", k_p=" + grazingHalfSaturation + ", m_p=" + phytoplanktonMortality
                + ", gamma=" + assimilation + ", m_z=" + zooplanktonMortality + ")";
    }
}
