package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.calibration.CalibrationCase;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.resample.ResamplingThreshold;

/**
 * Whether a population is resampled never hangs on the last bit of its ESS. The adaptive
 * conditional-ESS target and the resampling threshold are both ½ by default (common practice), so
 * the ESS after an adaptive step lands on N/2 up to rounding; moving the ESS by a few units in the
 * last place must not change any decision.
 */
class ResamplingDecisionTest {

    @Test
    @DisplayName("the threshold rule: at or below τ·N with a 1e-9 relative margin")
    void rule() {
        assertTrue(ResamplingThreshold.reached(999.9999999999998, 2000, 0.5));
        assertTrue(ResamplingThreshold.reached(1000.0, 2000, 0.5));
        assertTrue(ResamplingThreshold.reached(1000.0000000000002, 2000, 0.5));
        assertFalse(ResamplingThreshold.reached(1000.01, 2000, 0.5));
        assertTrue(ResamplingThreshold.reached(2000, 2000, 1.0), "threshold 1 resamples every time");
    }

    @Test
    @DisplayName("40 seeds, default settings: every recorded decision survives moving the ESS by ±16 ulp")
    void noDecisionOnTheLastBit() {
        CalibrationCase c = CalibrationCase.normalMean(1000);
        SamplerSettings base = SamplerSettings.builder().particles(c.particles()).build();
        int nearThreshold = 0;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < 40; s++) {
                SamplerSettings settings = base.toBuilder().seed(100 + s).build();
                SamplerResult result = new SmcSampler(settings).run(c.model(), backend);
                for (IterationRecord r : result.iterations()) {
                    if (r.iteration() == 0) {
                        continue;
                    }
                    double ess = r.ess();
                    boolean decided = ResamplingThreshold.reached(ess, c.particles(), settings.resampling().threshold());
                    assertEquals(decided, r.resampled(), "seed " + s + " iteration " + r.iteration());
                    for (int k = -16; k <= 16; k++) {
                        double moved = ess + k * Math.ulp(ess);
                        assertEquals(decided, ResamplingThreshold.reached(moved, c.particles(),
                                settings.resampling().threshold()), "seed " + s + " iteration " + r.iteration()
                                        + ": ESS " + ess + " moved by " + k + " ulp");
                    }
                    if (Math.abs(ess - 0.5 * c.particles()) < 1e-6 * c.particles()) {
                        nearThreshold++;
                    }
                }
            }
        }
        assertTrue(nearThreshold > 0, "the check must meet ESS values on the threshold (it met none)");
    }
}
