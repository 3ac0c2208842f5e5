package org.skerry.engine.model.plankton;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.UnivariateDistribution;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.PriorSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds a {@link PlanktonModel}, the nutrient–phytoplankton–zooplankton model of Franks,
 * Wroblewski &amp; Flierl (1986, Marine Biology 91) with saturating or sigmoidal grazing
 * (Holling 1959), from settings and the data columns bound to roles {@code day} and
 * {@code chlorophyll}. Each calibrated parameter's prior is read from {@code prior.<name>} with
 * {@link PriorSettings}, or else is the default that {@link #settings()} lists.
 */
public final class PlanktonFactory implements ModelFactory {

    /** The name a run file selects this model by. */
    public static final String NAME = "plankton-npz";

    static final String GRAZING = "grazing";
    static final String PRIOR = "prior";
    static final String ASSIMILATION = "assimilation";
    static final String ZOOPLANKTON_MORTALITY = "zooplankton-mortality";
    static final String INITIAL_NUTRIENT = "initial.nutrient";
    static final String INITIAL_PHYTOPLANKTON = "initial.phytoplankton";
    static final String INITIAL_ZOOPLANKTON = "initial.zooplankton";
    static final String INITIAL_DAY = "initial.day";
    static final String CHLOROPHYLL_PER_NITROGEN = "chlorophyll-per-nitrogen";

    /** The data role of the observation days. */
    public static final String DAY = "day";
    /** The data role of the observed chlorophyll-a. */
    public static final String CHLOROPHYLL = "chlorophyll";

    @Override
    public String name() {
        return NAME;
    }

    @Override
    public String description() {
        return "nutrient-phytoplankton-zooplankton ODE fitted to log-normal chlorophyll-a, saturating or sigmoidal grazing";
    }

    @Override
    public List<SettingDescription> settings() {
        List<SettingDescription> list = new ArrayList<>();
        list.add(SettingDescription.required(GRAZING,
                "grazing response: saturating (Holling type II) or sigmoidal (Holling type III)"));
        for (int i = 0; i < PlanktonModel.PARAMETER_NAMES.size(); i++) {
            list.add(SettingDescription.optional(PRIOR + "." + PlanktonModel.PARAMETER_NAMES.get(i),
                    PlanktonPriors.meaning(i), PlanktonPriors.settingText(i)));
        }
        list.add(SettingDescription.optional(ASSIMILATION,
                "gamma, fraction of grazed nitrogen the zooplankton keep, in (0, 1]",
                text(PlanktonConstants.DEFAULT_ASSIMILATION)));
        list.add(SettingDescription.optional(ZOOPLANKTON_MORTALITY, "m_z, zooplankton mortality (d^-1)",
                text(PlanktonConstants.DEFAULT_ZOOPLANKTON_MORTALITY)));
        list.add(SettingDescription.optional(INITIAL_NUTRIENT, "N0, nutrient at the initial day (mmol N m^-3)",
                text(PlanktonConstants.DEFAULT_INITIAL_NUTRIENT)));
        list.add(SettingDescription.optional(INITIAL_PHYTOPLANKTON,
                "P0, phytoplankton at the initial day (mmol N m^-3), > 0",
                text(PlanktonConstants.DEFAULT_INITIAL_PHYTOPLANKTON)));
        list.add(SettingDescription.optional(INITIAL_ZOOPLANKTON, "Z0, zooplankton at the initial day (mmol N m^-3)",
                text(PlanktonConstants.DEFAULT_INITIAL_ZOOPLANKTON)));
        list.add(SettingDescription.optional(INITIAL_DAY, "the day the initial state holds; no observation before it",
                text(PlanktonConstants.DEFAULT_INITIAL_DAY)));
        list.add(SettingDescription.optional(CHLOROPHYLL_PER_NITROGEN,
                "mg chlorophyll-a per mmol N of phytoplankton",
                text(PlanktonConstants.DEFAULT_CHLOROPHYLL_PER_NITROGEN)));
        return List.copyOf(list);
    }

    @Override
    public List<SettingDescription> dataRoles() {
        return List.of(SettingDescription.required(DAY, "observation day, strictly increasing"),
                SettingDescription.required(CHLOROPHYLL, "observed chlorophyll-a (mg m^-3), > 0"));
    }

    @Override
    public Model create(ModelSettings settings) {
        GrazingResponse grazing;
        try {
            grazing = GrazingResponse.fromSettingName(settings.getString(GRAZING));
        } catch (IllegalArgumentException e) {
            if (!settings.has(GRAZING)) {
                throw e;
            }
            throw new IllegalArgumentException(settings.where(GRAZING) + ": " + e.getMessage(), e);
        }
        IndependentPrior prior = priors(settings);
        double assimilation = settings.getDouble(ASSIMILATION, PlanktonConstants.DEFAULT_ASSIMILATION);
        if (!(assimilation > 0.0 && assimilation <= 1.0)) {
            throw new IllegalArgumentException(settings.where(ASSIMILATION) + ": must be in (0, 1], was " + assimilation);
        }
        PlanktonConstants constants = new PlanktonConstants(assimilation,
                nonNegative(settings, ZOOPLANKTON_MORTALITY, PlanktonConstants.DEFAULT_ZOOPLANKTON_MORTALITY),
                nonNegative(settings, INITIAL_NUTRIENT, PlanktonConstants.DEFAULT_INITIAL_NUTRIENT),
                positive(settings, INITIAL_PHYTOPLANKTON, PlanktonConstants.DEFAULT_INITIAL_PHYTOPLANKTON),
                nonNegative(settings, INITIAL_ZOOPLANKTON, PlanktonConstants.DEFAULT_INITIAL_ZOOPLANKTON),
                positive(settings, CHLOROPHYLL_PER_NITROGEN, PlanktonConstants.DEFAULT_CHLOROPHYLL_PER_NITROGEN),
                finite(settings, INITIAL_DAY, PlanktonConstants.DEFAULT_INITIAL_DAY));
        return PlanktonModel.of(grazing, constants, prior, settings.column(DAY), settings.column(CHLOROPHYLL));
    }

    private static IndependentPrior priors(ModelSettings settings) {
        List<String> names = PlanktonModel.PARAMETER_NAMES;
        if (settings.has(PRIOR)) {
            ModelSettings given = settings.at(PRIOR);
            for (String key : given.keys()) {
                if (!names.contains(key)) {
                    throw new IllegalArgumentException(given.where(key) + ": '" + key
                            + "' is not a parameter of " + NAME + "; parameters: " + names);
                }
            }
        }
        List<UnivariateDistribution> marginals = new ArrayList<>();
        for (int i = 0; i < names.size(); i++) {
            String key = PRIOR + "." + names.get(i);
            UnivariateDistribution marginal = settings.has(key)
                    ? PriorSettings.distribution(settings, key) : PlanktonPriors.marginal(i);
            try {
                PlanktonModel.requirePositiveSupport(names.get(i), marginal);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(settings.where(key) + ": " + e.getMessage(), e);
            }
            marginals.add(marginal);
        }
        return IndependentPrior.of(marginals);
    }

    private static double finite(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be finite, was " + value);
        }
        return value;
    }

    private static double nonNegative(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!(value >= 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be finite and >= 0, was " + value);
        }
        return value;
    }

    private static double positive(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!(value > 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be finite and > 0, was " + value);
        }
        return value;
    }

    private static String text(double value) {
        return Double.toString(value);
    }
}
