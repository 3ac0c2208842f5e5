package org.skerry.cli.stop;

import java.io.PrintWriter;
import java.util.Locale;

/**
 * Turns SIGTERM — what schedulers send at a time limit or preemption — into a request to stop at
 * the next iteration boundary, where the sampler writes a checkpoint. If the iteration in flight
 * is not expected to end within the grace period, or has not ended when the period is nearly
 * over, it is abandoned: the process exits at once with the resumable exit code, on the last
 * checkpoint written. Installed for one run; {@link #close} restores the previous handler.
 */
@SuppressWarnings("restriction")
public final class TerminationSignal implements AutoCloseable {

    /** What an abandoned run does: exit the process with this code (tests substitute it). */
    @FunctionalInterface
    public interface Abandon {
        void now(int exitCode);
    }

    private final double graceSeconds;
    private final PrintWriter log;
    private final Abandon abandon;
    private final int exitCode;
    private final sun.misc.SignalHandler previous;
    private final sun.misc.Signal signal = new sun.misc.Signal("TERM");

    private volatile long receivedNanos;
    private volatile long iterationStartNanos = System.nanoTime();
    private volatile double predictedSeconds;
    private volatile boolean finished;

    private TerminationSignal(double graceSeconds, PrintWriter log, int exitCode, Abandon abandon) {
        this.graceSeconds = graceSeconds;
        this.log = log;
        this.exitCode = exitCode;
        this.abandon = abandon;
        this.previous = sun.misc.Signal.handle(signal, s -> onSignal());
    }

    /**
     * @param graceSeconds time allowed between the signal and the exit
     * @param exitCode     the exit code of an abandoned run
     */
    public static TerminationSignal install(double graceSeconds, PrintWriter log, int exitCode, Abandon abandon) {
        return new TerminationSignal(graceSeconds, log, exitCode, abandon);
    }

    /** Whether a termination signal has arrived. */
    public boolean received() {
        return receivedNanos != 0;
    }

    /** The sampler is starting an iteration expected to take {@code predicted} seconds. */
    void iterationStarting(double predicted) {
        iterationStartNanos = System.nanoTime();
        predictedSeconds = predicted;
    }

    /** The run has ended one way or the other: nothing is left to abandon. */
    public void runEnded() {
        finished = true;
    }

    /** Margin kept for shutting down after abandoning: a sixth of the grace period, at most 5 s. */
    private double margin() {
        return Math.min(5.0, graceSeconds / 6);
    }

    private void onSignal() {
        if (receivedNanos != 0) {
            return;
        }
        receivedNanos = System.nanoTime();
        double elapsed = (receivedNanos - iterationStartNanos) * 1e-9;
        double remaining = Math.max(0, predictedSeconds - elapsed);
        double allowed = graceSeconds - margin();
        if (remaining > allowed) {
            say(String.format(Locale.ROOT, "termination signal: the iteration in flight needs about %.0f s more, "
                    + "more than the %.0f s grace period; abandoning it and stopping on the last checkpoint",
                    remaining, graceSeconds));
            abandon.now(exitCode);
            return;
        }
        say(String.format(Locale.ROOT, "termination signal: finishing the iteration in flight (about %.0f s) and "
                + "stopping at a checkpoint; grace period %.0f s", remaining, graceSeconds));
        Thread watchdog = new Thread(() -> {
            try {
                Thread.sleep((long) (allowed * 1000));
            } catch (InterruptedException e) {
                return;
            }
            if (!finished) {
                say("termination signal: the grace period is nearly over; abandoning the iteration in flight and "
                        + "stopping on the last checkpoint");
                abandon.now(exitCode);
            }
        }, "skerry-stop-watchdog");
        watchdog.setDaemon(true);
        watchdog.start();
    }

    private void say(String message) {
        synchronized (log) {
            log.println("skerry: " + message);
            log.flush();
        }
    }

    @Override
    public void close() {
        finished = true;
        sun.misc.Signal.handle(signal, previous);
    }
}
