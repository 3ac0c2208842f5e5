package org.skerry.cli.progress;

import java.io.PrintWriter;
import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.format.DateTimeFormatter;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;
import org.skerry.cli.output.ParameterValues;
import org.skerry.engine.sampler.IterationListener;
import org.skerry.engine.sampler.IterationRecord;

/**
 * Shows a run's progress after each iteration: iteration, temperature (φ, the {@code temperature}
 * column of iterations.csv; for an ABC run the tolerance and the share within it), ESS, acceptance
 * rate, likelihood evaluations (or simulations) per second, elapsed time
 * and an estimate of the time left. On a terminal ({@code interactive}) it keeps rewriting one
 * line, ending it when the temperature reaches 1 or on {@link #close()}; otherwise (a log file, a
 * pipe) it prints one line per iteration, stamped with the UTC time and, when it has one, the
 * run's name. {@link #announce} says which analysis starts.
 *
 * <p>The estimate of time left assumes that log φ advances at a steady pace per second: adaptive
 * tempering takes small steps at first and grows φ roughly geometrically once the likelihood
 * dominates, so progress measured on φ itself would predict far too much time early on. The pace
 * is measured from the end of the first tempering iteration (the initial draw is left out, its
 * cost is different), so there is no estimate until the second. It is shown with a {@code ~}.
 *
 * <p>φ is shown rounded down to 4 decimals, so {@code 1.0000} appears only when the run is done;
 * below 0.001 (early iterations of a sharp likelihood) with three significant digits instead
 * ({@code 2.31e-06}), so that it does not read as zero.
 * <p>After an iteration with invalid likelihood evaluations it writes one warning line (in both
 * forms) with their count and the lowest-indexed failing particle: its parameter values and the
 * reason.
 *
 * <p>Elapsed time starts when the display is made. Thread-safe; never closes the stream.
 */
public final class ProgressDisplay implements IterationListener, AutoCloseable {

    private static final DateTimeFormatter STAMP = DateTimeFormatter.ISO_INSTANT;

    private final PrintWriter out;
    private final boolean interactive;
    private final Clock clock;
    private final Instant start;
    private final List<String> parameterNames;
    private final String label;

    private long evaluations;
    private Instant paceStart;
    private double paceStartLogTemperature;
    private int shownLength;
    private boolean lineOpen;

    /** A display timed by the system clock. */
    public ProgressDisplay(PrintWriter out, boolean interactive) {
        this(out, interactive, Clock.systemUTC());
    }

    /** A display timed by the system clock that names failing particles' parameters. */
    public ProgressDisplay(PrintWriter out, boolean interactive, List<String> parameterNames) {
        this(out, interactive, Clock.systemUTC(), parameterNames);
    }

    /**
     * @param out         where to write
     * @param interactive rewrite one line (a terminal) rather than print one line per iteration
     * @param clock       the source of elapsed time and time stamps
     */
    public ProgressDisplay(PrintWriter out, boolean interactive, Clock clock) {
        this(out, interactive, clock, null);
    }

    /**
     * @param parameterNames the model's parameter names, for warnings about failing particles, or
     *                       null to name values by position
     */
    public ProgressDisplay(PrintWriter out, boolean interactive, Clock clock, List<String> parameterNames) {
        this(out, interactive, clock, parameterNames, null);
    }

    /**
     * @param label the run's name, put on every line in log mode (a terminal line has no room for
     *              it: {@link #announce} names the run before it starts), or null
     */
    public ProgressDisplay(PrintWriter out, boolean interactive, Clock clock, List<String> parameterNames,
            String label) {
        if (out == null) {
            throw new IllegalArgumentException("out must not be null");
        }
        if (clock == null) {
            throw new IllegalArgumentException("clock must not be null");
        }
        this.out = out;
        this.interactive = interactive;
        this.clock = clock;
        this.start = clock.instant();
        this.parameterNames = parameterNames == null ? null : List.copyOf(parameterNames);
        this.label = label == null || label.isEmpty() ? null : label;
    }

    /** Writes one line naming the analysis that starts (e.g. its name, model, N and run folder). */
    public synchronized void announce(String text) {
        if (lineOpen) {
            endLine();
        }
        out.println(interactive ? text : STAMP.format(clock.instant().truncatedTo(ChronoUnit.SECONDS)) + " " + text);
        out.flush();
    }

    @Override
    public synchronized void iterationFinished(IterationRecord record) {
        Instant now = clock.instant();
        evaluations += record.evaluations();
        double phi = record.temperature();
        boolean done = phi >= 1.0;
        String remaining = done ? "done" : estimate(record, now);
        if (record.iteration() == 1 || (paceStart == null && phi > 0 && !done)) {
            paceStart = now;
            paceStartLogTemperature = StrictMath.log(phi);
        }
        Duration elapsed = nonNegative(Duration.between(start, now));
        String fields = fields(record, elapsed, remaining);
        if (interactive) {
            StringBuilder line = new StringBuilder("\r").append(fields);
            // Spaces over whatever the previous, longer line left behind.
            line.append(" ".repeat(Math.max(0, shownLength - fields.length())));
            shownLength = fields.length();
            out.print(line);
            lineOpen = true;
            if (done) {
                endLine();
            }
        } else {
            out.println(STAMP.format(now.truncatedTo(ChronoUnit.SECONDS)) + " " + (label == null ? "" : label + "  ")
                    + fields);
        }
        if (record.invalidEvaluations() > 0) {
            if (lineOpen) {
                endLine();
            }
            out.println(STAMP.format(now.truncatedTo(ChronoUnit.SECONDS)) + " " + warning(record));
        }
        out.flush();
    }

    /** Ends the live line, if one is showing. */
    @Override
    public synchronized void close() {
        if (lineOpen) {
            endLine();
            out.flush();
        }
    }

    private void endLine() {
        out.println();
        lineOpen = false;
        shownLength = 0;
    }

    private String warning(IterationRecord record) {
        String text = String.format(Locale.ROOT, "warning: iter %d: %d of %d likelihood evaluations invalid (%.1f%%)",
                record.iteration(), record.invalidEvaluations(), record.evaluations(),
                100.0 * record.invalidEvaluations() / Math.max(1, record.evaluations()));
        if (record.retriedEvaluations() > 0) {
            text += "; " + record.retriedEvaluations() + " retried, " + record.failedAfterRetries() + " still invalid";
        }
        if (record.firstInvalidIndex() >= 0) {
            text += "; first: particle " + record.firstInvalidIndex() + " at "
                    + ParameterValues.text(parameterNames, record.firstInvalidParameters(), ", ") + ": "
                    + record.firstInvalidReason();
        }
        return text;
    }

    private String estimate(IterationRecord record, Instant now) {
        double phi = record.temperature();
        if (paceStart == null || !(phi > 0)) {
            return "left ?";
        }
        double covered = StrictMath.log(phi) - paceStartLogTemperature;
        double seconds = Duration.between(paceStart, now).toNanos() / 1e9;
        if (!(covered > 0) || !(seconds > 0)) {
            return "left ?";
        }
        double left = seconds * -StrictMath.log(phi) / covered;
        return "left ~" + clockTime(left);
    }

    private String fields(IterationRecord record, Duration elapsed, String remaining) {
        double seconds = elapsed.toNanos() / 1e9;
        String rate = seconds > 0 ? count(evaluations / seconds) : "-";
        String acceptance = Double.isNaN(record.acceptanceRate()) ? "-"
                : String.format(Locale.ROOT, "%.0f%%", 100 * record.acceptanceRate());
        if (record.abc() != null) {
            // An ABC run walks down a tolerance, not up a temperature; its evaluations are simulations.
            return String.format(Locale.ROOT, "iter %d  tolerance %s  within %.0f%%  ESS %.0f  acc %s  %s sim/s  %s  %s",
                    record.iteration(), tolerance(record.abc().tolerance()), 100 * record.abc().shareWithin(),
                    record.ess(), acceptance, rate, clockTime(seconds), remaining);
        }
        return String.format(Locale.ROOT, "iter %d  temperature %s  ESS %.0f  acc %s  %s eval/s  %s  %s",
                record.iteration(), temperature(record.temperature()), record.ess(), acceptance, rate,
                clockTime(seconds), remaining);
    }

    /** A tolerance to four significant digits: {@code -} for the prior draw's (infinite) one. */
    static String tolerance(double epsilon) {
        if (Double.isInfinite(epsilon)) {
            return "-";
        }
        return new BigDecimal(epsilon).round(new MathContext(4, RoundingMode.HALF_EVEN)).stripTrailingZeros()
                .toPlainString();
    }

    /** 0, 2.31e-06 (below 0.001), 0.0230, 0.9999, 1.0000. */
    static String temperature(double phi) {
        if (!Double.isFinite(phi)) {
            return String.valueOf(phi);
        }
        if (phi == 0) {
            return "0";
        }
        if (Math.abs(phi) < 1e-3) {
            return String.format(Locale.ROOT, "%.2e", phi);
        }
        return new BigDecimal(phi).setScale(4, RoundingMode.DOWN).toPlainString();
    }

    /** 950, 12.3k, 4.5M: wide enough to read, narrow enough for one line. */
    private static String count(double perSecond) {
        if (perSecond < 10_000) {
            return String.format(Locale.ROOT, "%.0f", perSecond);
        }
        if (perSecond < 10_000_000) {
            return String.format(Locale.ROOT, "%.1fk", perSecond / 1e3);
        }
        return String.format(Locale.ROOT, "%.1fM", perSecond / 1e6);
    }

    /** h:mm:ss. */
    static String clockTime(double seconds) {
        if (!(seconds < Long.MAX_VALUE / 2.0)) {
            return "?";
        }
        long whole = Math.max(0, Math.round(seconds));
        return String.format(Locale.ROOT, "%d:%02d:%02d", whole / 3600, whole / 60 % 60, whole % 60);
    }

    private static Duration nonNegative(Duration d) {
        return d.isNegative() ? Duration.ZERO : d;
    }
}
