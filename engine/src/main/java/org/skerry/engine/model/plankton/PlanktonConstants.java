package org.skerry.engine.model.plankton;

/**
 * The fixed, uncalibrated quantities of a {@link PlanktonModel}: the zooplankton's assimilation
 * efficiency γ and mortality m_Z, the initial state (N₀, P₀, Z₀) at the initial day, and the
 * chlorophyll-to-nitrogen ratio that turns phytoplankton nitrogen into measured chlorophyll-a.
 * The structure follows Franks, Wroblewski &amp; Flierl (1986), Marine Biology 91, 121–129.
 *
 * @param assimilation           γ, fraction of grazed nitrogen kept by the grazers, in (0, 1]
 * @param zooplanktonMortality   m_Z, d⁻¹, finite and {@code >= 0}
 * @param initialNutrient        N₀, mmol N m⁻³, finite and {@code >= 0}
 * @param initialPhytoplankton   P₀, mmol N m⁻³, finite and {@code > 0}
 * @param initialZooplankton     Z₀, mmol N m⁻³, finite and {@code > 0} (the equations are
 *                               integrated in ln Z)
 * @param chlorophyllPerNitrogen mg chlorophyll-a per mmol N of phytoplankton, finite and {@code > 0}
 * @param initialDay             the day the initial state holds, finite
 */
public record PlanktonConstants(double assimilation, double zooplanktonMortality, double initialNutrient,
        double initialPhytoplankton, double initialZooplankton, double chlorophyllPerNitrogen,
        double initialDay) {

    /**
     * Default assimilation efficiency γ; of the order used in NPZ models (common practice, not
     * from a particular table).
     */
    public static final double DEFAULT_ASSIMILATION = 0.3;
    /** Default zooplankton mortality m_Z, d⁻¹ (common practice, not from a particular table). */
    public static final double DEFAULT_ZOOPLANKTON_MORTALITY = 0.15;
    /** Default N₀, mmol N m⁻³: a spring nutrient stock for a moderately rich lake (invented). */
    public static final double DEFAULT_INITIAL_NUTRIENT = 4.5;
    /** Default P₀, mmol N m⁻³ (invented). */
    public static final double DEFAULT_INITIAL_PHYTOPLANKTON = 0.1;
    /** Default Z₀, mmol N m⁻³ (invented). */
    public static final double DEFAULT_INITIAL_ZOOPLANKTON = 0.1;
    /**
     * Default mg chlorophyll-a per mmol N: the Redfield C:N of 106:16 (Redfield 1934) times
     * 12 mg C per mmol C, over a carbon-to-chlorophyll ratio of 50 (common practice):
     * 6.625·12/50 = 1.59.
     */
    public static final double DEFAULT_CHLOROPHYLL_PER_NITROGEN = 1.59;
    /** Default initial day. */
    public static final double DEFAULT_INITIAL_DAY = 0.0;

    /** @throws IllegalArgumentException naming the constant and its value if one is out of range */
    public PlanktonConstants {
        if (!(assimilation > 0.0 && assimilation <= 1.0)) {
            throw new IllegalArgumentException("assimilation must be in (0, 1], was " + assimilation);
        }
        requireNonNegative("zooplankton-mortality", zooplanktonMortality);
        requireNonNegative("initial.nutrient", initialNutrient);
        if (!(initialPhytoplankton > 0.0 && initialPhytoplankton < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("initial.phytoplankton must be finite and > 0, was "
                    + initialPhytoplankton);
        }
        if (!(initialZooplankton > 0.0 && initialZooplankton < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("initial.zooplankton must be finite and > 0, was "
                    + initialZooplankton);
        }
        if (!(chlorophyllPerNitrogen > 0.0 && chlorophyllPerNitrogen < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("chlorophyll-per-nitrogen must be finite and > 0, was "
                    + chlorophyllPerNitrogen);
        }
        if (!Double.isFinite(initialDay)) {
            throw new IllegalArgumentException("initial.day must be finite, was " + initialDay);
        }
    }

    /** All defaults. */
    public static PlanktonConstants defaults() {
        return new PlanktonConstants(DEFAULT_ASSIMILATION, DEFAULT_ZOOPLANKTON_MORTALITY, DEFAULT_INITIAL_NUTRIENT,
                DEFAULT_INITIAL_PHYTOPLANKTON, DEFAULT_INITIAL_ZOOPLANKTON, DEFAULT_CHLOROPHYLL_PER_NITROGEN,
                DEFAULT_INITIAL_DAY);
    }

    /** These constants with another initial nutrient N₀. */
    public PlanktonConstants withInitialNutrient(double nutrient) {
        return new PlanktonConstants(assimilation, zooplanktonMortality, nutrient, initialPhytoplankton,
                initialZooplankton, chlorophyllPerNitrogen, initialDay);
    }

    /** The initial state (N₀, P₀, Z₀), a fresh array. */
    public double[] initialState() {
        return new double[] {initialNutrient, initialPhytoplankton, initialZooplankton};
    }

    private static void requireNonNegative(String name, double value) {
        if (!(value >= 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(name + " must be finite and >= 0, was " + value);
        }
    }
}
