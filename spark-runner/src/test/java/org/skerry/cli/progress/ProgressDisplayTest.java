package org.skerry.cli.progress;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;

class ProgressDisplayTest {

    private static final String NL = System.lineSeparator();

    /** A clock that moves only when told. */
    private static final class ManualClock extends Clock {
        private Instant now;

        ManualClock(Instant now) {
            this.now = now;
        }

        void advance(double seconds) {
            now = now.plus(Duration.ofMillis(Math.round(seconds * 1000)));
        }

        @Override
        public ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(ZoneId zone) {
            throw new UnsupportedOperationException();
        }

        @Override
        public Instant instant() {
            return now;
        }
    }

    private static IterationRecord record(int iteration, double phi, double ess, double acceptance, long evaluations) {
        return new IterationRecord(iteration, phi, ess, false, 1000, 0, acceptance, 3, 1.0, 0, 0, evaluations, 0, 0, -1,
                null, new PhaseTimes(0, 0, 0, 0, 0, 0, 0, 0));
    }

    private final ByteArrayOutputStream bytes = new ByteArrayOutputStream();
    private final PrintWriter out = new PrintWriter(new OutputStreamWriter(bytes, StandardCharsets.UTF_8), true);
    private final ManualClock clock = new ManualClock(Instant.parse("2025-03-01T09:30:00Z"));

    private String text() {
        return bytes.toString(StandardCharsets.UTF_8);
    }

    /** Four iterations, two seconds apart: φ 0, 10⁻³, 10⁻², 1. */
    private void run(ProgressDisplay display, boolean finish) {
        clock.advance(2);
        display.iterationFinished(record(0, 0.0, 1000, Double.NaN, 1000));
        clock.advance(2);
        display.iterationFinished(record(1, 0.001, 498.6, 0.5, 3000));
        clock.advance(2);
        display.iterationFinished(record(2, 0.01, 512, 0.234, 2000));
        if (finish) {
            clock.advance(2);
            display.iterationFinished(record(3, 1.0, 700, 0.25, 58000));
        }
    }

    @Test
    @DisplayName("interactive: one line rewritten with \\r, padded over longer content, ended when φ reaches 1")
    void interactive() {
        run(new ProgressDisplay(out, true, clock), true);
        String text = text();
        assertTrue(text.startsWith("\r"));
        assertTrue(text.endsWith(NL));
        assertEquals(text.indexOf(NL), text.length() - NL.length(), "exactly one line end, at the end");
        List<String> shown = List.of(text.substring(1, text.length() - NL.length()).split("\r"));
        assertEquals(4, shown.size());
        assertEquals("iter 0  temperature 0  ESS 1000  acc -  500 eval/s  0:00:02  left ?", shown.get(0));
        // 4000 evaluations in 4 s; no pace measured before the end of iteration 1.
        assertTrue(shown.get(1).startsWith("iter 1  temperature 0.0010  ESS 499  acc 50%  1000 eval/s  0:00:04  left ?"),
                shown.get(1));
        // log φ went from log 10⁻³ to log 10⁻² in 2 s; log 1 is as far again twice over: 4 s.
        assertTrue(shown.get(2).startsWith("iter 2  temperature 0.0100  ESS 512  acc 23%  1000 eval/s  0:00:06  left ~0:00:04"),
                shown.get(2));
        assertTrue(shown.get(3).startsWith("iter 3  temperature 1.0000  ESS 700  acc 25%  8000 eval/s  0:00:08  done"),
                shown.get(3));
        for (int i = 1; i < shown.size(); i++) {
            assertTrue(shown.get(i).length() >= shown.get(i - 1).strip().length(),
                    "line " + i + " must cover the previous one");
        }
        assertTrue(shown.get(3).strip().length() < shown.get(2).length(), "the last line is the shorter");
        assertEquals(shown.get(2).length(), shown.get(3).length(), "a shorter line is padded to the previous length");
    }

    @Test
    @DisplayName("interactive: close() ends an unfinished line once; nothing more after that")
    void closeEndsLine() {
        ProgressDisplay display = new ProgressDisplay(out, true, clock);
        run(display, false);
        assertFalse(text().contains(NL));
        display.close();
        assertTrue(text().endsWith(NL));
        int length = text().length();
        display.close();
        assertEquals(length, text().length());
    }

    @Test
    @DisplayName("log mode: one stamped line per iteration with the same fields, no \\r")
    void logMode() {
        ProgressDisplay display = new ProgressDisplay(out, false, clock);
        run(display, true);
        display.close();
        String text = text();
        assertFalse(text.contains("\r"));
        String[] lines = text.split(NL);
        assertEquals(4, lines.length);
        assertEquals("2025-03-01T09:30:02Z iter 0  temperature 0  ESS 1000  acc -  500 eval/s  0:00:02  left ?", lines[0]);
        assertEquals("2025-03-01T09:30:06Z iter 2  temperature 0.0100  ESS 512  acc 23%  1000 eval/s  0:00:06  left ~0:00:04",
                lines[2]);
        assertEquals("2025-03-01T09:30:08Z iter 3  temperature 1.0000  ESS 700  acc 25%  8000 eval/s  0:00:08  done", lines[3]);
        assertTrue(text.endsWith(NL));
    }

    @Test
    @DisplayName("φ is rounded down, large rates are abbreviated, long times show hours")
    void formatting() {
        ProgressDisplay display = new ProgressDisplay(out, false, clock);
        clock.advance(3725);
        display.iterationFinished(record(0, 0.0, 10, Double.NaN, 100_000_000L));
        clock.advance(1);
        display.iterationFinished(record(1, 0.99999, 10, 0.5, 0));
        String[] lines = text().split(NL);
        assertTrue(lines[0].contains("26.8k eval/s  1:02:05"), lines[0]);
        assertTrue(lines[1].contains("temperature 0.9999 "), lines[1]);
        assertEquals("12:00:00", ProgressDisplay.clockTime(43_200));
    }

    @Test
    @DisplayName("temperatures below 0.001 show three significant digits, not 0.0000")
    void tinyTemperatures() {
        assertEquals("0", ProgressDisplay.temperature(0.0));
        assertEquals("2.31e-06", ProgressDisplay.temperature(2.3149e-6));
        assertEquals("9.99e-04", ProgressDisplay.temperature(0.000999));
        assertEquals("0.0010", ProgressDisplay.temperature(0.001));
        assertEquals("0.9999", ProgressDisplay.temperature(0.99999));
        assertEquals("1.0000", ProgressDisplay.temperature(1.0));
        ProgressDisplay display = new ProgressDisplay(out, false, clock);
        clock.advance(1);
        display.iterationFinished(record(1, 4.2e-9, 500, 0.3, 10));
        assertTrue(text().contains("iter 1  temperature 4.20e-09  ESS 500"), text());
    }

    @Test
    @DisplayName("log mode names the run on every line; announce() names the analysis before it starts")
    void namesTheRun() {
        ProgressDisplay display = new ProgressDisplay(out, false, clock, List.of("mu"), "beads");
        display.announce("running beads: model normal-mean, 200 particles, seed 7; run folder r1");
        clock.advance(2);
        display.iterationFinished(record(0, 0.0, 1000, Double.NaN, 1000));
        String[] lines = text().split(NL);
        assertEquals("2025-03-01T09:30:00Z running beads: model normal-mean, 200 particles, seed 7; run folder r1",
                lines[0]);
        assertEquals("2025-03-01T09:30:02Z beads  iter 0  temperature 0  ESS 1000  acc -  500 eval/s  0:00:02  left ?",
                lines[1]);
    }

    @Test
    @DisplayName("interactive: the announcement stands on its own line before the live line")
    void announceInteractive() {
        ProgressDisplay display = new ProgressDisplay(out, true, clock, null, "beads");
        display.announce("running beads");
        clock.advance(2);
        display.iterationFinished(record(0, 0.0, 1000, Double.NaN, 1000));
        assertTrue(text().startsWith("running beads" + NL + "\riter 0  temperature 0  ESS 1000"), text());
    }

    private static IterationRecord failing(int iteration, double phi, long invalid, long retried, long stillInvalid) {
        return new IterationRecord(iteration, phi, 900, false, 1000, 0, 0.3, 3, 1.0, 0, 0, 2000, 0, invalid, 17,
                "java.lang.IllegalStateException: solver diverged", new PhaseTimes(0, 0, 0, 0, 0, 0, 0, 0), retried,
                stillInvalid, List.of(2.75, 0.1 + 0.2));
    }

    @Test
    @DisplayName("one warning line per iteration with invalid evaluations: count, retries, first particle's values and reason")
    void warnings() {
        ProgressDisplay display = new ProgressDisplay(out, false, clock, List.of("theta", "sigma"));
        clock.advance(2);
        display.iterationFinished(failing(0, 0.0, 30, 0, 0));
        clock.advance(2);
        display.iterationFinished(record(1, 0.01, 512, 0.234, 2000));
        clock.advance(2);
        display.iterationFinished(failing(2, 1.0, 5, 9, 5));
        String[] lines = text().split(NL);
        assertEquals(5, lines.length, text());
        assertEquals("2025-03-01T09:30:02Z warning: iter 0: 30 of 2000 likelihood evaluations invalid (1.5%); "
                + "first: particle 17 at theta=2.75, sigma=0.30000000000000004: "
                + "java.lang.IllegalStateException: solver diverged", lines[1]);
        assertTrue(lines[2].contains(" iter 1 "), lines[2]);
        assertTrue(lines[4].contains("warning: iter 2: 5 of 2000 likelihood evaluations invalid (0.3%); 9 retried, "
                + "5 still invalid; first: particle 17"), lines[4]);
    }

    @Test
    @DisplayName("interactive: a warning ends the live line and stands on its own line")
    void warningsInteractive() {
        ProgressDisplay display = new ProgressDisplay(out, true, clock, null);
        clock.advance(2);
        display.iterationFinished(failing(1, 0.5, 30, 0, 0));
        clock.advance(2);
        display.iterationFinished(record(2, 1.0, 700, 0.25, 100));
        String[] lines = text().split(NL);
        assertEquals(3, lines.length, text());
        assertTrue(lines[0].startsWith("\riter 1 "), lines[0]);
        assertTrue(lines[1].contains("warning: iter 1: 30 of 2000") && lines[1].contains("at x0=2.75, x1="), lines[1]);
        assertTrue(lines[2].startsWith("\riter 2 "), lines[2]);
    }

    @Test
    @DisplayName("an ABC run shows its tolerance (four significant digits, - for the prior draw) and the share "
            + "within it, and its evaluations as simulations per second")
    void abcLine() {
        ProgressDisplay display = new ProgressDisplay(out, false, clock);
        clock.advance(2);
        display.iterationFinished(abc(0, Double.POSITIVE_INFINITY, 1.0, 1000));
        clock.advance(2);
        display.iterationFinished(abc(1, 4.672097333448, 0.5, 3000));
        String[] lines = text().split(NL);
        assertEquals("2025-03-01T09:30:02Z iter 0  tolerance -  within 100%  ESS 1000  acc -  500 sim/s  0:00:02  left ?",
                lines[0]);
        assertTrue(lines[1].startsWith("2025-03-01T09:30:04Z iter 1  tolerance 4.672  within 50%  ESS 500  acc 20%  "
                + "1000 sim/s  0:00:04"), lines[1]);
    }

    private static IterationRecord abc(int iteration, double tolerance, double within, long evaluations) {
        return new IterationRecord(iteration, 0.0, 1000 * within, false, 1000, 0, iteration == 0 ? Double.NaN : 0.2, 3,
                1.0, 0, 0, evaluations, 0, 0, -1, null, new PhaseTimes(0, 0, 0, 0, 0, 0, 0, 0), 0, 0, List.of(),
                new org.skerry.engine.sampler.ToleranceRecord(tolerance, within, evaluations));
    }
}
