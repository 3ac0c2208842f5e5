package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/** Builds a {@link GaussianMixtureLikelihoodModel} with component means on the diagonal. */
public final class GaussianMixtureFactory implements ModelFactory {

    @Override
    public String name() {
        return "gaussian-mixture";
    }

    @Override
    public String description() {
        return "bimodal test: normalised two-component normal likelihood, uniform prior on a box (known evidence)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.optional("dimension", "number of parameters", "2"),
                SettingDescription.optional("weight", "share of the first component, in (0, 1)", "0.3"),
                SettingDescription.optional("location1", "first component mean on every axis", "-2"),
                SettingDescription.optional("location2", "second component mean on every axis", "2"),
                SettingDescription.optional("sd", "standard deviation of both components", "0.5"),
                SettingDescription.optional("bound", "prior box is [-bound, bound] on every axis", "10"));
    }

    @Override
    public Model create(ModelSettings settings) {
        return GaussianMixtureLikelihoodModel.of(
                settings.getInt("dimension", 2, 1),
                settings.getFraction("weight", 0.3),
                settings.getDouble("location1", -2.0),
                settings.getDouble("location2", 2.0),
                settings.getPositive("sd", 0.5),
                settings.getPositive("bound", 10.0));
    }
}
