package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.skerry.engine.model.plankton.PlanktonModelTest.assertMessage;

import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.LogNormal;
import org.skerry.engine.model.prior.Uniform;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.SettingDescription;

/** The plankton-npz factory: found by name, its listed defaults are the ones applied, bad settings named. */
class PlanktonFactoryTest {

    private static final ModelFactory FACTORY = ModelCatalog.load().get(PlanktonFactory.NAME);
    private static final double[][] ROWS = QuellmarData.generate(QuellmarScenario.demoBuoy(), 3L, 10);

    private static ModelSettings.Builder withData() {
        double[] days = new double[ROWS.length];
        double[] chlorophyll = new double[ROWS.length];
        for (int j = 0; j < ROWS.length; j++) {
            days[j] = ROWS[j][0];
            chlorophyll[j] = ROWS[j][1];
        }
        return ModelSettings.builder().origin("run.conf").column("day", days).column("chlorophyll", chlorophyll);
    }

    @Test
    @DisplayName("ServiceLoader finds plankton-npz; each listed default is the value create() applies")
    void listedDefaultsAreUsed() {
        assertTrue(FACTORY instanceof PlanktonFactory);
        assertFalse(FACTORY.description().isBlank());
        PlanktonModel model = (PlanktonModel) FACTORY.create(withData().set("grazing", "sigmoidal").build());
        assertEquals(GrazingResponse.SIGMOIDAL, model.grazing());
        IndependentPrior prior = (IndependentPrior) model.prior();
        PlanktonConstants constants = model.dynamics().constants();
        Pattern lognormal = Pattern.compile(
                "\\{ distribution = lognormal, meanlog = (\\S+), sdlog = (\\S+) \\}");
        int priors = 0;
        for (SettingDescription s : FACTORY.settings()) {
            if (s.key().equals("grazing")) {
                assertTrue(s.isRequired());
                continue;
            }
            if (s.key().startsWith("prior.")) {
                int index = PlanktonModel.PARAMETER_NAMES.indexOf(s.key().substring("prior.".length()));
                Matcher m = lognormal.matcher(s.defaultValue());
                assertTrue(m.matches(), s.defaultValue());
                LogNormal used = (LogNormal) prior.marginal(index);
                assertEquals(Double.parseDouble(m.group(1)), used.meanlog(), 0.0, s.key());
                assertEquals(Double.parseDouble(m.group(2)), used.sdlog(), 0.0, s.key());
                priors++;
                continue;
            }
            double listed = Double.parseDouble(s.defaultValue());
            double used;
            switch (s.key()) {
                case "assimilation": used = constants.assimilation(); break;
                case "zooplankton-mortality": used = constants.zooplanktonMortality(); break;
                case "initial.nutrient": used = constants.initialNutrient(); break;
                case "initial.phytoplankton": used = constants.initialPhytoplankton(); break;
                case "initial.zooplankton": used = constants.initialZooplankton(); break;
                case "initial.day": used = constants.initialDay(); break;
                case "chlorophyll-per-nitrogen": used = constants.chlorophyllPerNitrogen(); break;
                default: throw new AssertionError(s.key());
            }
            assertEquals(listed, used, s.key());
        }
        assertEquals(PlanktonModel.PARAMETER_NAMES.size(), priors);
        assertEquals(2, FACTORY.dataRoles().size());
    }

    @Test
    @DisplayName("priors and constants given in settings replace the defaults; supports follow the prior")
    void settingsAreRead() {
        PlanktonModel model = (PlanktonModel) FACTORY.create(withData()
                .set("grazing", "saturating")
                .set("prior.k_n", Map.of("distribution", "uniform", "lower", 0.1, "upper", 2.0))
                .set("initial.nutrient", "5.5")
                .set("assimilation", 0.25)
                .build());
        assertEquals(GrazingResponse.SATURATING, model.grazing());
        assertEquals(Uniform.of(0.1, 2.0), ((IndependentPrior) model.prior()).marginal(PlanktonModel.K_N));
        assertEquals(Support.Kind.INTERVAL, model.parameters().support(PlanktonModel.K_N).kind());
        assertEquals(5.5, model.dynamics().constants().initialNutrient(), 0.0);
        assertEquals(0.25, model.dynamics().constants().assimilation(), 0.0);
        assertEquals(ROWS.length, model.days().length);
    }

    @Test
    @DisplayName("bad settings and data are refused with where they are and the bad value")
    void badSettings() {
        assertMessage(() -> FACTORY.create(withData().build()), "run.conf, grazing", "missing");
        assertMessage(() -> FACTORY.create(withData().set("grazing", "linear").build()),
                "run.conf, grazing", "'linear'");
        assertMessage(() -> FACTORY.create(withData().set("grazing", "sigmoidal")
                .set("prior.k_q", Map.of("distribution", "lognormal", "meanlog", 0, "sdlog", 1)).build()),
                "run.conf, prior.k_q", "k_q", "k_p");
        assertMessage(() -> FACTORY.create(withData().set("grazing", "sigmoidal")
                .set("prior.sigma", Map.of("distribution", "normal", "mean", 0.2, "sd", 0.1)).build()),
                "run.conf, prior.sigma", "(0, inf)");
        assertMessage(() -> FACTORY.create(withData().set("grazing", "sigmoidal").set("assimilation", 1.2).build()),
                "run.conf, assimilation", "1.2");
        assertMessage(() -> FACTORY.create(withData().set("grazing", "sigmoidal")
                .set("initial.phytoplankton", 0).build()), "run.conf, initial.phytoplankton", "0.0");
        assertMessage(() -> FACTORY.create(ModelSettings.builder().set("grazing", "sigmoidal")
                .column("day", new double[] {0, 7}).build()), "'chlorophyll'");
        assertMessage(() -> FACTORY.create(ModelSettings.builder().set("grazing", "sigmoidal")
                .column("day", new double[] {0, 7, 3}).column("chlorophyll", new double[] {1, 2, 3}).build()),
                "'day'", "row 2", "3.0");
    }
}
