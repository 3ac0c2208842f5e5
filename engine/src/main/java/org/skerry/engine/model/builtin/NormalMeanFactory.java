package org.skerry.engine.model.builtin;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds a {@link NormalMeanModel} from settings. The data are the column bound to role
 * {@code y} (one dimension) or the columns bound to {@code y1, y2, …} (as many dimensions as
 * there are consecutive roles).
 */
public final class NormalMeanFactory implements ModelFactory {

    @Override
    public String name() {
        return "normal-mean";
    }

    @Override
    public String description() {
        return "mean of normal observations with known sd, conjugate normal prior (closed-form evidence)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.optional("sigma", "known standard deviation of each observation", "1"),
                SettingDescription.optional("prior.mean", "prior mean of every coordinate of mu", "0"),
                SettingDescription.optional("prior.sd", "prior standard deviation of every coordinate of mu", "10"));
    }

    @Override
    public List<SettingDescription> dataRoles() {
        return List.of(SettingDescription.required("y", "observations, when there is one dimension"),
                SettingDescription.required("y1, y2, ...", "observations, one role per dimension, instead of y"));
    }

    @Override
    public Model create(ModelSettings settings) {
        List<String> roles = new ArrayList<>();
        if (settings.hasColumn("y")) {
            if (settings.hasColumn("y1")) {
                throw new IllegalArgumentException("normal-mean: bind data to role 'y' or to 'y1', 'y2', ..."
                        + ", not both; bound roles: " + settings.columnRoles());
            }
            roles.add("y");
        } else {
            for (int k = 1; settings.hasColumn("y" + k); k++) {
                roles.add("y" + k);
            }
            if (roles.isEmpty()) {
                throw new IllegalArgumentException("normal-mean needs data bound to role 'y' or to 'y1', 'y2', ..."
                        + "; bound roles: " + settings.columnRoles());
            }
        }
        double[][] rows = Data.rows(settings, roles);
        return NormalMeanModel.of(rows, settings.getPositive("sigma", 1.0),
                settings.getDouble("prior.mean", 0.0), settings.getPositive("prior.sd", 10.0));
    }
}
