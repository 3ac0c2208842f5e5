package org.skerry.engine.temper;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.weight.LogWeights;

class AdaptiveTemperatureTest {

    private static TemperingInputs randomInputs(long seed, int n, double spread) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] logWeight = new double[n];
        double[] logLikelihood = new double[n];
        for (int i = 0; i < n; i++) {
            logWeight[i] = random.nextGaussian() * 0.5;
            logLikelihood[i] = -spread * Math.abs(random.nextGaussian()) - 1000.0;
        }
        logWeight[3] = Double.NEGATIVE_INFINITY;
        logLikelihood[5] = Double.NEGATIVE_INFINITY;
        return new TemperingInputs(logWeight, logLikelihood, n);
    }

    /**
     * Direct computation from the definition CESS = N (Σ W_i G_i)² / Σ W_i G_i² (Zhou, Johansen &amp;
     * Aston 2016, JCGS 25(3), eq. for the conditional ESS), with plain loops in long double-free
     * arithmetic independent of the rule's own code path.
     */
    private static double directFraction(TemperingInputs inputs, double delta) {
        int n = inputs.size();
        double logTotal = LogWeights.logSum(inputs.logWeight(), n);
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (inputs.logWeight()[i] > Double.NEGATIVE_INFINITY && inputs.logLikelihood()[i] > Double.NEGATIVE_INFINITY) {
                max = Math.max(max, inputs.logLikelihood()[i]);
            }
        }
        double first = 0;
        double second = 0;
        for (int i = 0; i < n; i++) {
            double w = Math.exp(inputs.logWeight()[i] - logTotal);
            double g = inputs.logLikelihood()[i] == Double.NEGATIVE_INFINITY ? 0 : Math.exp(delta * (inputs.logLikelihood()[i] - max));
            first += w * g;
            second += w * g * g;
        }
        return first * first / second;
    }

    @Test
    @DisplayName("chosen temperature hits the conditional-ESS target (Zhou, Johansen & Aston 2016)")
    void hitsTarget() {
        for (double target : new double[] {0.3, 0.5, 0.9}) {
            TemperingInputs inputs = randomInputs(7, 5000, 40.0);
            double logTotal = LogWeights.logSum(inputs.logWeight(), inputs.size());
            AdaptiveTemperature rule = new AdaptiveTemperature(target);
            double next = rule.next(0.2, inputs, logTotal);
            assertTrue(next > 0.2 && next < 1.0, "next " + next);
            assertEquals(target, directFraction(inputs, next - 0.2), 1e-9, "target " + target);
            assertEquals(directFraction(inputs, next - 0.2),
                    AdaptiveTemperature.conditionalEssFraction(inputs, logTotal, next - 0.2), 1e-12);
        }
    }

    @Test
    @DisplayName("jumps to 1 when the full step keeps the conditional ESS above target")
    void jumpsToOne() {
        TemperingInputs inputs = randomInputs(8, 1000, 1e-3);
        double logTotal = LogWeights.logSum(inputs.logWeight(), inputs.size());
        assertEquals(1.0, new AdaptiveTemperature(0.5).next(0.0, inputs, logTotal));
    }

    @Test
    void independentOfParticleOrder() {
        TemperingInputs inputs = randomInputs(9, 3001, 25.0);
        int n = inputs.size();
        double[] w = new double[n];
        double[] l = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = inputs.logWeight()[n - 1 - i];
            l[i] = inputs.logLikelihood()[n - 1 - i];
        }
        TemperingInputs reversed = new TemperingInputs(w, l, n);
        AdaptiveTemperature rule = new AdaptiveTemperature(0.5);
        double a = rule.next(0.1, inputs, LogWeights.logSum(inputs.logWeight(), n));
        double b = rule.next(0.1, reversed, LogWeights.logSum(reversed.logWeight(), n));
        assertEquals(Double.doubleToRawLongBits(a), Double.doubleToRawLongBits(b));
    }

    @Test
    void refusesBadTarget() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new AdaptiveTemperature(1.0));
        assertTrue(e.getMessage().contains("1.0"));
        assertThrows(IllegalArgumentException.class, () -> new AdaptiveTemperature(0.0));
        assertThrows(IllegalArgumentException.class, () -> new AdaptiveTemperature(Double.NaN));
    }
}
