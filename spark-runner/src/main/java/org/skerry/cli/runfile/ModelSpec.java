package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import org.skerry.engine.settings.SettingsReader;

/**
 * The model a run file chooses and the data bound to it: a built-in model by name or a model class,
 * its settings, the data (a file or an inline object) and the explicit role-to-column bindings.
 *
 * @param name           the built-in model's name ({@code model.name}), or null when a class is given
 * @param className      the model class's name ({@code model.class}), or null when a name is given
 * @param settings       the {@code model.settings} object
 * @param dataFile       the data file, absolute and normalised, or null
 * @param inlineData     the {@code data.inline} object, or null
 * @param columnBindings role-to-column bindings ({@code data.columns}) in the order written
 */
public record ModelSpec(String name, String className, Config settings, Path dataFile, Config inlineData,
        Map<String, String> columnBindings) {

    public ModelSpec {
        if ((name == null) == (className == null)) {
            throw new IllegalArgumentException("exactly one of name and className must be set, was " + name
                    + " and " + className);
        }
        Objects.requireNonNull(settings, "settings");
        if (dataFile != null && inlineData != null) {
            throw new IllegalArgumentException("dataFile and inlineData must not both be set");
        }
        columnBindings = Collections.unmodifiableMap(new LinkedHashMap<>(
                Objects.requireNonNull(columnBindings, "columnBindings")));
    }

    /** A label for outputs: the model name or class. */
    public String label() {
        return name != null ? name : className;
    }

    /** Reads and checks the {@code model} and {@code data} keys of {@code file}. */
    static ModelSpec read(SettingsReader r, RunFile file) {
        Config c = r.config();
        String modelName = r.text("model.name");
        String modelClass = r.text("model.class");
        if ((modelName == null) == (modelClass == null)) {
            String choose = "model.name (a built-in model, see `skerry models`) or model.class (a class on the classpath)";
            if (modelName != null) {
                throw new RunFileException(RunFile.describe(c.getValue("model.class").origin()) + ": model.name = \""
                        + modelName + "\" and model.class = \"" + modelClass + "\": set only one of " + choose);
            }
            // Neither is set: the defaults (reference.conf) hold the only "model" there is, so name the run file.
            throw new RunFileException(RunFile.shorten(file.path()) + ": "
                    + (isEmpty(file.path()) ? "the run file is empty; " : "the run file sets no model; ")
                    + "set " + choose + " (every other setting has a default, listed in reference.conf)");
        }
        Config settings = r.object("model.settings");
        String data = r.text("data.file");
        Path dataFile = data == null ? null : folderOf(c.getValue("data.file"), file).resolve(data).normalize();
        Config inlineData = c.getIsNull("data.inline") ? null : r.object("data.inline");
        if (dataFile != null && inlineData != null) {
            throw r.error("data.inline", "set data.file or data.inline, not both");
        }
        Map<String, String> columnBindings = new LinkedHashMap<>();
        for (Map.Entry<String, ConfigValue> entry : r.object("data.columns").root().entrySet()) {
            if (entry.getValue().valueType() != ConfigValueType.STRING) {
                throw r.error("data.columns." + entry.getKey(), "expected the name of a data column");
            }
            columnBindings.put(entry.getKey(), (String) entry.getValue().unwrapped());
        }
        return new ModelSpec(modelName, modelClass, settings, dataFile, inlineData, columnBindings);
    }

    /**
     * The folder a relative path in {@code value} is read from: that of the file it is written in
     * (an included file's own folder), else the run file's (a --set override, a batch's layers).
     */
    static Path folderOf(ConfigValue value, RunFile file) {
        String written = value.origin().filename();
        Path in = written != null ? Path.of(written) : file.path();
        return in.toAbsolutePath().getParent();
    }

    private static boolean isEmpty(Path path) {
        try {
            return Files.readAllLines(path).stream().map(String::strip)
                    .allMatch(line -> line.isEmpty() || line.startsWith("#") || line.startsWith("//"));
        } catch (java.io.IOException | RuntimeException e) {
            return false;
        }
    }
}
