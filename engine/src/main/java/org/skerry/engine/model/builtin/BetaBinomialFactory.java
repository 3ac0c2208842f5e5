package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds a {@link BetaBinomialModel} from settings: one count from {@code successes} and
 * {@code trials}, or, when those are not set, one count per row of the columns bound to roles
 * {@code successes} and {@code trials}.
 */
public final class BetaBinomialFactory implements ModelFactory {

    @Override
    public String name() {
        return "beta-binomial";
    }

    @Override
    public String description() {
        return "success probability of binomial counts, beta prior (closed-form evidence)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.optional("successes", "number of successes", "from data"),
                SettingDescription.optional("trials", "number of trials", "from data"),
                SettingDescription.optional("prior.a", "first shape of the beta prior", "1"),
                SettingDescription.optional("prior.b", "second shape of the beta prior", "1"));
    }

    @Override
    public List<SettingDescription> dataRoles() {
        return List.of(
                SettingDescription.optional("successes", "successes per row, when the setting is absent", "none"),
                SettingDescription.optional("trials", "trials per row, when the setting is absent", "none"));
    }

    @Override
    public Model create(ModelSettings settings) {
        double a = settings.getPositive("prior.a", 1.0);
        double b = settings.getPositive("prior.b", 1.0);
        if (settings.has("successes") || settings.has("trials")) {
            int k = settings.getInt("successes");
            int n = settings.getInt("trials");
            if (n < 0) {
                throw new IllegalArgumentException(settings.where("trials") + ": must be >= 0, was " + n);
            }
            if (k < 0 || k > n) {
                throw new IllegalArgumentException(settings.where("successes") + ": must be in [0, trials = "
                        + n + "], was " + k);
            }
            return BetaBinomialModel.of(k, n, a, b);
        }
        int[] k = Data.wholeNumbers(settings, "successes");
        int[] n = Data.wholeNumbers(settings, "trials");
        return BetaBinomialModel.of(k, n, a, b);
    }
}
