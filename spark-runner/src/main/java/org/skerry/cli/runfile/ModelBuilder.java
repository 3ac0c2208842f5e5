package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.skerry.cli.data.CsvDataReader;
import org.skerry.cli.data.DataException;
import org.skerry.cli.data.DataTable;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelCreator;
import org.skerry.engine.model.settings.ModelNotCreatedException;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;
import org.skerry.engine.model.settings.SettingsModelSource;
import org.skerry.engine.program.ProgramModel;
import org.skerry.engine.program.ProgramSimulator;
import org.skerry.engine.program.ProgramStartException;

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
    public record Built(Model model, DataTable data, SettingsModelSource source) {
    }

    public static Built build(RunSpec spec) {
        DataTable data = readData(spec);
        Map<String, double[]> columns = bind(spec, data);
        String dataSource = data == null ? "the run file (no data)" : data.source();
        ModelSpec chosen = spec.model();
        if (chosen.name() != null) {
            ModelFactory factory = ModelCatalog.load().find(chosen.name()).orElseThrow(() -> new RunFileException(
                    where(spec, "model.name") + ": unknown model '" + chosen.name() + "'; built-in models: "
                            + names() + suggestion(chosen.name())));
            checkModelKeys(spec, factory);
        }
        SettingsModelSource source = new SettingsModelSource(chosen.name(), chosen.className(),
                chosen.settings(), chosen.settingsKey(), columns, dataSource);
        Model model;
        ModelSettings settings = ModelSettings.of(chosen.settings(), chosen.settingsKey(), columns, dataSource);
        try {
            model = ModelCreator.create(chosen.name(), chosen.className(), settings, where(spec, "model.class"));
        } catch (ModelNotCreatedException e) {
            throw new RunFileException(e.getMessage(), e);
        } catch (IllegalArgumentException e) {
            // A setting the run file leaves out is located in the jar's reference.conf, which the
            // user never wrote: name the run file instead.
            String message = String.valueOf(e.getMessage()).replaceFirst("^reference\\.conf(: line \\d+)?(?=: |, )",
                    java.util.regex.Matcher.quoteReplacement(RunFile.shorten(spec.file().path()).toString()));
            throw new RunFileException("model " + chosen.label() + ": " + message, e);
        }
        checkBindingsRead(spec, settings.rolesRead());
        checkSequence(spec, model);
        return new Built(model, data, source);
    }

    /**
     * For a program model: starts one worker and completes its handshake, so a program that cannot
     * start (missing, an import error, another protocol version) stops the run before iteration 0
     * as bad input, with its standard error. Other models need nothing. On a cluster the workers
     * run on the executors, not here (the driver may be a node without the program), so the check
     * happens there instead, once the backend is up.
     */
    public static void checkStarts(RunSpec spec, Built built) {
        if (built.model() instanceof ProgramModel && startsHere(spec)) {
            try {
                ((ProgramModel) built.model()).probe();
            } catch (ProgramStartException e) {
                throw new RunFileException(e.getMessage(), e);
            }
        }
    }

    /** Whether the run's model programs run in this JVM (threads, Spark local mode), not on a cluster's executors. */
    public static boolean startsHere(RunSpec spec) {
        return !spec.backend().kind().equals("spark") || SparkMasters.isInProcess(spec.backend().master());
    }

    /**
     * Refuses data tempering for a model whose likelihood does not come per observation range, and
     * ABC for a model that simulates no summaries, whose summaries' names do not match the observed
     * summaries or distance weights the run gives, or that writes more summaries than it names.
     */
    private static void checkSequence(RunSpec spec, Model model) {
        if (model instanceof ProgramSimulator && spec.sampler().targets().kind() != SequenceSettings.Kind.ABC) {
            throw new RunFileException(where(spec, spec.model().settingsKey() + ".summaries") + ": "
                    + spec.model().settingsKey() + ".summaries: a program model that replies with summaries has no "
                    + "likelihood, so it needs sampler.sequence = abc (this run's sequence is "
                    + spec.sampler().targets().kind().name().toLowerCase(java.util.Locale.ROOT).replace('_', '-')
                    + "); remove the key for a program that replies with a log-likelihood");
        }
        if (spec.sampler().targets().kind() == SequenceSettings.Kind.ABC) {
            if (!(model instanceof SummarySimulator simulator)) {
                throw new RunFileException(where(spec, "sampler.sequence") + ": sampler.sequence = abc needs a model "
                        + "that simulates summaries; model " + spec.model().label() + " simulates none (it offers a "
                        + "likelihood: use likelihood-tempering)");
            }
            try {
                spec.sampler().targets().create(model, spec.sampler().tempering().rule(),
                        spec.sampler().population().seed(), spec.sampler().evaluation().retries());
            } catch (IllegalArgumentException e) {
                String message = String.valueOf(e.getMessage());
                String key = message.contains("distance weight") ? "sampler.abc.distance-weights"
                        : message.contains("observed") ? (spec.file().config().hasPath("sampler.abc.observed-file")
                                ? "sampler.abc.observed-file" : "sampler.abc.observed") : "sampler.abc";
                throw new RunFileException(where(spec, key) + ": " + key + ": model " + spec.model().label() + ": "
                        + message, e);
            }
            // A program's count is checked on every reply (a wrong one is an invalid simulation): a
            // trial simulation here would start the program on the driver, which on a cluster may lack it.
            String wrong = model instanceof ProgramSimulator ? null
                    : SummarySimulator.checkSummaryCount(simulator, spec.sampler().population().seed());
            if (wrong != null) {
                throw new RunFileException("model " + spec.model().label() + ": " + wrong);
            }
        }
        if (spec.sampler().targets().kind() == SequenceSettings.Kind.DATA_TEMPERING
                && !(model instanceof ObservationLikelihood)) {
            throw new RunFileException(where(spec, "sampler.sequence") + ": sampler.sequence = data-tempering needs a "
                    + "model whose likelihood is a sum over observations; model " + spec.model().label()
                    + " gives none per observation range (use likelihood-tempering)");
        }
    }

    /**
     * Refuses a {@code data.columns} binding whose role the model never read: a misspelt role
     * would otherwise leave the column unused while the model reads another (or none).
     */
    private static void checkBindingsRead(RunSpec spec, java.util.Set<String> read) {
        for (Map.Entry<String, String> binding : spec.model().columnBindings().entrySet()) {
            String role = binding.getKey();
            if (read.contains(role)) {
                continue;
            }
            String closest = KeySuggestion.closest(role, read);
            throw new RunFileException(where(spec, "data.columns." + role) + ": data.columns." + role + " = \""
                    + binding.getValue() + "\": model " + spec.model().label() + " reads no data role '" + role + "'"
                    + (closest == null ? "" : " — did you mean '" + closest + "'?")
                    + (read.isEmpty() ? " (it reads no data" : " (the roles it read: " + String.join(", ", read))
                    + (spec.model().name() != null ? "; `skerry models` lists each model's roles)" : ")"));
        }
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
            if (spec.model().dataFile() != null) {
                return CsvDataReader.read(spec.model().dataFile());
            }
            if (spec.model().inlineData() != null) {
                return inline(spec);
            }
            return null;
        } catch (DataException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    private static DataTable inline(RunSpec spec) {
        Config inline = spec.model().inlineData();
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
            if (!spec.model().columnBindings().isEmpty()) {
                throw new RunFileException(where(spec, "data.columns") + ": data.columns binds roles but the run "
                        + "file has no data (set data.file or data.inline)");
            }
            return columns;
        }
        for (String name : data.columns()) {
            columns.put(name, data.column(name));
        }
        for (Map.Entry<String, String> binding : spec.model().columnBindings().entrySet()) {
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
        spec.model().settings().entrySet().forEach(e -> leaves.add(e.getKey()));
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
}
