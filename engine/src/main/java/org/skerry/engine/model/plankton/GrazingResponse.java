package org.skerry.engine.model.plankton;

import java.util.Locale;

/**
 * How the zooplankton grazing rate per grazer rises with phytoplankton: Holling's functional
 * responses of type II (saturating) and type III (sigmoidal); Holling (1959), The Canadian
 * Entomologist 91, 293–320 and 385–398.
 */
public enum GrazingResponse {

    /** {@code G(P) = g_max·P/(k_P + P)}: Holling type II. */
    SATURATING("saturating"),

    /** {@code G(P) = g_max·P²/(k_P² + P²)}: Holling type III. */
    SIGMOIDAL("sigmoidal");

    private final String settingName;

    GrazingResponse(String settingName) {
        this.settingName = settingName;
    }

    /** The name a run file uses. */
    public String settingName() {
        return settingName;
    }

    /**
     * The grazing rate per unit zooplankton at phytoplankton {@code p}, for maximum rate
     * {@code gMax} and half-saturation {@code kP}; both responses equal {@code gMax/2} at
     * {@code p = kP}.
     */
    public double rate(double gMax, double kP, double p) {
        if (this == SATURATING) {
            return gMax * p / (kP + p);
        }
        double p2 = p * p;
        return gMax * p2 / (kP * kP + p2);
    }

    /**
     * {@code G(P)/P}, written so that it stays finite as {@code p} goes to 0: {@code gMax/(kP + p)}
     * or {@code gMax·p/(kP² + p²)}.
     */
    public double ratePerPrey(double gMax, double kP, double p) {
        if (this == SATURATING) {
            return gMax / (kP + p);
        }
        return gMax * p / (kP * kP + p * p);
    }

    /**
     * The response named {@code name} (case-insensitive).
     *
     * @throws IllegalArgumentException naming the value and the known names
     */
    public static GrazingResponse fromSettingName(String name) {
        String wanted = name == null ? "" : name.trim().toLowerCase(Locale.ROOT);
        for (GrazingResponse response : values()) {
            if (response.settingName.equals(wanted)) {
                return response;
            }
        }
        throw new IllegalArgumentException("grazing must be 'saturating' or 'sigmoidal', was '" + name + "'");
    }
}
