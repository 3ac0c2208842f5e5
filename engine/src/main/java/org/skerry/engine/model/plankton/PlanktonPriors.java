package org.skerry.engine.model.plankton;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.LogNormal;

/**
 * The default prior of each calibrated parameter of a {@link PlanktonModel}: independent
 * log-normals whose medians sit in the ranges commonly used for lake and coastal NPZ models
 * (common practice, from memory; Franks, Wroblewski &amp; Flierl 1986, Marine Biology 91, use
 * values of the same order) and whose spread, a factor of about 1.8 either way at 95 %, leaves
 * the data to decide within those ranges. Also the text a run file would write for each, so the
 * listing of settings shows the very defaults that are applied.
 */
public final class PlanktonPriors {

    private static final List<String> MEANINGS = List.of(
            "prior of mu_max, the maximum phytoplankton growth rate (d^-1)",
            "prior of k_n, the nutrient half-saturation constant of uptake (mmol N m^-3)",
            "prior of g_max, the maximum zooplankton grazing rate (d^-1)",
            "prior of k_p, the phytoplankton half-saturation constant of grazing (mmol N m^-3)",
            "prior of m_p, the phytoplankton mortality (d^-1)",
            "prior of sigma, the standard deviation of log chlorophyll-a");

    // Medians 1.0, 0.50, 1.0, 1.0, 0.10 and 0.20; meanlogs rounded so the text stays short.
    private static final List<LogNormal> DEFAULTS = List.of(
            LogNormal.of(0.0, 0.3),
            LogNormal.of(-0.7, 0.4),
            LogNormal.of(0.0, 0.3),
            LogNormal.of(0.0, 0.3),
            LogNormal.of(-2.3, 0.3),
            LogNormal.of(-1.6, 0.3));

    private PlanktonPriors() {
    }

    /** The default prior of every parameter, in {@link PlanktonModel#PARAMETER_NAMES} order. */
    public static IndependentPrior defaults() {
        return IndependentPrior.of(new ArrayList<>(DEFAULTS));
    }

    /** The default prior of parameter {@code index}. */
    public static LogNormal marginal(int index) {
        return DEFAULTS.get(index);
    }

    /** What the prior of parameter {@code index} is about, for the settings listing. */
    public static String meaning(int index) {
        return MEANINGS.get(index);
    }

    /**
     * The default prior of parameter {@code index} as a run file writes it, for example
     * {@code { distribution = lognormal, meanlog = 0.0, sdlog = 0.3 }} (the keys of
     * {@link org.skerry.engine.model.settings.PriorSettings}).
     */
    public static String settingText(int index) {
        LogNormal prior = DEFAULTS.get(index);
        return "{ distribution = lognormal, meanlog = " + prior.meanlog() + ", sdlog = " + prior.sdlog() + " }";
    }
}
