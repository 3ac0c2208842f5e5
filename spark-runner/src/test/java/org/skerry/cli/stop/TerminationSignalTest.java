package org.skerry.cli.stop;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeFalse;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;

/**
 * The grace-period decision on a real SIGTERM or SIGINT raised in this JVM (our handler replaces
 * the JVM's, so the test JVM keeps running): abandon at once when the iteration in flight cannot
 * fit, wait for it when it can, abandon when the period runs out first or a second signal comes.
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
        }, () -> "KEPT AND HOW TO CONTINUE");
    }

    private static void raise() {
        raise("TERM");
    }

    private static void raise(String name) {
        sun.misc.Signal.raise(new sun.misc.Signal(name));
    }

    /** Whether this JVM was started with SIGINT ignored (a background job of a non-interactive shell). */
    static boolean interruptIgnored() throws IOException {
        return org.skerry.cli.ProgramProcess.interruptIgnoredIn(Path.of("/proc/self/status"));
    }

    /** Waits until the handler, on its own thread, has said {@code text}. */
    private void awaitLog(String text) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (!log.toString().contains(text) && System.nanoTime() < deadline) {
            Thread.sleep(5);
        }
        assertTrue(log.toString().contains(text), "the handler said \"" + text + "\": " + log);
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
            assertTrue(log.toString().contains("abandoning it. KEPT AND HOW TO CONTINUE"), log.toString());
        }
    }

    @Test
    @Slow
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
            assertTrue(log.toString().contains("KEPT AND HOW TO CONTINUE"), log.toString());
        }
    }

    @Test
    @DisplayName("a repeated SIGTERM changes nothing (schedulers may deliver one twice); Ctrl-C then abandons at once")
    void repeatedTerminationSignal() throws Exception {
        try (TerminationSignal signal = install(30)) {
            signal.iterationStarting(20);
            raise();
            awaitReceived(signal);
            raise();
            assertFalse(abandoned.await(500, TimeUnit.MILLISECONDS), "a second SIGTERM abandons nothing: " + log);
            if (!interruptIgnored()) {
                raise("INT");
                assertTrue(abandoned.await(3, TimeUnit.SECONDS), "Ctrl-C while stopping abandons at once: " + log);
                assertTrue(log.toString().contains("interrupt (Ctrl-C) while stopping: abandoning the iteration in "
                        + "flight at once. KEPT AND HOW TO CONTINUE"), log.toString());
            }
            signal.runEnded();
        }
    }

    @Test
    @DisplayName("Ctrl-C (SIGINT) stops as SIGTERM does, and says how to stop at once; a second Ctrl-C abandons at once")
    void interrupt() throws Exception {
        assumeFalse(interruptIgnored(), "this JVM was started with SIGINT ignored, so no handler can be installed; "
                + "RunFaultTest covers Ctrl-C in a process started with SIGINT at its default");
        try (TerminationSignal signal = install(30)) {
            signal.iterationStarting(2);
            raise("INT");
            awaitLog("interrupt (Ctrl-C): finishing the iteration in flight");
            StopRules rules = new StopRules(signal, null, System.nanoTime());
            assertTrue(rules.urgent());
            assertEquals("an interrupt (Ctrl-C, SIGINT) arrived", rules.reasonToStop(null, 0.1));
            assertTrue(log.toString().contains("press Ctrl-C again to stop at once"), log.toString());
            assertFalse(abandoned.await(300, TimeUnit.MILLISECONDS), log.toString());
            raise("INT");
            assertTrue(abandoned.await(3, TimeUnit.SECONDS), log.toString());
            assertTrue(log.toString().contains("second interrupt (Ctrl-C): abandoning the iteration in flight at once. "
                    + "KEPT AND HOW TO CONTINUE"), log.toString());
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
