package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/** Builds a {@link CostlyNormalModel}: no data file, every setting has a default. */
public final class CostlyNormalFactory implements ModelFactory {

    @Override
    public String name() {
        return "costly-normal";
    }

    @Override
    public String description() {
        return "synthetic: conjugate normal mean (closed-form evidence) with calibrated busy work per evaluation, "
                + "for scaling studies";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.optional("dimension", "number of parameters", "2"),
                SettingDescription.optional("cost-micros", "busy work per evaluation, microseconds of one idle core", "1000"),
                SettingDescription.optional("slow-fraction", "share of evaluations that are slow (stragglers), chosen "
                        + "from particle index and iteration", "0"),
                SettingDescription.optional("slow-factor", "how many times the cost a slow evaluation takes", "10"),
                SettingDescription.optional("observation", "observed value of every coordinate", "1"),
                SettingDescription.optional("sigma", "known observation standard deviation", "1"),
                SettingDescription.optional("prior.mean", "prior mean of every coordinate", "0"),
                SettingDescription.optional("prior.sd", "prior standard deviation of every coordinate", "3"));
    }

    @Override
    public Model create(ModelSettings settings) {
        double cost = settings.getDouble("cost-micros", 1000);
        if (!(cost >= 0) || Double.isInfinite(cost)) {
            throw new IllegalArgumentException(settings.where("cost-micros") + ": must be finite and >= 0, was " + cost);
        }
        double slowFraction = settings.getDouble("slow-fraction", 0);
        if (!(slowFraction >= 0 && slowFraction < 1)) {
            throw new IllegalArgumentException(settings.where("slow-fraction") + ": must be in [0, 1), was "
                    + slowFraction);
        }
        double slowFactor = settings.getDouble("slow-factor", 10);
        if (!(slowFactor >= 1) || Double.isInfinite(slowFactor)) {
            throw new IllegalArgumentException(settings.where("slow-factor") + ": must be finite and >= 1, was "
                    + slowFactor);
        }
        return CostlyNormalModel.of(settings.getInt("dimension", 2, 1), cost, slowFraction, slowFactor,
                settings.getDouble("observation", 1.0), settings.getPositive("sigma", 1.0),
                settings.getDouble("prior.mean", 0.0), settings.getPositive("prior.sd", 3.0));
    }
}
