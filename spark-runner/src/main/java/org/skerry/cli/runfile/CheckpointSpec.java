package org.skerry.cli.runfile;

import org.skerry.checkpoint.CheckpointFileSystem;
import org.skerry.engine.settings.SettingsReader;

/**
 * Whether, where and how often a run writes checkpoints, and how many it keeps.
 *
 * @param enabled         whether checkpoints are written
 * @param path            the checkpoint root as given (a path or URI), or null for the run
 *                        folder's {@code checkpoints/}
 * @param everyIterations iterations between checkpoints
 * @param everyMinutes    minutes between checkpoints, or 0 to count iterations instead
 * @param keep            how many complete checkpoints are kept
 */
public record CheckpointSpec(boolean enabled, String path, int everyIterations, double everyMinutes, int keep) {

    /** Reads and checks the {@code checkpoint} keys. */
    static CheckpointSpec read(SettingsReader r) {
        boolean enabled = r.bool("checkpoint.enabled");
        String path = r.text("checkpoint.path");
        if (path != null && path.isBlank()) {
            throw r.error("checkpoint.path", "must name a folder or URI, or be null for the run folder's checkpoints/");
        }
        if (path != null) {
            try {
                new org.apache.hadoop.fs.Path(path);
            } catch (IllegalArgumentException e) {
                throw r.error("checkpoint.path", "is not a path or URI: " + e.getMessage());
            }
            String unsupported = enabled ? CheckpointFileSystem.unsupportedOnThisJava(path) : null;
            if (unsupported != null) {
                throw r.error("checkpoint.path", unsupported);
            }
        }
        int everyIterations = r.integer("checkpoint.every-iterations", 1, 1_000_000);
        double everyMinutes = r.number("checkpoint.every-minutes", 0, true, 100_000, true);
        int keep = r.integer("checkpoint.keep", 1, 1000);
        return new CheckpointSpec(enabled, path, everyIterations, everyMinutes, keep);
    }
}
