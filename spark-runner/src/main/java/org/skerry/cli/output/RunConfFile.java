package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;

/**
 * Writes {@code run.conf}: the resolved settings of a run, as text the caller renders in run-file
 * syntax, so that the run can be repeated from its own folder. A first comment line names the
 * program version that wrote it; the text ends with a line break.
 */
public final class RunConfFile {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "run.conf";

    private RunConfFile() {
    }

    /**
     * Writes {@code run.conf} in {@code folder}, atomically.
     *
     * @param programVersion the version of this program, or null to write no header line
     * @param settingsText   the resolved settings in run-file syntax
     * @return the file written
     */
    public static Path write(Path folder, String programVersion, String settingsText) throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (settingsText == null) {
            throw new IllegalArgumentException("settingsText must not be null");
        }
        StringBuilder text = new StringBuilder();
        if (programVersion != null) {
            text.append("# resolved settings, written by skerry ").append(programVersion.replaceAll("\\s+", " ").strip()).append('\n');
        }
        text.append(settingsText);
        if (!settingsText.isEmpty() && !settingsText.endsWith("\n")) {
            text.append('\n');
        }
        Path file = folder.resolve(FILE_NAME);
        AtomicFile.writeString(file, text.toString());
        return file;
    }
}
