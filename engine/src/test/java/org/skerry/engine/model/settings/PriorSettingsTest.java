package org.skerry.engine.model.settings;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.skerry.engine.model.settings.ModelSettingsTest.assertMessage;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.prior.Beta;
import org.skerry.engine.model.prior.Exponential;
import org.skerry.engine.model.prior.Gamma;
import org.skerry.engine.model.prior.HalfNormal;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.LogNormal;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.prior.Uniform;

/** {@link PriorSettings}: every distribution name, and refusals that say where. */
class PriorSettingsTest {

    private static ModelSettings prior(Map<String, ?> spec) {
        return ModelSettings.builder().origin("run.conf").set("prior.x", spec).build();
    }

    @Test
    @DisplayName("each distribution name gives the distribution with the given parameters")
    void allDistributions() {
        assertEquals(Normal.of(0, 10), read(Map.of("distribution", "normal", "mean", 0, "sd", 10)));
        assertEquals(LogNormal.of(1, 0.5), read(Map.of("distribution", "lognormal", "meanlog", 1, "sdlog", 0.5)));
        assertEquals(Uniform.of(-6, 6), read(Map.of("distribution", "uniform", "lower", -6, "upper", 6)));
        assertEquals(Gamma.of(2, 3), read(Map.of("distribution", "gamma", "shape", 2, "rate", 3)));
        assertEquals(Beta.of(0.5, 2), read(Map.of("distribution", "beta", "a", 0.5, "b", 2)));
        assertEquals(HalfNormal.of(4), read(Map.of("distribution", "half-normal", "sd", 4)));
        assertEquals(Exponential.of(0.1), read(Map.of("distribution", "exponential", "rate", "0.1")));
    }

    private static Object read(Map<String, ?> spec) {
        return PriorSettings.distribution(prior(spec), "prior.x");
    }

    @Test
    @DisplayName("an independent prior reads one entry per parameter name, in order")
    void independent() {
        ModelSettings s = ModelSettings.builder()
                .set("prior.a", Map.of("distribution", "normal", "mean", 1, "sd", 2))
                .set("prior.b", Map.of("distribution", "exponential", "rate", 3))
                .build();
        assertEquals(IndependentPrior.of(Exponential.of(3), Normal.of(1, 2)),
                PriorSettings.independent(s, "prior", List.of("b", "a")));
    }

    @Test
    @DisplayName("unknown distribution, missing, mistyped, out-of-range or extra keys fail with where() and the value")
    void refusals() {
        assertMessage(() -> read(Map.of("distribution", "cauchy")), "run.conf, prior.x.distribution", "'cauchy'");
        assertMessage(() -> read(Map.of("distribution", "normal", "mean", 0)), "run.conf, prior.x.sd", "missing");
        assertMessage(() -> read(Map.of("distribution", "normal", "mean", "zero", "sd", 1)),
                "run.conf: prior.x.mean", "\"zero\"");
        assertMessage(() -> read(Map.of("distribution", "normal", "mean", 0, "sd", -1)), "run.conf, prior.x", "-1.0");
        assertMessage(() -> read(Map.of("distribution", "uniform", "lower", 2, "upper", 1)), "run.conf, prior.x",
                "lower=2.0");
        assertMessage(() -> read(Map.of("distribution", "normal", "mean", 0, "sd", 1, "sigma", 1)),
                "run.conf, prior.x.sigma", "[mean, sd]");
        assertMessage(() -> read(Map.of("mean", 0)), "run.conf, prior.x.distribution", "missing");
        assertMessage(() -> PriorSettings.distribution(prior(Map.of()), "prior.y"), "run.conf, prior.y", "missing");
        assertMessage(() -> PriorSettings.distribution(
                ModelSettings.builder().origin("run.conf").set("prior.x", 3).build(), "prior.x"),
                "run.conf: prior.x = 3", "an object");
    }
}
