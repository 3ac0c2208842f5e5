package org.skerry.engine.settings;

import com.typesafe.config.ConfigOrigin;
import java.nio.file.Path;

/** Where a setting is written, as error messages show it: {@code run.conf: line 12}. */
public final class Origins {

    private Origins() {
    }

    /**
     * A file as "path: line N" (the path shortened by {@link #shorten}), a class-path resource as
     * "name: line N", anything else (a {@code --set} override, settings built in memory) by its
     * description.
     */
    public static String describe(ConfigOrigin origin) {
        if (origin.filename() != null) {
            Path file = shorten(Path.of(origin.filename()));
            return origin.lineNumber() > 0 ? file + ": line " + origin.lineNumber() : file.toString();
        }
        if (origin.resource() != null) {
            return origin.resource() + (origin.lineNumber() > 0 ? ": line " + origin.lineNumber() : "");
        }
        // "--set key=value: 1": the line number of a one-line override says nothing.
        return origin.description().replaceFirst(": \\d+(-\\d+)?$", "");
    }

    /** The path relative to the working folder when it lies below it, else as it is. */
    public static Path shorten(Path file) {
        Path here = Path.of("").toAbsolutePath();
        Path absolute = file.toAbsolutePath().normalize();
        return absolute.startsWith(here) ? here.relativize(absolute) : absolute;
    }
}
