package org.skerry.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

class SupportTest {

    private static final Support[] SUPPORTS = {Support.real(), Support.positive(), Support.lowerBounded(-3),
        Support.upperBounded(2), Support.interval(0, 1), Support.interval(-5, 20)};

    @Test
    @DisplayName("transforms round-trip and stay inside the support")
    void roundTrip() {
        for (Support support : SUPPORTS) {
            for (double z = -30; z <= 30; z += 0.7) {
                double x = support.fromUnconstrained(z);
                assertTrue(support.contains(x) || Math.abs(z) > 25, support + " z=" + z + " x=" + x);
                if (Math.abs(z) < 15) {
                    assertEquals(z, support.toUnconstrained(x), 1e-7 * (1 + Math.abs(z)), support + " z=" + z);
                }
            }
        }
    }

    @Test
    @DisplayName("log-Jacobian equals log|dx/dz| by central differences")
    void jacobian() {
        for (Support support : SUPPORTS) {
            for (double z = -8; z <= 8; z += 0.9) {
                double h = 1e-5;
                double derivative = (support.fromUnconstrained(z + h) - support.fromUnconstrained(z - h)) / (2 * h);
                assertEquals(Math.log(Math.abs(derivative)), support.logJacobian(z), 1e-6, support + " z=" + z);
            }
        }
    }

    @Test
    void refusesBadBounds() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> Support.interval(1, 1)).getMessage().contains("lower"));
        assertThrows(IllegalArgumentException.class, () -> Support.lowerBounded(Double.NaN));
    }
}
