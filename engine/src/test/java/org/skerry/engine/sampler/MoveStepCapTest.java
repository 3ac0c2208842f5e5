package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.calibration.CalibrationCase;
import org.skerry.engine.population.threads.ThreadPoolBackend;

/**
 * The adaptive moves keep their step count under the cap on targets where a fixed-scale random
 * walk stalls: a thin-shelled target (Gaussian shells, Feroz, Hobson &amp; Bridges 2009) and a
 * bimodal likelihood. The stay rule R = ⌈log c / log(1 − acceptance)⌉ (Drovandi &amp; Pettitt
 * 2011) hits the default cap of 20 below an acceptance of about 0.21; the criterion "at most 10 %
 * of iterations at the cap over 20 seeds" is ours.
 */
class MoveStepCapTest {

    @ParameterizedTest
    @Slow
    @ValueSource(strings = {"shells", "mixture"})
    @DisplayName("Gaussian shells D = 2 and the bimodal mixture: at most 10 % of iterations at the step cap over 20 seeds")
    void fewIterationsAtTheCap(String name) {
        CalibrationCase c = name.equals("shells") ? CalibrationCase.shells(2, 2000) : CalibrationCase.mixture(2000);
        int iterations = 0;
        int atCap = 0;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < 20; s++) {
                SamplerResult result = new SmcSampler(SamplerSettings.builder().particles(c.particles()).seed(40 + s)
                        .build()).run(c.model(), backend);
                iterations += result.stepCap().iterations();
                atCap += result.stepCap().iterationsAtCap();
            }
        }
        assertTrue(atCap <= 0.1 * iterations, atCap + " of " + iterations + " iterations at the cap");
    }

    @Test
    @DisplayName("a run that reaches the cap says so, with the setting to change")
    void capReported() {
        CalibrationCase c = CalibrationCase.shells(2, 500);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            SamplerResult result = new SmcSampler(SamplerSettings.builder().particles(c.particles()).seed(1).maxSteps(2)
                    .build()).run(c.model(), backend);
            assertEquals(result.stepCap().iterations(), result.stepCap().iterationsAtCap(),
                    "with a cap of 2 every iteration needs more");
            assertNotNull(result.stepCap().warning());
            assertTrue(result.stepCap().warning().contains("sampler.moves.max-steps"), result.stepCap().warning());
        }
    }
}
