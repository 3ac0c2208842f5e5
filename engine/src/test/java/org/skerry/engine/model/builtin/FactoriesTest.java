package org.skerry.engine.model.builtin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.skerry.engine.model.builtin.BuiltinModelsTest.assertMessage;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.SettingDescription;
import org.skerry.engine.reference.BetaBinomialExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * The built-in factories as found by {@link java.util.ServiceLoader}: names, listed settings, and
 * models built from settings equal to the ones built directly.
 */
class FactoriesTest {

    private static final ModelCatalog CATALOG = ModelCatalog.load();

    @Test
    @DisplayName("ServiceLoader finds the built-in factories, each describing its settings")
    void catalog() {
        List<String> names = CATALOG.factories().stream().map(ModelFactory::name).toList();
        assertEquals(List.of("beta-binomial", "costly-normal", "gaussian-mixture", "gaussian-shells", "linear-regression",
                "mixture-toy-simulator", "normal-mean", "normal-mean-simulator", "plankton-npz", "poisson-sum-simulator",
                "zooplankton-ricker"), names);
        for (ModelFactory factory : CATALOG.factories()) {
            assertFalse(factory.description().isBlank());
            // The Ricker simulator has no settings, only its data role: each factory describes something.
            assertFalse(factory.settings().isEmpty() && factory.dataRoles().isEmpty(), factory.name());
        }
        assertMessage(() -> CATALOG.get("nope"), "'nope'", "normal-mean");
    }

    @Test
    @DisplayName("defaults listed by a factory are the values it uses (gaussian-shells)")
    void listedDefaultsAreUsed() {
        ModelFactory factory = CATALOG.get("gaussian-shells");
        GaussianShellsModel model = (GaussianShellsModel) factory.create(ModelSettings.empty());
        for (SettingDescription s : factory.settings()) {
            double listed = Double.parseDouble(s.defaultValue());
            double used;
            switch (s.key()) {
                case "dimension": used = model.dimension(); break;
                case "radius": used = model.radius(); break;
                case "width": used = model.width(); break;
                case "centre": used = model.centre(); break;
                case "bound": used = model.bound(); break;
                default: throw new AssertionError(s.key());
            }
            assertEquals(listed, used, s.key());
        }
    }

    @Test
    @DisplayName("normal-mean from settings: columns y1, y2 give the same likelihood as the direct model")
    void normalMean() {
        double[][] rows = SyntheticData.normalRows(90L, 10, new double[] {1, 2}, 0.5);
        ModelSettings settings = ModelSettings.builder()
                .set("sigma", 0.5).set("prior.mean", 1).set("prior.sd", 3)
                .column("y1", SyntheticData.column(rows, 0)).column("y2", SyntheticData.column(rows, 1))
                .build();
        Model fromSettings = CATALOG.get("normal-mean").create(settings);
        Model direct = NormalMeanModel.of(rows, 0.5, 1, 3);
        double[] mu = {0.9, 2.1};
        assertEquals(direct.logLikelihood(mu, null), fromSettings.logLikelihood(mu, null));
        assertEquals(direct.prior().logDensity(mu), fromSettings.prior().logDensity(mu));
        assertMessage(() -> CATALOG.get("normal-mean").create(ModelSettings.builder().column("z", new double[] {1}).build()),
                "'y'", "[z]");
        assertMessage(() -> CATALOG.get("normal-mean").create(ModelSettings.builder().origin("run.conf")
                .set("sigma", 0).column("y", new double[] {1}).build()), "run.conf, sigma", "0.0");
    }

    @Test
    @DisplayName("linear-regression from settings: intercept column of ones, then the predictors")
    void linearRegression() {
        double[] x1 = {0.1, 0.5, 0.9, 1.3};
        double[] y = {1.0, 1.8, 3.1, 3.9};
        ModelSettings settings = ModelSettings.builder()
                .set("predictors", List.of("x1")).set("sigma", 0.4)
                .column("y", y).column("x1", x1).build();
        LinearRegressionModel model = (LinearRegressionModel) CATALOG.get("linear-regression").create(settings);
        assertEquals(List.of("intercept", "x1"), model.parameters().names());
        double[][] design = model.design();
        for (int i = 0; i < x1.length; i++) {
            assertEquals(1.0, design[i][0]);
            assertEquals(x1[i], design[i][1]);
        }
        assertMessage(() -> CATALOG.get("linear-regression").create(ModelSettings.builder()
                .set("predictors", List.of("x2")).column("y", y).build()), "'x2'", "[y]");
    }

    @Test
    @DisplayName("beta-binomial from settings or from data columns: evidence pieces match BetaBinomialExact")
    void betaBinomial() {
        Model fromSettings = CATALOG.get("beta-binomial").create(ModelSettings.builder()
                .set("successes", 4).set("trials", 9).set("prior.a", 2).build());
        Model fromData = CATALOG.get("beta-binomial").create(ModelSettings.builder()
                .column("successes", new double[] {1, 3}).column("trials", new double[] {4, 5}).build());
        assertInstanceOf(BetaBinomialModel.class, fromSettings);
        assertEquals(4, ((BetaBinomialModel) fromData).totalSuccesses());
        assertEquals(5, ((BetaBinomialModel) fromData).totalFailures());
        // At p where prior x likelihood can be compared with the posterior: log p(y) = log prior +
        // log lik − log posterior (BDA3 §2.4), identically in p.
        BetaBinomialExact exact = new BetaBinomialExact(4, 9, 2, 1);
        for (double p : new double[] {0.2, 0.5, 0.8}) {
            double logJoint = fromSettings.prior().logDensity(new double[] {p})
                    + fromSettings.logLikelihood(new double[] {p}, null);
            assertEquals(exact.logEvidence(), logJoint - exact.posterior().logDensity(p), 1e-12);
        }
        assertMessage(() -> CATALOG.get("beta-binomial").create(ModelSettings.builder().origin("run.conf")
                .set("successes", 10).set("trials", 9).build()), "run.conf, successes", "10");
        assertMessage(() -> CATALOG.get("beta-binomial").create(ModelSettings.builder().origin("run.conf")
                .set("successes", 1).build()), "run.conf, trials", "missing");
        assertMessage(() -> CATALOG.get("beta-binomial").create(ModelSettings.builder()
                .column("successes", new double[] {1.5}).column("trials", new double[] {4}).build()),
                "'successes'", "1.5");
    }

    @Test
    @DisplayName("gaussian-mixture from settings uses the given dimension, weight and locations")
    void mixture() {
        GaussianMixtureLikelihoodModel model = (GaussianMixtureLikelihoodModel) CATALOG.get("gaussian-mixture")
                .create(ModelSettings.builder().set("dimension", 3).set("weight", 0.6).build());
        assertEquals(3, model.dimension());
        assertEquals(0.6, model.weight());
        assertTrue(model.parameters().support(2).contains(9.9));
        assertMessage(() -> CATALOG.get("gaussian-mixture").create(ModelSettings.builder().origin("run.conf")
                .set("weight", 1).build()), "run.conf, weight", "1.0");
    }
}
