package org.skerry.cli.stop;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.time.Duration;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The grace-period decision on a real SIGTERM raised in this JVM (our handler replaces the JVM's,
 * so the test JVM keeps running): abandon at once when the iteration in flight cannot fit, wait
 * for it when it can, and abandon when the period runs out first.
 */
@SuppressWarnings("restriction")
class TerminationSignalTest {

    private final StringWriter log = new StringWriter();
    private final AtomicInteger exitCode = new AtomicInteger(-1);
    private final CountDownLatch abandoned = new CountDownLatch(1);

    private TerminationSignal install(double graceSeconds) {
        return TerminationSignal.install(graceSeconds, new PrintWriter(log, true), 75, code -> {
            exitCode.set(code);
            abandoned.countDown();
        });
    }

    private static void raise() {
        sun.misc.Signal.raise(new sun.misc.Signal("TERM"));
    }

    private static void awaitReceived(TerminationSignal signal) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (!signal.received() && System.nanoTime() < deadline) {
            Thread.sleep(5);
        }
        assertTrue(signal.received(), "the signal reached the handler");
    }

    @Test
    @DisplayName("an iteration expected to need longer than the grace period is abandoned at once, exit code 75")
    void abandonsWhatCannotFit() throws Exception {
        try (TerminationSignal signal = install(5)) {
            signal.iterationStarting(60);
            raise();
            assertTrue(abandoned.await(3, TimeUnit.SECONDS), "abandoned well before the grace period ends: " + log);
            assertEquals(75, exitCode.get());
            assertTrue(log.toString().contains("abandoning it"), log.toString());
        }
    }

    @Test
    @DisplayName("an iteration that fits is waited for; once the run ends nothing is abandoned")
    void waitsForWhatFits() throws Exception {
        try (TerminationSignal signal = install(2)) {
            signal.iterationStarting(0.1);
            raise();
            awaitReceived(signal);
            StopRules rules = new StopRules(signal, null, System.nanoTime());
            assertTrue(rules.urgent());
            assertEquals("a termination signal (SIGTERM) arrived", rules.reasonToStop(null, 0.1));
            signal.runEnded();
            assertFalse(abandoned.await(3, TimeUnit.SECONDS), "nothing abandoned after the run ended: " + log);
            assertTrue(log.toString().contains("finishing the iteration in flight"), log.toString());
        }
    }

    @Test
    @DisplayName("an iteration that outlasts the grace period after all is abandoned when the period is nearly over")
    void abandonsWhenThePeriodRunsOut() throws Exception {
        try (TerminationSignal signal = install(1.2)) {
            signal.iterationStarting(0.1);
            long start = System.nanoTime();
            raise();
            assertTrue(abandoned.await(10, TimeUnit.SECONDS), log.toString());
            double seconds = (System.nanoTime() - start) * 1e-9;
            assertTrue(seconds >= 0.9 && seconds < 1.2, "abandoned at " + seconds + " s, before the 1.2 s period ends");
            assertTrue(log.toString().contains("grace period is nearly over"), log.toString());
        }
    }

    @Test
    @DisplayName("the wall-time rule stops before an iteration that would end after the limit, and is not urgent")
    void wallTime() {
        try (TerminationSignal signal = install(30)) {
            StopRules rules = new StopRules(signal, Duration.ofSeconds(100), System.nanoTime());
            assertEquals(null, rules.reasonToStop(null, 10));
            assertTrue(rules.reasonToStop(null, 150).contains("would not fit in the wall time left"));
            assertFalse(rules.urgent());
        }
    }
}
