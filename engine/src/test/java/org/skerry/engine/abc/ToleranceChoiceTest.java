package org.skerry.engine.abc;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The next tolerance of adaptive ABC-SMC against direct computation of the ESS (Kong, Liu &amp;
 * Wong 1994: (Σw)²/Σw²) on small cases, ties included.
 */
class ToleranceChoiceTest {

    private static double ess(double[] w) {
        double a = 0;
        double b = 0;
        for (double v : w) {
            a += v;
            b += v * v;
        }
        return a * a / b;
    }

    @Test
    @DisplayName("equal weights, M = 1: the smallest distance at which at least half the particles stay")
    void equalWeights() {
        double[] d = {5, 1, 4, 2, 3, 6, 8, 7};
        double chosen = ToleranceChoice.next(new double[8], new double[8], d, 1, Double.POSITIVE_INFINITY, 0.5,
                AbcKernel.UNIFORM);
        assertEquals(4.0, chosen, "four of eight within 4");
    }

    @Test
    @DisplayName("ties: distances tied at the cut enter together, and the tolerance still falls")
    void ties() {
        double[] d = {0, 0, 1, 1, 1, 1, 1, 1, 1, 1};
        double chosen = ToleranceChoice.next(new double[10], new double[10], d, 1, Double.POSITIVE_INFINITY, 0.5,
                AbcKernel.UNIFORM);
        assertEquals(1.0, chosen, "at 0 only 2 of 10 stay (ESS 2 < 5); at 1 all do");
        double next = ToleranceChoice.next(new double[10], new double[10], d, 1, 1.0, 0.5, AbcKernel.UNIFORM);
        assertEquals(0.0, next, "from tolerance 1 the only step down is to 0, taken though the ESS falls further");
    }

    @Test
    @DisplayName("unequal weights and M = 3: the choice matches a brute-force ESS over every candidate")
    void bruteForce() {
        int n = 40;
        int m = 3;
        java.util.Random random = new java.util.Random(5);
        double[] logWeight = new double[n];
        double[] oldKernel = new double[n];
        double[] d = new double[n * m];
        for (int i = 0; i < n; i++) {
            logWeight[i] = random.nextGaussian();
            oldKernel[i] = Math.log((1 + random.nextInt(3)) / 3.0);
            for (int k = 0; k < m; k++) {
                d[i * m + k] = Math.floor(random.nextDouble() * 20) / 2;
            }
        }
        double current = 9.0;
        double[] w = new double[n];
        for (int i = 0; i < n; i++) {
            w[i] = Math.exp(logWeight[i]);
        }
        double target = 0.5 * ess(w);
        double[] candidates = Arrays.stream(d).filter(x -> x < current).distinct().sorted().toArray();
        double expected = candidates[candidates.length - 1];
        for (double c : candidates) {
            double[] next = new double[n];
            for (int i = 0; i < n; i++) {
                int within = 0;
                for (int k = 0; k < m; k++) {
                    within += d[i * m + k] <= c ? 1 : 0;
                }
                next[i] = w[i] * within / m / Math.exp(oldKernel[i]);
            }
            if (Arrays.stream(next).sum() > 0 && ess(next) >= target) {
                expected = c;
                break;
            }
        }
        double chosen = ToleranceChoice.next(logWeight, oldKernel, d, m, current, 0.5, AbcKernel.UNIFORM);
        assertEquals(expected, chosen);
        assertTrue(chosen < current);
    }

    @Test
    @DisplayName("share rule: the smallest distance keeping the share, counted over living particles' simulations "
            + "within the current tolerance; a tie overshooting the share or filling the ball still lets it fall")
    void share() {
        boolean[] alive = {true, true, true, true, true, true, true, false};
        double[] d = {5, 1, 4, 2, 3, 6, 9, 0.5};
        // Living and within 6: 5, 1, 4, 2, 3, 6 (six); 0.5 of six is three: 1, 2, 3.
        assertEquals(3.0, ToleranceChoice.byShare(alive, d, 1, 6.0, 0.5));
        // From +inf all seven living count; 0.5 of seven is 3.5, so four: 1, 2, 3, 4.
        assertEquals(4.0, ToleranceChoice.byShare(alive, d, 1, Double.POSITIVE_INFINITY, 0.5));
        boolean[] all = new boolean[10];
        java.util.Arrays.fill(all, true);
        double[] ties = {0, 0, 1, 1, 1, 1, 1, 1, 1, 1};
        assertEquals(1.0, ToleranceChoice.byShare(all, ties, 1, Double.POSITIVE_INFINITY, 0.5),
                "0 keeps 2 of 10; the tie at 1 enters whole");
        assertEquals(0.0, ToleranceChoice.byShare(all, ties, 1, 1.0, 0.5), "from 1 it still falls, to 0");
        assertTrue(Double.isNaN(ToleranceChoice.byShare(all, ties, 1, 0.0, 0.5)), "nothing below 0");
        // M = 2: simulations, not particles, are counted; particle 1's are both outside 2.5.
        double[] two = {1, 2, 3, 7, 0.5, 2.5};
        boolean[] three = {true, true, true};
        assertEquals(1.0, ToleranceChoice.byShare(three, two, 2, 2.5, 0.5), "within 2.5: 1, 2, 0.5, 2.5; half is 2");
    }
}
