package org.skerry.cli.runfile;

import java.time.Duration;
import org.skerry.engine.settings.SettingsReader;

/**
 * When one invocation of a run stops on a checkpoint although the sampler has not finished.
 *
 * @param maxWallTime      the wall-time limit of one invocation, or null for none
 * @param stopGraceSeconds on SIGTERM, finish the iteration in flight only if it is expected to end
 *                         within this many seconds
 */
public record LimitSpec(Duration maxWallTime, int stopGraceSeconds) {

    /** Reads and checks the {@code limits} keys. */
    static LimitSpec read(SettingsReader r) {
        Duration maxWallTime = r.has("limits.max-wall-time") ? r.duration("limits.max-wall-time") : null;
        return new LimitSpec(maxWallTime, r.integer("limits.stop-grace-seconds", 1, 86_400));
    }
}
