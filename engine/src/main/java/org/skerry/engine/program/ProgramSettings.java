package org.skerry.engine.program;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.PriorSettings;
import org.skerry.engine.model.prior.UnivariateDistribution;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * What a run file says about a program model ({@code model.program}), checked: the command as an
 * argument list, the files it reads, the variables added to its environment, how long a request
 * may take, how many particles a request carries, and the parameters with their priors. Every
 * problem names the file, line, key and value.
 *
 * @param command      the program and its arguments, passed as they are (never through a shell)
 * @param files        the files the program reads, absolute, in the order the start message lists them
 * @param environment  variables added to the program's environment
 * @param timeout      the longest one request (one particle, or one batch) may take
 * @param startTimeout the longest a worker may take to say it is ready
 * @param mode         a long-lived worker speaking the line protocol, or a program run per evaluation
 * @param batch        the most particles one request carries (1: one at a time)
 * @param names        the parameter names, in vector order
 * @param priors       each parameter's prior, in vector order
 * @param scratch      the folder under which workers get their scratch folders, or null for the
 *                     system's temporary folder
 * @param fileMode     file mode's settings, or null in worker mode
 * @param summaries    the names of the summaries the program replies with (it is then a simulator
 *                     for ABC, with no likelihood), in reply order; empty for a log-likelihood
 */
public record ProgramSettings(List<String> command, List<Path> files, Map<String, String> environment,
        Duration timeout, Duration startTimeout, Mode mode, int batch, List<String> names,
        List<UnivariateDistribution> priors, Path scratch, FileMode fileMode, List<String> summaries) {

    /** How skerry talks to the program. */
    public enum Mode { WORKER, FILE }

    /**
     * File mode: the input file's template (absolute) and text, the names of the input file skerry
     * writes and the output file the program writes in its folder, and how many failed
     * evaluations' folders are kept.
     */
    public record FileMode(Path template, String templateText, String inputName, String outputName, int keepFailed) {
    }

    /** The keys {@code model.program} may hold. */
    public static final Set<String> KEYS = Set.of("command", "files", "environment", "timeout", "start-timeout",
            "mode", "batch", "parameters", "scratch", "input-template", "input-file", "output-file", "keep-failed",
            "summaries");

    /** The keys only file mode reads. */
    public static final Set<String> FILE_MODE_KEYS = Set.of("input-template", "input-file", "output-file",
            "keep-failed");

    /** The default of {@code timeout}. */
    public static final Duration DEFAULT_TIMEOUT = Duration.ofMinutes(5);
    /** The default of {@code start-timeout}. */
    public static final Duration DEFAULT_START_TIMEOUT = Duration.ofSeconds(60);
    /** The most particles one request may carry. */
    public static final int MAX_BATCH = 100_000;

    public ProgramSettings {
        command = List.copyOf(command);
        files = List.copyOf(files);
        environment = Collections.unmodifiableMap(new TreeMap<>(environment));
        names = List.copyOf(names);
        priors = List.copyOf(priors);
        summaries = List.copyOf(summaries);
        if (command.isEmpty()) {
            throw new IllegalArgumentException("command must name a program");
        }
        if (names.isEmpty() || names.size() != priors.size()) {
            throw new IllegalArgumentException("each parameter needs a prior; names " + names);
        }
        if (batch < 1 || batch > MAX_BATCH) {
            throw new IllegalArgumentException("batch must be in [1, " + MAX_BATCH + "], was " + batch);
        }
        if ((mode == Mode.FILE) != (fileMode != null)) {
            throw new IllegalArgumentException("file mode needs its settings, worker mode none");
        }
        if (!summaries.isEmpty() && mode == Mode.FILE) {
            throw new IllegalArgumentException("summaries need worker mode; file mode gives log-likelihoods only");
        }
        if (new java.util.HashSet<>(summaries).size() != summaries.size()) {
            throw new IllegalArgumentException("summary names must differ, were " + summaries);
        }
    }

    /** A program that replies with log-likelihoods (no summaries). */
    public ProgramSettings(List<String> command, List<Path> files, Map<String, String> environment,
            Duration timeout, Duration startTimeout, Mode mode, int batch, List<String> names,
            List<UnivariateDistribution> priors, Path scratch, FileMode fileMode) {
        this(command, files, environment, timeout, startTimeout, mode, batch, names, priors, scratch, fileMode,
                List.of());
    }

    /** Whether the program replies with summaries (a simulator for ABC) rather than a log-likelihood. */
    public boolean simulatesSummaries() {
        return !summaries.isEmpty();
    }

    /** The input file's name in file mode. */
    public String inputName() {
        return fileMode.inputName();
    }

    /** The output file's name in file mode. */
    public String outputName() {
        return fileMode.outputName();
    }

    /** How many failed evaluations' folders file mode keeps. */
    public int keepFailed() {
        return fileMode.keepFailed();
    }

    /**
     * Reads {@code settings} (the {@code model.program} object).
     *
     * @throws SettingsException naming where a setting is and what is wrong with it
     */
    public static ProgramSettings read(ModelSettings settings) {
        SettingsReader r = settings.reader();
        for (String key : r.keys()) {
            if (!KEYS.contains(key)) {
                throw r.error(key, "unknown setting of a program model; its settings: " + new java.util.TreeSet<>(KEYS));
            }
        }
        List<String> command = texts(r, "command", true);
        if (command.isEmpty()) {
            throw r.error("command", "must name the program, then its arguments, e.g. [\"python3\", \"./model.py\"]");
        }
        if (command.get(0).isBlank()) {
            throw r.error("command", "the program name (the first element) is empty");
        }
        List<Path> files = new ArrayList<>();
        for (String file : r.has("files") ? texts(r, "files", false) : List.<String>of()) {
            if (file.isBlank() || file.contains("\n")) {
                throw r.error("files", "each file must be a path on one line; was '" + file + "'");
            }
            files.add(Path.of(file));
        }
        Map<String, String> environment = new LinkedHashMap<>();
        if (r.has("environment")) {
            SettingsReader e = r.at("environment");
            for (String name : e.keys()) {
                if (!name.matches("[A-Za-z_][A-Za-z0-9_]*")) {
                    throw e.error(name, "an environment variable's name is letters, digits and '_', not starting "
                            + "with a digit");
                }
                ConfigValue value = e.config().getValue(name);
                if (value.valueType() == ConfigValueType.OBJECT || value.valueType() == ConfigValueType.LIST) {
                    throw e.error(name, "expected text");
                }
                environment.put(name, String.valueOf(value.unwrapped()));
            }
        }
        Duration timeout = r.has("timeout") ? r.duration("timeout") : DEFAULT_TIMEOUT;
        Duration startTimeout = r.has("start-timeout") ? r.duration("start-timeout") : DEFAULT_START_TIMEOUT;
        String modeText = r.has("mode") ? r.choice("mode", List.of("worker", "file")) : "worker";
        Mode mode = modeText.equals("file") ? Mode.FILE : Mode.WORKER;
        FileMode fileMode = null;
        if (mode == Mode.FILE) {
            fileMode = readFileMode(r);
        } else {
            for (String key : FILE_MODE_KEYS) {
                if (r.has(key)) {
                    throw r.error(key, "only file mode (mode = file) reads this setting");
                }
            }
        }
        int batch = r.has("batch") ? r.integer("batch", 1, MAX_BATCH) : 1;
        Path scratch = r.has("scratch") ? Path.of(r.text("scratch")) : null;
        List<String> names = new ArrayList<>();
        List<UnivariateDistribution> priors = new ArrayList<>();
        readParameters(r, names, priors);
        if (fileMode != null) {
            try {
                InputTemplate.parse(fileMode.templateText(), names);
            } catch (IllegalArgumentException e) {
                throw r.error("input-template", "in " + fileMode.template() + ": " + e.getMessage());
            }
        }
        List<String> summaries = readSummaries(r, mode);
        return new ProgramSettings(command, files, environment, timeout, startTimeout, mode, batch, names, priors,
                scratch, fileMode, summaries);
    }

    private static List<String> readSummaries(SettingsReader r, Mode mode) {
        if (!r.has("summaries")) {
            return List.of();
        }
        if (mode == Mode.FILE) {
            throw r.error("summaries", "file mode gives log-likelihoods only; a program replying with summaries "
                    + "runs in worker mode (mode = worker)");
        }
        if (r.config().getValue("summaries").valueType() != ConfigValueType.LIST) {
            throw r.error("summaries", "expected a list of summary names, e.g. [mean, sd]");
        }
        List<String> summaries = texts(r, "summaries", false);
        if (summaries.isEmpty()) {
            throw r.error("summaries", "name at least one summary, e.g. [mean, sd]; leave the key out for a "
                    + "program that replies with a log-likelihood");
        }
        List<String> seen = new ArrayList<>();
        for (String name : summaries) {
            if (!name.matches("[A-Za-z][A-Za-z0-9_]*")) {
                throw r.error("summaries", "a summary name is letters, digits and '_', starting with a letter; was '"
                        + name + "'");
            }
            if (seen.contains(name)) {
                throw r.error("summaries", "summary '" + name + "' is named twice");
            }
            seen.add(name);
        }
        return summaries;
    }

    private static FileMode readFileMode(SettingsReader r) {
        String written = r.requiredText("input-template");
        Path template = Path.of(written);
        String text;
        try {
            text = java.nio.file.Files.readString(template, java.nio.charset.StandardCharsets.UTF_8);
        } catch (java.io.IOException | RuntimeException e) {
            throw r.error("input-template", "cannot read the template " + template + ": " + e.getMessage());
        }
        String input = r.has("input-file") ? r.text("input-file") : "input.txt";
        String output = r.has("output-file") ? r.text("output-file") : "output.txt";
        for (String key : List.of("input-file", "output-file")) {
            String name = key.equals("input-file") ? input : output;
            if (name.isEmpty() || name.contains("/") || name.contains("\\") || name.equals(".") || name.equals("..")) {
                throw r.error(key, "a file name inside the evaluation's folder, without '/'");
            }
        }
        if (input.equals(output)) {
            throw r.error("output-file", "must differ from input-file");
        }
        int keepFailed = r.has("keep-failed") ? r.integer("keep-failed", 0, 10_000) : 10;
        return new FileMode(template, text, input, output, keepFailed);
    }

    private static List<String> texts(SettingsReader r, String key, boolean required) {
        if (!r.has(key)) {
            if (required) {
                throw r.missing(key);
            }
            return List.of();
        }
        ConfigValue value = r.config().getValue(key);
        if (value.valueType() != ConfigValueType.LIST) {
            throw r.error(key, "expected a list of text values, e.g. [\"python3\", \"./model.py\"]; a program "
                    + "model takes an argument list, never a command line for a shell");
        }
        List<String> out = new ArrayList<>();
        for (ConfigValue element : r.config().getList(key)) {
            if (element.valueType() == ConfigValueType.OBJECT || element.valueType() == ConfigValueType.LIST
                    || element.valueType() == ConfigValueType.NULL) {
                throw r.error(key, "expected a list of text values");
            }
            out.add(String.valueOf(element.unwrapped()));
        }
        return out;
    }

    private static void readParameters(SettingsReader r, List<String> names, List<UnivariateDistribution> priors) {
        if (!r.has("parameters")) {
            throw r.missing("parameters");
        }
        List<? extends Config> list;
        try {
            list = r.config().getConfigList("parameters");
        } catch (ConfigException.WrongType e) {
            throw new SettingsException(r.where("parameters") + ": " + r.fullKey("parameters") + ": expected a list "
                    + "of parameters, e.g. [{ name = mu, prior { distribution = normal, mean = 0, sd = 10 } }]");
        }
        if (list.isEmpty()) {
            throw r.error("parameters", "declare at least one parameter");
        }
        for (int i = 0; i < list.size(); i++) {
            String path = r.fullKey("parameters") + "[" + i + "]";
            SettingsReader p = SettingsReader.of(list.get(i), path);
            for (String key : p.keys()) {
                if (!key.equals("name") && !key.equals("prior")) {
                    throw p.error(key, "a parameter has a name and a prior, nothing else");
                }
            }
            String name = p.requiredText("name");
            if (!name.matches("[A-Za-z][A-Za-z0-9_]*")) {
                throw p.error("name", "a parameter name is letters, digits and '_', starting with a letter");
            }
            if (names.contains(name)) {
                throw p.error("name", "parameter '" + name + "' is declared twice");
            }
            ModelSettings parameter = ModelSettings.of(list.get(i), path, Map.of(), "no data");
            names.add(name);
            try {
                priors.add(PriorSettings.distribution(parameter, "prior"));
            } catch (SettingsException e) {
                throw e;
            } catch (IllegalArgumentException e) {
                throw new SettingsException(e.getMessage(), e);
            }
        }
    }
}
