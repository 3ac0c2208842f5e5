package org.skerry.cli.stop;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Supplier;

/**
 * Turns SIGTERM — what schedulers send at a time limit or preemption — and SIGINT (Ctrl-C) into a
 * request to stop at the next iteration boundary, where the sampler writes a checkpoint. If the
 * iteration in flight is not expected to end within the grace period, or has not ended when the
 * period is nearly over, or Ctrl-C comes after a signal (pressed again), it is abandoned: the
 * process says what is kept and how to continue, and exits at once with the resumable exit code,
 * on the last checkpoint written. A repeated SIGTERM changes nothing. Installed for one run; {@link #close} restores the previous
 * handlers.
 *
 * <p>In a driver JVM, Spark installs no handler of its own for either signal (its
 * {@code SignalUtils} loggers are for its daemons: master, worker, executor backend), so these
 * replace the JVM's default, which would exit with 130 or 143 at once. A process started with
 * SIGINT ignored (a background job of a non-interactive shell) keeps it ignored: the JVM then
 * installs no handler, and Ctrl-C cannot reach it anyway.
 */
@SuppressWarnings("restriction")
public final class TerminationSignal implements AutoCloseable {

    /** What an abandoned run does: exit the process with this code (tests substitute it). */
    @FunctionalInterface
    public interface Abandon {
        void now(int exitCode);
    }

    private static volatile boolean abandoning;

    /**
     * The command line's way to abandon: silence the libraries' logging (Spark reports every task
     * that the shutdown cuts short, with stack traces, which would bury the message that says
     * what happened), then exit; the shutdown hooks stop Spark and remove its scratch folder.
     */
    public static final Abandon EXIT = code -> {
        abandoning = true;
        QuietLogs.now();
        System.exit(code);
    };

    private final double graceSeconds;
    private final PrintWriter log;
    private final Abandon abandon;
    private final int exitCode;
    private final Supplier<String> afterAbandon;
    private final sun.misc.Signal term = new sun.misc.Signal("TERM");
    private final sun.misc.Signal interrupt = new sun.misc.Signal("INT");
    private final sun.misc.SignalHandler previousTerm;
    private final sun.misc.SignalHandler previousInterrupt;

    private final AtomicInteger signals = new AtomicInteger();
    private volatile long receivedNanos;
    private volatile boolean receivedInterrupt;
    private volatile long iterationStartNanos = System.nanoTime();
    private volatile double predictedSeconds;
    private volatile boolean finished;
    private boolean gaveUp;

    private TerminationSignal(double graceSeconds, PrintWriter log, int exitCode, Abandon abandon,
            Supplier<String> afterAbandon) {
        this.graceSeconds = graceSeconds;
        this.log = log;
        this.exitCode = exitCode;
        this.abandon = abandon;
        this.afterAbandon = afterAbandon;
        this.previousTerm = sun.misc.Signal.handle(term, s -> onSignal(false));
        this.previousInterrupt = handleIfAllowed(interrupt, s -> onSignal(true));
    }

    /** Installs {@code handler} for {@code signal}; null where the JVM refuses (the signal is ignored, or reserved). */
    private static sun.misc.SignalHandler handleIfAllowed(sun.misc.Signal signal, sun.misc.SignalHandler handler) {
        try {
            return sun.misc.Signal.handle(signal, handler);
        } catch (IllegalArgumentException e) {
            return null;
        }
    }

    /**
     * @param graceSeconds time allowed between the signal and the exit
     * @param exitCode     the exit code of an abandoned run
     * @param afterAbandon what is kept and how to continue, said when the run is abandoned (e.g.
     *                     "The run stops on the checkpoint of iteration 4 … Continue with: skerry resume DIR")
     */
    public static TerminationSignal install(double graceSeconds, PrintWriter log, int exitCode, Abandon abandon,
            Supplier<String> afterAbandon) {
        return new TerminationSignal(graceSeconds, log, exitCode, abandon, afterAbandon);
    }

    /**
     * Whether the process is abandoning a run through {@link #EXIT}: what fails from now on is the
     * shutdown cutting the run short, not the run.
     */
    public static boolean abandoning() {
        return abandoning;
    }

    /** Whether a termination signal or an interrupt has arrived. */
    public boolean received() {
        return receivedNanos != 0;
    }

    /** What arrived, for messages: "a termination signal (SIGTERM)" or "an interrupt (Ctrl-C, SIGINT)". */
    public String description() {
        return receivedInterrupt ? "an interrupt (Ctrl-C, SIGINT)" : "a termination signal (SIGTERM)";
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

    private void onSignal(boolean isInterrupt) {
        String name = isInterrupt ? "interrupt (Ctrl-C)" : "termination signal";
        // Each signal is handled on a thread of its own: two in quick succession must still count as two.
        if (signals.incrementAndGet() > 1) {
            // Ctrl-C after a signal: the user wants out now. A repeated SIGTERM changes nothing: a
            // scheduler may deliver one twice (Slurm sends it to the job's processes and to the
            // batch script, which forwards it), and the grace period already bounds the stop.
            if (isInterrupt) {
                giveUp((receivedInterrupt ? "second interrupt (Ctrl-C)" : "interrupt (Ctrl-C) while stopping")
                        + ": abandoning the iteration in flight at once", true);
            }
            return;
        }
        receivedInterrupt = isInterrupt;
        long now = System.nanoTime();
        receivedNanos = now == 0 ? 1 : now;
        double elapsed = (receivedNanos - iterationStartNanos) * 1e-9;
        double remaining = Math.max(0, predictedSeconds - elapsed);
        double allowed = graceSeconds - margin();
        if (remaining > allowed) {
            giveUp(String.format(Locale.ROOT, "%s: the iteration in flight needs about %.0f s more, more than the "
                    + "%.0f s grace period (limits.stop-grace-seconds); abandoning it", name, remaining, graceSeconds),
                    isInterrupt);
            return;
        }
        say(String.format(Locale.ROOT, "%s: finishing the iteration in flight%s and stopping at a checkpoint; "
                + "grace period %.0f s%s", name, predictedSeconds > 0
                        ? String.format(Locale.ROOT, " (about %.0f s)", remaining) : "", graceSeconds,
                isInterrupt ? "; press Ctrl-C again to stop at once, losing the iteration in flight" : ""), isInterrupt);
        Thread watchdog = new Thread(() -> {
            try {
                Thread.sleep((long) (allowed * 1000));
            } catch (InterruptedException e) {
                return;
            }
            if (!finished) {
                giveUp(name + ": the grace period is nearly over; abandoning the iteration in flight", false);
            }
        }, "skerry-stop-watchdog");
        watchdog.setDaemon(true);
        watchdog.start();
    }

    /** Says what happened, what is kept and how to continue, then abandons the run (once). */
    private void giveUp(String what, boolean newLine) {
        synchronized (this) {
            if (gaveUp) {
                return;
            }
            gaveUp = true;
        }
        String after;
        try {
            after = afterAbandon.get();
        } catch (RuntimeException e) {
            after = null;
        }
        say(what + (after == null || after.isEmpty() ? "" : ". " + after), newLine);
        abandon.now(exitCode);
    }

    private void say(String message, boolean newLine) {
        synchronized (log) {
            // Ctrl-C on a terminal leaves "^C" where the cursor was, often on the progress line.
            if (newLine && System.console() != null) {
                log.println();
            }
            log.println("skerry: " + message);
            log.flush();
        }
    }

    @Override
    public void close() {
        finished = true;
        sun.misc.Signal.handle(term, previousTerm);
        if (previousInterrupt != null) {
            sun.misc.Signal.handle(interrupt, previousInterrupt);
        }
    }
}
