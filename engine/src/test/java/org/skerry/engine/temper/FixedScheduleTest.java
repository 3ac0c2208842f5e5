package org.skerry.engine.temper;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class FixedScheduleTest {

    @Test
    void walksTheSchedule() {
        FixedSchedule schedule = new FixedSchedule(0.1, 0.5, 1.0);
        assertEquals(0.1, schedule.next(0.0, null, 0));
        assertEquals(0.5, schedule.next(0.1, null, 0));
        assertEquals(1.0, schedule.next(0.5, null, 0));
    }

    @Test
    void powerRampEndsAtOne() {
        double[] t = FixedSchedule.power(4, 2.0).temperatures();
        assertArrayEquals(new double[] {1.0 / 16, 4.0 / 16, 9.0 / 16, 1.0}, t, 1e-15);
    }

    @Test
    void refusesBadSchedules() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new FixedSchedule(0.5, 0.4, 1.0))
                .getMessage().contains("entry 1"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new FixedSchedule(0.2, 0.9))
                .getMessage().contains("end at 1"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new FixedSchedule(0.0, 1.0))
                .getMessage().contains("entry 0"));
        assertThrows(IllegalArgumentException.class, () -> new FixedSchedule(0.5, 0.5, 1.0));
        assertThrows(IllegalArgumentException.class, () -> new FixedSchedule());
        assertThrows(IllegalArgumentException.class, () -> new FixedSchedule(0.5, Double.NaN, 1.0));
    }
}
