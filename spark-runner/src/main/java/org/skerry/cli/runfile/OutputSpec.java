package org.skerry.cli.runfile;

import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Objects;
import org.skerry.cli.output.ParticlesFormat;
import org.skerry.engine.settings.SettingsReader;

/**
 * Where a run's files go and how its progress is shown.
 *
 * @param folder   the folder the run folder is made in
 * @param progress how progress is shown
 * @param report   whether a finished run writes its report (report/index.html and figures)
 * @param particles which files hold the final population (particles.csv, particles.arrow)
 */
public record OutputSpec(Path folder, Progress progress, boolean report, ParticlesFormat particles) {

    /** How progress is shown. */
    public enum Progress { AUTO, LIVE, LOG, OFF }

    public OutputSpec {
        Objects.requireNonNull(folder, "folder");
        Objects.requireNonNull(progress, "progress");
        Objects.requireNonNull(particles, "particles");
    }

    /** Reads and checks the {@code output} keys. */
    static OutputSpec read(SettingsReader r) {
        String folder = r.text("output.folder");
        if (folder == null || folder.isBlank()) {
            throw r.error("output.folder", "must name a folder");
        }
        Progress progress = Progress.valueOf(r.choice("output.progress", List.of("auto", "live", "log", "off"))
                .toUpperCase(Locale.ROOT));
        ParticlesFormat particles = ParticlesFormat.valueOf(r.choice("output.particles-format",
                List.of("auto", "csv", "arrow", "both")).toUpperCase(Locale.ROOT));
        return new OutputSpec(Path.of(folder), progress, r.bool("output.report"), particles);
    }
}
