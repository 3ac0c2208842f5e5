package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/** Builds a {@link GaussianShellsModel}; the defaults are the published problem. */
public final class GaussianShellsFactory implements ModelFactory {

    @Override
    public String name() {
        return "gaussian-shells";
    }

    @Override
    public String description() {
        return "two thin Gaussian shells, uniform prior on a box (Feroz, Hobson & Bridges 2009)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.optional("dimension", "number of parameters", "2"),
                SettingDescription.optional("radius", "shell radius", "2"),
                SettingDescription.optional("width", "shell radial standard deviation", "0.1"),
                SettingDescription.optional("centre", "shells centred at +-centre on the first axis", "3.5"),
                SettingDescription.optional("bound", "prior box is [-bound, bound] on every axis", "6"));
    }

    @Override
    public Model create(ModelSettings settings) {
        return GaussianShellsModel.of(
                settings.getInt("dimension", 2, 1),
                settings.getPositive("radius", 2.0),
                settings.getPositive("width", 0.1),
                settings.getDouble("centre", 3.5),
                settings.getPositive("bound", 6.0));
    }
}
