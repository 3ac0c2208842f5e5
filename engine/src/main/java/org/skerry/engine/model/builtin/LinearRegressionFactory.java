package org.skerry.engine.model.builtin;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds a {@link LinearRegressionModel} from settings: the response is the column bound to role
 * {@code y}, the predictors the columns bound to the roles listed in {@code predictors}, with an
 * optional intercept column of ones first. The prior on the weights is {@code N(m·1, s²I)}.
 */
public final class LinearRegressionFactory implements ModelFactory {

    /** The name of the intercept weight. */
    public static final String INTERCEPT = "intercept";

    @Override
    public String name() {
        return "linear-regression";
    }

    @Override
    public String description() {
        return "linear regression with known noise sd, normal prior on the weights (closed-form evidence)";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.required("predictors", "list of data roles used as predictors"),
                SettingDescription.optional(INTERCEPT, "whether to add an intercept weight", "true"),
                SettingDescription.optional("sigma", "known noise standard deviation", "1"),
                SettingDescription.optional("prior.mean", "prior mean of every weight", "0"),
                SettingDescription.optional("prior.sd", "prior standard deviation of every weight", "10"));
    }

    @Override
    public List<SettingDescription> dataRoles() {
        return List.of(SettingDescription.required("y", "the response"),
                SettingDescription.required("(each name in predictors)", "a predictor"));
    }

    @Override
    public Model create(ModelSettings settings) {
        List<String> predictors = settings.getStrings("predictors");
        boolean intercept = settings.getBoolean(INTERCEPT, true);
        List<String> names = new ArrayList<>();
        if (intercept) {
            names.add(INTERCEPT);
        }
        names.addAll(predictors);
        if (names.isEmpty()) {
            throw new IllegalArgumentException(settings.where("predictors")
                    + ": need at least one predictor or an intercept");
        }
        List<String> roles = new ArrayList<>();
        roles.add("y");
        roles.addAll(predictors);
        double[][] data = Data.rows(settings, roles);
        int n = data.length;
        int p = names.size();
        double[] y = new double[n];
        double[][] x = new double[n][p];
        int offset = intercept ? 1 : 0;
        for (int i = 0; i < n; i++) {
            y[i] = data[i][0];
            if (intercept) {
                x[i][0] = 1.0;
            }
            System.arraycopy(data[i], 1, x[i], offset, predictors.size());
        }
        double sigma = settings.getPositive("sigma", 1.0);
        double mean = settings.getDouble("prior.mean", 0.0);
        double sd = settings.getPositive("prior.sd", 10.0);
        double[] m0 = new double[p];
        Arrays.fill(m0, mean);
        double[][] s0 = new double[p][p];
        for (int j = 0; j < p; j++) {
            s0[j][j] = sd * sd;
        }
        return LinearRegressionModel.of(x, y, sigma, MultivariateNormalPrior.of(m0, s0), names);
    }
}
