package org.skerry.cli;

import java.util.List;
import picocli.CommandLine.Option;

/**
 * The options {@code run} and {@code resume} share for where and how long a run goes: they stand
 * for run-file overrides, and never change the answer.
 */
final class WhereOptions {

    @Option(names = "--master", paramLabel = "URL",
            description = "run on this Spark master (e.g. spark://127.0.0.1:7077); same as --set backend.master=URL")
    String master;

    @Option(names = "--max-wall-time", paramLabel = "DURATION",
            description = "stop at a checkpoint (exit 75, resumable) rather than start an iteration that would end "
                    + "after this much wall time, e.g. 11h30m or 90m; same as --set limits.max-wall-time=DURATION")
    String maxWallTime;

    /** Adds the overrides these options stand for, after the user's own. */
    void addTo(List<String> overrides) {
        if (master != null) {
            overrides.add("backend.kind=spark");
            overrides.add("backend.master=\"" + master + "\"");
        }
        if (maxWallTime != null) {
            overrides.add("limits.max-wall-time=\"" + maxWallTime + "\"");
        }
    }
}
