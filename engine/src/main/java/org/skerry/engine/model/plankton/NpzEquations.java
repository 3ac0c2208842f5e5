package org.skerry.engine.model.plankton;

import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;

/**
 * The right-hand side of a nutrient–phytoplankton–zooplankton model in the form of Franks,
 * Wroblewski &amp; Flierl (1986), Marine Biology 91, 121–129, with state {@code (N, P, Z)} in
 * mmol N m⁻³ and time in days:
 * <pre>
 *   dN/dt = −μ·N/(k_N + N)·P + (1 − γ)·G(P)·Z + m_P·P + m_Z·Z
 *   dP/dt =  μ·N/(k_N + N)·P − G(P)·Z − m_P·P
 *   dZ/dt =  γ·G(P)·Z − m_Z·Z
 * </pre>
 * Nutrient uptake is Monod's (1949, Annual Review of Microbiology 3, 371–394); the grazing
 * response {@code G} is a {@link GrazingResponse}. Every loss returns to the nutrient pool, so
 * {@code N + P + Z} is conserved. Immutable.
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
        double p = y[1];
        double z = y[2];
        double uptake = maxGrowth * n / (nutrientHalfSaturation + n) * p;
        double grazed = grazing.rate(maxGrazing, grazingHalfSaturation, p) * z;
        double phytoplanktonDeath = phytoplanktonMortality * p;
        double zooplanktonDeath = zooplanktonMortality * z;
        // Each flux is written out in every equation it enters (rather than dN = −dP − dZ), so
        // that the conservation test checks the bookkeeping instead of assuming it.
        yDot[0] = -uptake + (1.0 - assimilation) * grazed + phytoplanktonDeath + zooplanktonDeath;
        yDot[1] = uptake - grazed - phytoplanktonDeath;
        yDot[2] = assimilation * grazed - zooplanktonDeath;
    }

    @Override
    public String toString() {
        return "npz(" + grazing.settingName() + ", mu_max=" + maxGrowth + ", k_n=" + nutrientHalfSaturation
                + ", g_max=" + maxGrazing + ", k_p=" + grazingHalfSaturation + ", m_p=" + phytoplanktonMortality
                + ", gamma=" + assimilation + ", m_z=" + zooplanktonMortality + ")";
    }
}
