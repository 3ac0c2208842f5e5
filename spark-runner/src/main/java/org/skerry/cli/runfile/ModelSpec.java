package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import com.typesafe.config.ConfigValueFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.program.ProgramModelFactory;
import org.skerry.engine.program.ProgramSettings;
import org.skerry.engine.settings.SettingsReader;

/**
 * The model a run file chooses and the data bound to it: a built-in model by name, a model class or
 * a program ({@code model.program}), its settings, the data (a file or an inline object) and the
 * explicit role-to-column bindings.
 *
 * @param name           the built-in model's name ({@code model.name}), or null when a class is given
 * @param className      the model class's name ({@code model.class}; for a program, its factory's),
 *                       or null when a name is given
 * @param settings       the {@code model.settings} object, or for a program the {@code model.program}
 *                       object with its paths made absolute
 * @param dataFile       the data file, absolute and normalised, or null
 * @param inlineData     the {@code data.inline} object, or null
 * @param columnBindings role-to-column bindings ({@code data.columns}) in the order written
 * @param program        whether the model is a program ({@code model.program})
 */
public record ModelSpec(String name, String className, Config settings, Path dataFile, Config inlineData,
        Map<String, String> columnBindings, boolean program) {

    /** Where a program model's settings sit in a run file. */
    public static final String PROGRAM_KEY = "model.program";

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

    /** A label for outputs: the model name or class, or "program". */
    public String label() {
        return program ? "program" : name != null ? name : className;
    }

    /** Where the model's own settings sit in the run file ({@code model.settings} or {@code model.program}). */
    public String settingsKey() {
        return program ? PROGRAM_KEY : "model.settings";
    }

    /** Reads and checks the {@code model} and {@code data} keys of {@code file}. */
    static ModelSpec read(SettingsReader r, RunFile file) {
        Config c = r.config();
        String modelName = r.text("model.name");
        String modelClass = r.text("model.class");
        if (r.has(PROGRAM_KEY)) {
            return readProgram(r, file, modelName, modelClass);
        }
        if ((modelName == null) == (modelClass == null)) {
            String choose = "model.name (a built-in model, see `skerry models`), model.class (a class on the "
                    + "classpath) or model.program (your own program)";
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
        return new ModelSpec(modelName, modelClass, settings, dataFile, inlineData, columnBindings, false);
    }

    /**
     * Reads {@code model.program}: checks every setting (located errors), then makes its paths
     * absolute — each file in {@code files}, the {@code scratch} folder, and each command element
     * that starts with {@code ./} or {@code ../} — from the folder of the file that writes them,
     * since the program runs in a scratch folder of its own. A program reads its own files, so {@code data} must stay unset.
     */
    private static ModelSpec readProgram(SettingsReader r, RunFile file, String modelName, String modelClass) {
        Config c = r.config();
        if (modelName != null || modelClass != null) {
            String other = modelName != null ? "model.name" : "model.class";
            throw r.error(other, "set only one of model.name, model.class and model.program");
        }
        for (String key : List.of("data.file", "data.inline")) {
            if (r.has(key)) {
                throw r.error(key, "a program model reads its own files: list them in model.program.files, which "
                        + "hands each to the program by absolute path");
            }
        }
        if (!r.object("data.columns").isEmpty()) {
            throw r.error("data.columns", "a program model binds no data columns");
        }
        if (c.getValue(PROGRAM_KEY).valueType() != com.typesafe.config.ConfigValueType.OBJECT) {
            throw r.error(PROGRAM_KEY, "expected an object { command = [...], parameters = [...] }");
        }
        Config raw = r.object(PROGRAM_KEY);
        if (raw.hasPath("input-template") && raw.getValue("input-template").valueType()
                == com.typesafe.config.ConfigValueType.STRING) {
            // Read the template from the run file's folder, as every path of the run file is.
            Path template = folderOf(raw.getValue("input-template"), file).resolve(raw.getString("input-template"))
                    .normalize();
            raw = raw.withValue("input-template", ConfigValueFactory.fromAnyRef(template.toString(),
                    RunFile.describe(raw.getValue("input-template").origin())));
        }
        ProgramSettings.read(ModelSettings.of(raw, PROGRAM_KEY, Map.of(), "no data"));
        Config resolved = raw;
        SettingsReader p = SettingsReader.of(raw, PROGRAM_KEY);
        List<String> command = new ArrayList<>(raw.getStringList("command"));
        for (int i = 0; i < command.size(); i++) {
            String element = command.get(i);
            if (element.startsWith("./") || element.startsWith("../")) {
                command.set(i, folderOf(raw.getValue("command"), file).resolve(element).normalize().toString());
            }
        }
        resolved = resolved.withValue("command", ConfigValueFactory.fromIterable(command));
        if (raw.hasPath("scratch")) {
            // As every other path of the run file: from the folder of the file that writes it, not
            // from wherever skerry happens to be started (a resume from elsewhere must find it too).
            Path scratch = folderOf(raw.getValue("scratch"), file).resolve(raw.getString("scratch")).normalize();
            resolved = resolved.withValue("scratch", ConfigValueFactory.fromAnyRef(scratch.toString(),
                    RunFile.describe(raw.getValue("scratch").origin())));
        }
        if (raw.hasPath("files")) {
            List<String> files = new ArrayList<>();
            for (String written : raw.getStringList("files")) {
                Path path = folderOf(raw.getValue("files"), file).resolve(written).normalize();
                if (!Files.isRegularFile(path) || !Files.isReadable(path)) {
                    throw p.error("files", "file " + path + (Files.exists(path) ? " cannot be read" : " does not exist"));
                }
                files.add(path.toString());
            }
            resolved = resolved.withValue("files", ConfigValueFactory.fromIterable(files));
        }
        return new ModelSpec(null, ProgramModelFactory.class.getName(), resolved, null, null, Map.of(), true);
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
