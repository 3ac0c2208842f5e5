package org.skerry.cli.progress;

import java.io.PrintWriter;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.format.DateTimeFormatter;
import java.time.temporal.ChronoUnit;
import java.util.Locale;

/**
 * Shows a batch's progress as counts of analyses: done, running, failed and waiting, with the
 * elapsed time. On a terminal ({@code interactive}) it keeps rewriting one line, and prints a
 * failure on a line of its own above it; otherwise it prints one line, stamped with the UTC time,
 * per event (an analysis started, finished or failed). Thread-safe: analyses report from their
 * own threads. Never closes the stream.
 */
public final class BatchProgress implements AutoCloseable {

    private static final DateTimeFormatter STAMP = DateTimeFormatter.ISO_INSTANT;

    private final PrintWriter out;
    private final boolean interactive;
    private final Clock clock;
    private final Instant start;
    private int waiting;
    private int running;
    private int done;
    private int failed;
    private int shownLength;

    /**
     * @param total analyses still to run
     * @param kept  analyses finished by an earlier run of the batch, counted as done
     */
    public BatchProgress(PrintWriter out, boolean interactive, int total, int kept, Clock clock) {
        if (out == null || clock == null) {
            throw new IllegalArgumentException("out and clock must not be null");
        }
        if (total < 0 || kept < 0) {
            throw new IllegalArgumentException("total and kept must be >= 0, were " + total + ", " + kept);
        }
        this.out = out;
        this.interactive = interactive;
        this.clock = clock;
        this.start = clock.instant();
        this.waiting = total;
        this.done = kept;
    }

    public synchronized void started(String label) {
        waiting--;
        running++;
        show("started " + label);
    }

    public synchronized void finished(String label, double wallSeconds) {
        running--;
        done++;
        show(String.format(Locale.ROOT, "finished %s in %s", label, ProgressDisplay.clockTime(wallSeconds)));
    }

    public synchronized void failed(String label, String message) {
        running--;
        failed++;
        if (interactive) {
            clearLine();
            out.println("failed " + label + ": " + message);
        }
        show("failed " + label + ": " + message);
    }

    /** An analysis stopped resumably (termination signal) at a checkpoint: it counts as waiting again. */
    public synchronized void stopped(String label) {
        running--;
        waiting++;
        show("stopped " + label + " at a checkpoint (resumable)");
    }

    /** The counts line as it is now. */
    public synchronized String counts() {
        double seconds = Duration.between(start, clock.instant()).toNanos() / 1e9;
        return String.format(Locale.ROOT, "analyses: %d done, %d running, %d failed, %d waiting  %s", done, running,
                failed, waiting, ProgressDisplay.clockTime(Math.max(0, seconds)));
    }

    private void show(String event) {
        String line = counts();
        if (interactive) {
            out.print("\r" + line + " ".repeat(Math.max(0, shownLength - line.length())));
            shownLength = line.length();
        } else {
            out.println(STAMP.format(clock.instant().truncatedTo(ChronoUnit.SECONDS)) + " " + line + "  (" + event + ")");
        }
        out.flush();
    }

    private void clearLine() {
        if (shownLength > 0) {
            out.print("\r" + " ".repeat(shownLength) + "\r");
            shownLength = 0;
        }
    }

    /** Ends the live line, if one is showing. */
    @Override
    public synchronized void close() {
        if (interactive && shownLength > 0) {
            out.println();
            shownLength = 0;
            out.flush();
        }
    }
}
