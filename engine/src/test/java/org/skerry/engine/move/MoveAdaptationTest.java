package org.skerry.engine.move;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

class MoveAdaptationTest {

    @Test
    @DisplayName("R = ceil(log c / log(1 - acceptance)) (Drovandi & Pettitt 2011, Biometrics 67(1))")
    void stepsFollowTheFormula() {
        for (double acceptance = 0.01; acceptance < 1; acceptance += 0.037) {
            int expected = (int) Math.ceil(Math.log(0.01) / Math.log(1 - acceptance));
            assertEquals(Math.min(200, Math.max(1, expected)), MoveAdaptation.steps(acceptance, 0.01, 200),
                    "acceptance " + acceptance);
        }
        // worked by hand: acceptance 0.5, c = 0.01: log 0.01 / log 0.5 = 6.64 -> 7
        assertEquals(7, MoveAdaptation.steps(0.5, 0.01, 50));
        assertEquals(20, MoveAdaptation.steps(0.0, 0.01, 20));
        assertEquals(1, MoveAdaptation.steps(1.0, 0.01, 20));
        assertEquals(5, MoveAdaptation.steps(0.05, 0.01, 5));
    }

    @Test
    void scaleMovesTowardsTarget() {
        assertEquals(1.0, MoveAdaptation.nextScale(1.0, 0.234, 0.234), 0.0);
        assertEquals(Math.exp(2 * (0.6 - 0.234)), MoveAdaptation.nextScale(1.0, 0.6, 0.234), 1e-15);
        assertEquals(MoveAdaptation.MIN_SCALE, MoveAdaptation.nextScale(1e-3, 0.0, 0.234));
    }

    @Test
    void refusesBadArguments() {
        assertThrows(IllegalArgumentException.class, () -> MoveAdaptation.steps(0.5, 0.0, 10));
        assertThrows(IllegalArgumentException.class, () -> MoveAdaptation.steps(0.5, 0.01, 0));
    }

    @Test
    @DisplayName("ladder: the rungs bracketing the target are interpolated in log scale, by hand")
    void ladderInterpolates() {
        // Rungs 1/4, 1/2, 1, 2 accept 0.8, 0.6, 0.3, 0.1; the target 0.45 lies halfway between
        // 1/2 and 1, so the factor is exp((log 1/2 + log 1) / 2) = 1/sqrt(2).
        LadderChoice chosen = MoveAdaptation.scaleFromLadder(0.8, new long[] {100, 100, 100, 100},
                new long[] {80, 60, 30, 10}, 0.45);
        assertEquals(0.8 / Math.sqrt(2), chosen.scale(), 1e-12);
        assertEquals(0.45, chosen.expectedAcceptance(), 0.0);
    }

    @Test
    @DisplayName("ladder: beyond either end the end rung is taken, with its own acceptance")
    void ladderEnds() {
        LadderChoice small = MoveAdaptation.scaleFromLadder(1.0, new long[] {10, 10, 10, 10},
                new long[] {1, 1, 0, 0}, 0.3);
        assertEquals(0.25, small.scale(), 0.0);
        assertEquals(0.1, small.expectedAcceptance(), 1e-15);
        LadderChoice large = MoveAdaptation.scaleFromLadder(1.0, new long[] {10, 10, 10, 10},
                new long[] {9, 9, 8, 7}, 0.3);
        assertEquals(2.0, large.scale(), 0.0);
        assertEquals(0.7, large.expectedAcceptance(), 1e-15);
    }
}
