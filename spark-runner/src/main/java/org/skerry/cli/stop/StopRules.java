package org.skerry.cli.stop;

import java.time.Duration;
import java.util.Locale;
import org.skerry.engine.sampler.SamplerState;
import org.skerry.engine.sampler.StopCondition;

/**
 * The command line's reasons to stop between iterations: a termination signal arrived, or the
 * next iteration — predicted from the longest of the last few — would not fit in the wall time
 * left of {@code --max-wall-time}, counted from this invocation's start.
 */
public final class StopRules implements StopCondition {

    private final TerminationSignal signal;
    private final Duration maxWallTime;
    private final long startNanos;

    /** @param maxWallTime the limit, or null for none */
    public StopRules(TerminationSignal signal, Duration maxWallTime, long startNanos) {
        this.signal = signal;
        this.maxWallTime = maxWallTime;
        this.startNanos = startNanos;
    }

    @Override
    public boolean urgent() {
        return signal.received();
    }

    @Override
    public String reasonToStop(SamplerState state, double predictedSeconds) {
        signal.iterationStarting(predictedSeconds);
        if (signal.received()) {
            return signal.description() + " arrived";
        }
        if (maxWallTime != null) {
            double elapsed = (System.nanoTime() - startNanos) * 1e-9;
            double limit = maxWallTime.toMillis() / 1000.0;
            if (elapsed + predictedSeconds > limit) {
                return String.format(Locale.ROOT, "the next iteration (about %.1f s) would not fit in the wall time "
                        + "left (%.1f s of the %s limit)", predictedSeconds, Math.max(0, limit - elapsed),
                        format(maxWallTime));
            }
        }
        return null;
    }

    static String format(Duration duration) {
        return duration.toString().substring(2).toLowerCase(Locale.ROOT);
    }
}
