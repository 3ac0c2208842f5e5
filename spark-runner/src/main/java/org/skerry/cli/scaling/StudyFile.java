package org.skerry.cli.scaling;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigList;
import com.typesafe.config.ConfigParseOptions;
import com.typesafe.config.ConfigRenderOptions;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.cli.runfile.SettingsFile;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * A scaling study file read with Typesafe Config over the defaults in {@code study-defaults.conf}:
 * the base run file, strong or weak scaling, repeats, settings for every point and the axes of
 * the grid. Every key and every grid point is checked before anything runs — each point's run
 * file is loaded and checked as {@code skerry run} would — and a problem is reported with the
 * study file's line and key.
 */
public final class StudyFile {

    /** The axis that sets the number of cores rather than a run-file key. */
    public static final String CORES = "cores";

    /** Study files: defaults and known keys in study-defaults.conf; run-file settings go in settings and axes. */
    private static final SettingsFile KIND = new SettingsFile("study file", "study-defaults.conf",
            List.of("settings", "axes"), " (study-defaults.conf lists them; run-file settings go under settings { } "
                    + "or axes { })");

    /** Strong scaling keeps N fixed; weak scaling keeps N per core fixed. */
    public enum Scaling { STRONG, WEAK }

    private final Path path;
    private final Config config;
    private final String name;
    private final Path base;
    private final Scaling scaling;
    private final int particlesPerCore;
    private final int repeats;
    private final boolean warmUp;
    private final Path outputFolder;
    private final Map<String, String> settings;
    private final List<Integer> cores;
    private final Map<String, List<ConfigValue>> axes;
    private final List<StudyPoint> points;

    private StudyFile(Path path, Config config) {
        this.path = path;
        this.config = config;
        SettingsReader r = SettingsReader.of(config);
        String fileName = path.getFileName().toString();
        String named = r.text("name");
        this.name = named != null ? named : fileName.endsWith(".conf") ? fileName.substring(0, fileName.length() - 5)
                : fileName;
        if (!name.matches("[A-Za-z0-9][A-Za-z0-9._-]*")) {
            throw r.error("name", "must be letters, digits, '.', '_' or '-' (it names the study folder)");
        }
        String baseName = r.text("base");
        if (baseName == null || baseName.isBlank()) {
            throw r.error("base", "name the run file to scale, relative to the study file");
        }
        this.base = path.toAbsolutePath().getParent().resolve(baseName).normalize();
        if (!Files.isRegularFile(base)) {
            throw r.error("base", "no such run file: " + base);
        }
        this.scaling = Scaling.valueOf(r.choice("scaling", List.of("strong", "weak")).toUpperCase(Locale.ROOT));
        this.particlesPerCore = r.integer("particles-per-core", 0, 100_000_000);
        this.repeats = r.integer("repeats", 1, 1000);
        this.warmUp = r.bool("warm-up");
        String folder = r.text("output.folder");
        if (folder == null || folder.isBlank()) {
            throw r.error("output.folder", "must name a folder");
        }
        this.outputFolder = Path.of(folder);
        this.settings = flatten(r, "settings");
        Map<String, List<ConfigValue>> found = axesOf(r);
        List<ConfigValue> coreValues = found.remove(CORES);
        this.cores = new ArrayList<>();
        if (coreValues != null) {
            for (ConfigValue value : coreValues) {
                Object raw = value.unwrapped();
                if (!(raw instanceof Integer) || (Integer) raw < 1) {
                    throw new RunFileException(RunFile.describe(value.origin()) + ": axes.cores = "
                            + config.getValue("axes.cores").render(ConfigRenderOptions.concise())
                            + ": every core count must be a whole number >= 1, found " + value.render());
                }
                if (!cores.contains(raw)) {
                    cores.add((Integer) raw);
                }
            }
            cores.sort(null);
        }
        this.axes = found;
        if (scaling == Scaling.WEAK) {
            if (cores.isEmpty()) {
                throw r.error("scaling", "weak scaling needs a cores axis (axes { cores = [1, 2, 4] })");
            }
            if (particlesPerCore < 2) {
                throw r.error("particles-per-core", "weak scaling needs particles-per-core >= 2");
            }
            for (String key : List.of("sampler.particles")) {
                if (settings.containsKey(key) || axes.containsKey(key)) {
                    throw new RunFileException(RunFile.where(config, settings.containsKey(key) ? "settings" : "axes")
                            + ": " + key + " is set by weak scaling (particles-per-core x cores); do not set it here");
                }
            }
        }
        this.points = checkedPoints();
    }

    /**
     * Reads and checks a study file and every run it describes.
     *
     * @throws RunFileException naming the file, line, key and value of the first problem found
     */
    public static StudyFile load(Path path) {
        Config resolved = KIND.load(path);
        try {
            return new StudyFile(path, resolved);
        } catch (SettingsException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    /** The leaves under {@code section} as run-file overrides (path → HOCON value text). */
    private static Map<String, String> flatten(SettingsReader r, String section) {
        Map<String, String> out = new TreeMap<>();
        Config object;
        try {
            object = r.config().getConfig(section);
        } catch (ConfigException.WrongType e) {
            throw r.error(section, "expected an object { … }");
        }
        for (Map.Entry<String, ConfigValue> entry : object.entrySet()) {
            out.put(entry.getKey(), entry.getValue().render(ConfigRenderOptions.concise()));
        }
        return out;
    }

    private Map<String, List<ConfigValue>> axesOf(SettingsReader r) {
        Config object;
        try {
            object = r.config().getConfig("axes");
        } catch (ConfigException.WrongType e) {
            throw r.error("axes", "expected an object { key = [values] … }");
        }
        Map<String, List<ConfigValue>> out = new TreeMap<>();
        for (Map.Entry<String, ConfigValue> entry : object.entrySet()) {
            String key = entry.getKey();
            ConfigValue value = entry.getValue();
            if (value.valueType() != ConfigValueType.LIST || ((ConfigList) value).isEmpty()) {
                throw new RunFileException(RunFile.describe(value.origin()) + ": axes." + key + " = "
                        + value.render(ConfigRenderOptions.concise()) + ": expected a non-empty list of values to try");
            }
            if (settings.containsKey(key)) {
                throw new RunFileException(RunFile.describe(value.origin()) + ": axes." + key
                        + " is also set in settings { }; set it in one place");
            }
            out.put(key, new ArrayList<>((ConfigList) value));
        }
        return out;
    }

    /** The grid, each point checked by loading its run file as {@code skerry run} would. */
    private List<StudyPoint> checkedPoints() {
        List<Map<String, ConfigValue>> combinations = new ArrayList<>();
        combinations.add(new LinkedHashMap<>());
        for (Map.Entry<String, List<ConfigValue>> axis : axes.entrySet()) {
            List<Map<String, ConfigValue>> next = new ArrayList<>();
            for (Map<String, ConfigValue> partial : combinations) {
                for (ConfigValue value : axis.getValue()) {
                    Map<String, ConfigValue> extended = new LinkedHashMap<>(partial);
                    extended.put(axis.getKey(), value);
                    next.add(extended);
                }
            }
            combinations = next;
        }
        List<Integer> coreCounts = cores.isEmpty() ? java.util.Collections.singletonList(null) : cores;
        List<StudyPoint> out = new ArrayList<>();
        int group = 0;
        for (Map<String, ConfigValue> combination : combinations) {
            for (Integer k : coreCounts) {
                out.add(point(group, combination, k));
            }
            group++;
        }
        return List.copyOf(out);
    }

    private StudyPoint point(int group, Map<String, ConfigValue> combination, Integer k) {
        // Each override is shown as key=value (skerry scale --check) and laid over the base as a
        // setting whose origin is the study file's line, so an error names that line and never a
        // --set the user did not type.
        List<String> overrides = new ArrayList<>();
        List<Config> layers = new ArrayList<>();
        settings.forEach((key, value) -> {
            overrides.add(key + "=" + value);
            layers.add(ConfigFactory.empty().withValue(key, config.getValue("settings." + key)));
        });
        Map<String, String> shown = new LinkedHashMap<>();
        if (k != null) {
            shown.put(CORES, String.valueOf(k));
        }
        for (Map.Entry<String, ConfigValue> entry : combination.entrySet()) {
            overrides.add(entry.getKey() + "=" + entry.getValue().render(ConfigRenderOptions.concise()));
            layers.add(ConfigFactory.empty().withValue(entry.getKey(), entry.getValue()));
            shown.put(entry.getKey(), String.valueOf(entry.getValue().unwrapped()));
        }
        if (scaling == Scaling.WEAK) {
            add(overrides, layers, "sampler.particles=" + (long) particlesPerCore * k,
                    RunFile.where(config, "particles-per-core") + ": particles-per-core x cores " + k);
        }
        RunSpec spec = loadPoint(layers, combination);
        if (k != null) {
            for (String override : coreOverrides(spec, k)) {
                add(overrides, layers, override, RunFile.where(config, "axes.cores") + ": cores = " + k);
            }
            spec = loadPoint(layers, combination);
        }
        if (spec.backend().kind().equals("spark")) {
            String listeners = spec.backend().sparkSettings().get("spark.extraListeners");
            String ours = DriverTraffic.class.getName();
            add(overrides, layers, "backend.spark.\"spark.extraListeners\"=\""
                    + (listeners == null || listeners.isBlank() ? ours : listeners + "," + ours) + "\"",
                    "skerry scale's driver measurements");
            spec = loadPoint(layers, combination);
        }
        return new StudyPoint(group, shown, k == null ? 0 : k, List.copyOf(overrides), spec);
    }

    /** Adds an override the study makes itself, with {@code origin} as where it comes from. */
    private static void add(List<String> overrides, List<Config> layers, String override, String origin) {
        overrides.add(override);
        layers.add(ConfigFactory.parseString(override, ConfigParseOptions.defaults().setOriginDescription(origin)));
    }

    /** The settings that give a run {@code k} cores on its backend. */
    static List<String> coreOverrides(RunSpec spec, int k) {
        if (spec.backend().kind().equals("threads")) {
            return List.of("backend.threads=" + k);
        }
        if (org.skerry.cli.runfile.SparkMasters.isInProcess(spec.backend().master())) {
            return List.of("backend.master=\"local[" + k + "]\"");
        }
        return List.of("backend.spark.\"spark.cores.max\"=" + k);
    }

    private RunSpec loadPoint(List<Config> layers, Map<String, ConfigValue> combination) {
        Config settingsOverBase = ConfigFactory.empty();
        for (Config layer : layers) {
            settingsOverBase = layer.withFallback(settingsOverBase);
        }
        try {
            return RunSpec.from(RunFile.load(base, settingsOverBase, List.of()));
        } catch (RunFileException e) {
            // Name the key as the study file writes it (axes.… or settings.…) at the line that set it.
            String message = e.getMessage();
            for (Map.Entry<String, ConfigValue> entry : combination.entrySet()) {
                String named = renamed(message, entry.getKey(), entry.getValue(), "axes.");
                if (named != null) {
                    throw new RunFileException(named, e);
                }
            }
            for (String key : settings.keySet()) {
                String named = renamed(message, key, config.getValue("settings." + key), "settings.");
                if (named != null) {
                    throw new RunFileException(named, e);
                }
            }
            if (message.startsWith(RunFile.shorten(path) + ":")) {
                throw e;
            }
            throw new RunFileException(path + ": base run file " + base + " with this study's settings: " + message, e);
        }
    }

    /**
     * {@code message} about {@code key}, located at {@code value}'s line, with the key as the study
     * writes it ({@code axes.sampler.particles = 1: …}); null when the message is about something else.
     */
    private static String renamed(String message, String key, ConfigValue value, String section) {
        String at = RunFile.describe(value.origin()) + ": ";
        if (!message.startsWith(at) || !message.contains(key)) {
            return null;
        }
        String rendered = value.render(ConfigRenderOptions.concise());
        String rest = message.substring(at.length());
        String restated = key + " = " + rendered + ": ";
        if (rest.startsWith(restated)) {
            rest = rest.substring(restated.length());
        }
        return at + section + key + " = " + rendered + ": " + rest;
    }

    public Path path() {
        return path;
    }

    public String name() {
        return name;
    }

    /** The base run file (absolute). */
    public Path base() {
        return base;
    }

    public Scaling scaling() {
        return scaling;
    }

    public int particlesPerCore() {
        return particlesPerCore;
    }

    public int repeats() {
        return repeats;
    }

    /** Whether one unrecorded run precedes the first measured one. */
    public boolean warmUp() {
        return warmUp;
    }

    /** {@code <output.folder>/<name>}. */
    public Path defaultFolder() {
        return outputFolder.resolve(name);
    }

    /** Run-file keys the study varies besides cores, in grid order. */
    public List<String> axisKeys() {
        return List.copyOf(axes.keySet());
    }

    /** Whether the study has a cores axis. */
    public boolean hasCoresAxis() {
        return !cores.isEmpty();
    }

    /** Every grid point, checked; within a group (same other axes) ordered by cores. */
    public List<StudyPoint> points() {
        return points;
    }

    /** The resolved study as HOCON text, for the study folder's copy. */
    public String render() {
        return config.root().render(ConfigRenderOptions.defaults().setOriginComments(false).setComments(false)
                .setJson(false).setFormatted(true));
    }
}
