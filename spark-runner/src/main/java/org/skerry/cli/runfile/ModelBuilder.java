package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import java.lang.reflect.Constructor;
import java.lang.reflect.InvocationTargetException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.skerry.cli.data.CsvDataReader;
import org.skerry.cli.data.DataException;
import org.skerry.cli.data.DataTable;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds the model a run file asks for: reads its data (CSV file or inline), binds data columns
 * to the model's roles, and creates the model from a built-in factory or a user class. Every
 * failure is bad input and becomes a {@link RunFileException}.
 */
public final class ModelBuilder {

    private ModelBuilder() {
    }

    /**
     * The model with its data, the data table it read (or null without data), and a portable
     * source that rebuilds the same model on another JVM.
     */
    public record Built(Model model, DataTable data, RunModelSource source) {
    }

    public static Built build(RunSpec spec) {
        DataTable data = readData(spec);
        Map<String, double[]> columns = bind(spec, data);
        String dataSource = data == null ? "the run file (no data)" : data.source();
        if (spec.modelName() != null) {
            ModelFactory factory = ModelCatalog.load().find(spec.modelName()).orElseThrow(() -> new RunFileException(
                    where(spec, "model.name") + ": unknown model '" + spec.modelName() + "'; built-in models: "
                            + names() + suggestion(spec.modelName())));
            checkModelKeys(spec, factory);
        }
        RunModelSource source = new RunModelSource(spec.modelName(), spec.modelClass(), spec.modelSettings(), columns,
                dataSource);
        Model model;
        ConfigModelSettings settings = ConfigModelSettings.of(spec.modelSettings(), columns, dataSource);
        try {
            model = create(spec.modelName(), spec.modelClass(), settings, where(spec, "model.class"));
        } catch (IllegalArgumentException e) {
            // A setting the run file leaves out is located in the jar's reference.conf, which the
            // user never wrote: name the run file instead.
            String message = String.valueOf(e.getMessage()).replaceFirst("^reference\\.conf(: line \\d+)?: ",
                    java.util.regex.Matcher.quoteReplacement(RunFile.shorten(spec.file().path()) + ": "));
            throw new RunFileException("model " + spec.modelLabel() + ": " + message, e);
        }
        checkBindingsRead(spec, settings.rolesRead());
        return new Built(model, data, source);
    }

    /**
     * Refuses a {@code data.columns} binding whose role the model never read: a misspelt role
     * would otherwise leave the column unused while the model reads another (or none).
     */
    private static void checkBindingsRead(RunSpec spec, java.util.Set<String> read) {
        for (Map.Entry<String, String> binding : spec.columnBindings().entrySet()) {
            String role = binding.getKey();
            if (read.contains(role)) {
                continue;
            }
            String closest = KeySuggestion.closest(role, read);
            throw new RunFileException(where(spec, "data.columns." + role) + ": data.columns." + role + " = \""
                    + binding.getValue() + "\": model " + spec.modelLabel() + " reads no data role '" + role + "'"
                    + (closest == null ? "" : " — did you mean '" + closest + "'?")
                    + (read.isEmpty() ? " (it reads no data" : " (the roles it read: " + String.join(", ", read))
                    + (spec.modelName() != null ? "; `skerry models` lists each model's roles)" : ")"));
        }
    }

    /** Creates the model from a built-in name or a class name; the same code runs on executors. */
    static Model create(String modelName, String modelClass, ModelSettings settings, String where) {
        Model model = modelName != null ? ModelCatalog.load().get(modelName).create(settings)
                : fromClass(modelClass, settings, where);
        if (model == null) {
            throw new RunFileException("model " + (modelName != null ? modelName : modelClass)
                    + ": the factory returned no model");
        }
        return model;
    }

    private static String where(RunSpec spec, String key) {
        return RunFile.where(spec.file().config(), key);
    }

    private static List<String> names() {
        List<String> names = new ArrayList<>();
        ModelCatalog.load().factories().forEach(f -> names.add(f.name()));
        return names;
    }

    private static String suggestion(String name) {
        String closest = KeySuggestion.closest(name, names());
        return closest == null ? "" : "; did you mean '" + closest + "'?";
    }

    private static DataTable readData(RunSpec spec) {
        try {
            if (spec.dataFile() != null) {
                return CsvDataReader.read(spec.dataFile());
            }
            if (spec.inlineData() != null) {
                return inline(spec);
            }
            return null;
        } catch (DataException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    private static DataTable inline(RunSpec spec) {
        Config inline = spec.inlineData();
        String where = RunFile.describe(inline.origin());
        List<String> columns;
        List<?> rows;
        try {
            columns = inline.getStringList("columns");
            rows = inline.getList("rows").unwrapped();
        } catch (ConfigException.Missing e) {
            throw new RunFileException(where + ": data.inline needs columns = [names] and rows = [[numbers], …]");
        } catch (ConfigException.WrongType | ClassCastException e) {
            throw new RunFileException(where + ": data.inline needs columns = [names] and rows = [[numbers], …]: "
                    + e.getMessage());
        }
        List<double[]> values = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            Object row = rows.get(i);
            if (!(row instanceof List) || ((List<?>) row).size() != columns.size()) {
                throw new RunFileException(where + ": data.inline.rows[" + i + "] must list " + columns.size()
                        + " numbers (" + String.join(", ", columns) + ")");
            }
            List<?> cells = (List<?>) row;
            double[] parsed = new double[cells.size()];
            for (int j = 0; j < parsed.length; j++) {
                if (!(cells.get(j) instanceof Number)) {
                    throw new RunFileException(where + ": data.inline.rows[" + i + "], column " + columns.get(j)
                            + ": '" + cells.get(j) + "' is not a number");
                }
                parsed[j] = ((Number) cells.get(j)).doubleValue();
                if (!Double.isFinite(parsed[j])) {
                    throw new RunFileException(where + ": data.inline.rows[" + i + "], column " + columns.get(j)
                            + ": value is not finite");
                }
            }
            values.add(parsed);
        }
        try {
            return DataTable.fromRows("inline data (" + where + ")", columns, values);
        } catch (DataException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    /** Every data column under its own name, then the explicit role bindings. */
    private static Map<String, double[]> bind(RunSpec spec, DataTable data) {
        Map<String, double[]> columns = new LinkedHashMap<>();
        if (data == null) {
            if (!spec.columnBindings().isEmpty()) {
                throw new RunFileException(where(spec, "data.columns") + ": data.columns binds roles but the run "
                        + "file has no data (set data.file or data.inline)");
            }
            return columns;
        }
        for (String name : data.columns()) {
            columns.put(name, data.column(name));
        }
        for (Map.Entry<String, String> binding : spec.columnBindings().entrySet()) {
            if (!data.columns().contains(binding.getValue())) {
                throw new RunFileException(where(spec, "data.columns." + binding.getKey()) + ": data.columns."
                        + binding.getKey() + " = \"" + binding.getValue() + "\": " + data.source()
                        + " has no such column; its columns: " + data.columns());
            }
            columns.put(binding.getKey(), data.column(binding.getValue()));
        }
        return columns;
    }

    /** Refuses keys under model.settings that the factory does not read. */
    private static void checkModelKeys(RunSpec spec, ModelFactory factory) {
        List<String> declared = new ArrayList<>();
        for (SettingDescription description : factory.settings()) {
            declared.add(description.key());
        }
        List<String> leaves = new ArrayList<>();
        spec.modelSettings().entrySet().forEach(e -> leaves.add(e.getKey()));
        for (String key : leaves) {
            boolean known = false;
            for (String d : declared) {
                if (key.equals(d) || key.startsWith(d + ".") || d.startsWith(key + ".")) {
                    known = true;
                    break;
                }
            }
            if (!known) {
                String closest = KeySuggestion.closest(key, declared);
                throw new RunFileException(where(spec, "model.settings." + key) + ": model " + factory.name()
                        + " has no setting '" + key + "'" + (closest == null ? "" : "; did you mean '" + closest + "'?")
                        + " (its settings: " + declared + ")");
            }
        }
    }

    private static Model fromClass(String className, ModelSettings settings, String where) {
        Class<?> type;
        try {
            type = Class.forName(className, true, Thread.currentThread().getContextClassLoader());
        } catch (ClassNotFoundException | LinkageError e) {
            throw new RunFileException(where + ": model.class = \"" + className + "\": "
                    + (e instanceof ClassNotFoundException ? "class not found on the classpath"
                            : "the class cannot be loaded (" + e + ")")
                    + "; put its jar on SKERRY_CLASSPATH (SKERRY_CLASSPATH=/path/model.jar bin/skerry …) and, for "
                    + "executors of their own (a cluster, local-cluster), also list it in backend.jars", e);
        }
        try {
            if (ModelFactory.class.isAssignableFrom(type)) {
                ModelFactory factory = (ModelFactory) type.getConstructor().newInstance();
                return factory.create(settings);
            }
            if (Model.class.isAssignableFrom(type)) {
                try {
                    Constructor<?> withSettings = type.getConstructor(ModelSettings.class);
                    return (Model) withSettings.newInstance(settings);
                } catch (NoSuchMethodException e) {
                    return (Model) type.getConstructor().newInstance();
                }
            }
        } catch (NoSuchMethodException e) {
            throw new RunFileException(where + ": " + className
                    + " needs a public constructor taking ModelSettings, or none");
        } catch (InvocationTargetException e) {
            Throwable cause = e.getCause();
            if (cause instanceof IllegalArgumentException) {
                throw (IllegalArgumentException) cause;
            }
            throw new RunFileException("model class " + className + " failed to start: " + cause, cause);
        } catch (ReflectiveOperationException e) {
            throw new RunFileException("model class " + className + " cannot be created: " + e, e);
        }
        throw new RunFileException(where + ": " + className
                + " is neither an org.skerry.engine.model.Model nor an org.skerry.engine.model.settings.ModelFactory");
    }
}
