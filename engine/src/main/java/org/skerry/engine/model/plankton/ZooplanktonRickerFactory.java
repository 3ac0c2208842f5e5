package org.skerry.engine.model.plankton;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/** Builds the demo's {@link ZooplanktonRicker} simulator from the tow counts bound to role {@code count}. */
public final class ZooplanktonRickerFactory implements ModelFactory {

    @Override
    public String name() {
        return "zooplankton-ricker";
    }

    @Override
    public String description() {
        return "simulator (for abc): weekly zooplankton tow counts, stochastic Ricker model with Poisson sampling "
                + "(the demo's, Lake Quellmar)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of();
    }

    @Override
    public List<SettingDescription> dataRoles() {
        return List.of(SettingDescription.required("count", "tow counts, one per week in time order"));
    }

    @Override
    public Model create(ModelSettings settings) {
        return ZooplanktonRicker.of(settings.column("count"));
    }
}
