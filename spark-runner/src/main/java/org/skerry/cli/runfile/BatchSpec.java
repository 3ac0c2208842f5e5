package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigObject;
import com.typesafe.config.ConfigRenderOptions;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.io.IOException;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.PathMatcher;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.stream.Stream;
import org.skerry.engine.random.DerivedSeed;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * A batch file, read and checked like a run file: the base run file, the datasets, the model
 * variants, the batch seed, how many analyses run at once and the batch folder. Every dataset ×
 * variant becomes one {@link Planned} analysis whose run file is checked here, so a mistake in
 * the batch file or in any variant's settings is reported (file, line, key, value) before
 * anything runs. The keys and their defaults are in {@code batch-reference.conf}.
 */
public final class BatchSpec {

    /** One dataset: its name (the file's name without extension) and its file. */
    public record Dataset(String name, Path file) {
    }

    /** One model variant: its name and the run-file settings it lays over the base. */
    public record Variant(String name, Config settings) {
    }

    /** One analysis: a dataset under a variant, with its derived seed and its checked run file. */
    public record Planned(Dataset dataset, Variant variant, long seed, RunSpec run) {
        /** {@code dataset/variant}, as progress and messages show it. */
        public String label() {
            return dataset.name() + "/" + variant.name();
        }
    }

    /** The name of the variant of a batch file that lists none. */
    public static final String DEFAULT_VARIANT = "base";

    /** Batch files: defaults and known keys in batch-reference.conf. */
    private static final SettingsFile KIND = new SettingsFile("batch file", "batch-reference.conf",
            List.of("settings", "datasets.settings", "variants"), "");
    /** Run-file keys the batch sets itself for every analysis. */
    private static final List<String> SET_BY_BATCH = List.of("name", "data.file", "data.inline", "sampler.seed");
    private static final String NAME_PATTERN = "[A-Za-z0-9][A-Za-z0-9._-]*";

    private final Path file;
    private final Config config;
    private final Path base;
    private final List<Dataset> datasets;
    private final List<Variant> variants;
    private final long seed;
    private final int concurrent;
    private final Path folder;
    private final OutputSpec.Progress progress;
    private final List<Planned> analyses;

    private BatchSpec(Path file, Config config, Path folderOverride) {
        this.file = file;
        this.config = config;
        SettingsReader r = SettingsReader.of(config);
        Path home = file.toAbsolutePath().getParent();
        String baseName = r.text("base");
        if (baseName == null || baseName.isBlank()) {
            throw r.error("base", "name the run file every analysis starts from");
        }
        this.base = home.resolve(baseName).normalize();
        if (!Files.isRegularFile(base)) {
            throw r.error("base", "no such run file " + base);
        }
        this.datasets = datasets(r, home);
        Map<String, Config> perDataset = datasetSettings(r, datasets);
        this.variants = variants(r);
        Config common = r.object("settings");
        refuseBatchKeys(common, "settings", false);
        this.seed = r.seed("seed");
        this.concurrent = r.integer("concurrent", 1, 1024);
        String folderName = r.text("folder");
        if (folderOverride == null && (folderName == null || folderName.isBlank())) {
            throw r.error("folder", "must name the batch folder");
        }
        this.folder = folderOverride != null ? folderOverride : Path.of(folderName);
        this.progress = OutputSpec.Progress.valueOf(r.choice("progress", List.of("auto", "live", "log", "off"))
                .toUpperCase(Locale.ROOT));
        List<Planned> planned = new ArrayList<>();
        for (Dataset dataset : datasets) {
            for (Variant variant : variants) {
                long analysisSeed = DerivedSeed.of(seed, dataset.name(), variant.name());
                Map<String, Object> forced = new LinkedHashMap<>();
                forced.put("name", dataset.name() + "-" + variant.name());
                forced.put("data.file", dataset.file().toString());
                forced.put("sampler.seed", analysisSeed);
                Config layers = ConfigFactory.parseMap(forced, "batch file " + file
                        + ", dataset " + dataset.name() + ", variant " + variant.name())
                        .withFallback(variant.settings())
                        .withFallback(perDataset.getOrDefault(dataset.name(), ConfigFactory.empty()))
                        .withFallback(common);
                planned.add(new Planned(dataset, variant, analysisSeed, RunSpec.from(RunFile.load(base, layers, List.of()))));
            }
        }
        this.analyses = List.copyOf(planned);
    }

    /**
     * Reads and checks a batch file.
     *
     * @param folderOverride the batch folder to use instead of the file's {@code folder}, or null
     * @throws RunFileException naming the file, line, key and value of the first problem found
     */
    public static BatchSpec load(Path path, Path folderOverride) {
        Config resolved = KIND.load(path);
        try {
            return new BatchSpec(path, resolved, folderOverride);
        } catch (SettingsException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    private static List<Dataset> datasets(SettingsReader r, Path home) {
        List<String> files;
        try {
            files = r.config().getStringList("datasets.files");
        } catch (ConfigException.WrongType e) {
            throw r.error("datasets.files", "expected a list of data files");
        }
        String folderName = r.text("datasets.folder");
        if (files.isEmpty() == (folderName == null)) {
            throw r.error(folderName == null ? "datasets.files" : "datasets.folder",
                    "set datasets.files (a list of data files) or datasets.folder (with datasets.pattern), one of them");
        }
        List<Path> paths = new ArrayList<>();
        String key;
        if (folderName != null) {
            key = "datasets.folder";
            Path dataFolder = home.resolve(folderName).normalize();
            if (!Files.isDirectory(dataFolder)) {
                throw r.error(key, "no such folder " + dataFolder);
            }
            String pattern = r.text("datasets.pattern");
            PathMatcher matcher;
            try {
                matcher = FileSystems.getDefault().getPathMatcher("glob:" + pattern);
            } catch (IllegalArgumentException e) {
                throw r.error("datasets.pattern", "not a file pattern: " + e.getMessage());
            }
            try (Stream<Path> entries = Files.list(dataFolder)) {
                entries.filter(p -> Files.isRegularFile(p) && matcher.matches(p.getFileName())).sorted()
                        .forEach(paths::add);
            } catch (IOException e) {
                throw r.error(key, "cannot list the folder: " + e);
            }
            if (paths.isEmpty()) {
                throw r.error("datasets.pattern", "no file in " + dataFolder + " matches it");
            }
        } else {
            key = "datasets.files";
            List<? extends ConfigValue> listed = r.config().getList(key);
            for (int i = 0; i < files.size(); i++) {
                Path path = home.resolve(files.get(i)).normalize();
                // Checked now, so that a missing file is bad input before anything runs, not a
                // failed analysis at the end of a long batch.
                if (!Files.isRegularFile(path) || !Files.isReadable(path)) {
                    throw new RunFileException(RunFile.describe(listed.get(i).origin()) + ": " + key + "[" + i + "] = "
                            + listed.get(i).render() + ": " + (Files.isDirectory(path) ? "is a folder, not a data file "
                                    : Files.exists(path) ? "cannot read the data file " : "no such data file ") + path);
                }
                paths.add(path);
            }
        }
        List<Dataset> out = new ArrayList<>();
        for (Path path : paths) {
            String fileName = path.getFileName().toString();
            int dot = fileName.lastIndexOf('.');
            String name = dot > 0 ? fileName.substring(0, dot) : fileName;
            if (!name.matches(NAME_PATTERN)) {
                throw r.error(key, "dataset name '" + name + "' (from " + path + ") must be letters, digits, '.', '_'"
                        + " or '-' (it names the run folder)");
            }
            for (Dataset seen : out) {
                if (seen.name().equals(name)) {
                    throw r.error(key, "two datasets are named '" + name + "' (" + seen.file() + " and " + path
                            + "); dataset names are the files' names without extension and must differ");
                }
            }
            out.add(new Dataset(name, path));
        }
        return List.copyOf(out);
    }

    private static Map<String, Config> datasetSettings(SettingsReader r, List<Dataset> datasets) {
        Map<String, Config> out = new LinkedHashMap<>();
        List<String> names = new ArrayList<>();
        datasets.forEach(d -> names.add(d.name()));
        for (Map.Entry<String, ConfigValue> entry : r.object("datasets.settings").root().entrySet()) {
            String where = RunFile.describe(entry.getValue().origin());
            if (!names.contains(entry.getKey())) {
                String suggestion = KeySuggestion.closest(entry.getKey(), names);
                throw new RunFileException(where + ": datasets.settings: no dataset is named '" + entry.getKey() + "'"
                        + (suggestion == null ? "" : "; did you mean '" + suggestion + "'?"));
            }
            if (entry.getValue().valueType() != ConfigValueType.OBJECT) {
                throw new RunFileException(where + ": datasets.settings." + entry.getKey()
                        + ": expected an object of run-file settings { … }");
            }
            Config settings = ((ConfigObject) entry.getValue()).toConfig();
            refuseBatchKeys(settings, "datasets.settings." + entry.getKey(), true);
            out.put(entry.getKey(), settings);
        }
        return out;
    }

    private static List<Variant> variants(SettingsReader r) {
        List<? extends ConfigValue> list;
        try {
            list = r.config().getList("variants");
        } catch (ConfigException.WrongType e) {
            throw r.error("variants", "expected a list of { name = …, settings { … } }");
        }
        if (list.isEmpty()) {
            return List.of(new Variant(DEFAULT_VARIANT, ConfigFactory.empty()));
        }
        List<Variant> out = new ArrayList<>();
        for (int i = 0; i < list.size(); i++) {
            ConfigValue value = list.get(i);
            String where = RunFile.describe(value.origin());
            String key = "variants[" + i + "]";
            if (value.valueType() != ConfigValueType.OBJECT) {
                throw new RunFileException(where + ": " + key + ": expected { name = …, settings { … } }");
            }
            ConfigObject object = (ConfigObject) value;
            for (String field : object.keySet()) {
                if (!field.equals("name") && !field.equals("settings")) {
                    String suggestion = KeySuggestion.closest(field, List.of("name", "settings"));
                    throw new RunFileException(RunFile.describe(object.get(field).origin()) + ": unknown setting '"
                            + key + "." + field + "'" + (suggestion == null ? "" : "; did you mean '" + suggestion + "'?"));
                }
            }
            ConfigValue name = object.get("name");
            if (name == null || name.valueType() != ConfigValueType.STRING
                    || !((String) name.unwrapped()).matches(NAME_PATTERN)) {
                throw new RunFileException(where + ": " + key + ".name = " + (name == null ? "null" : name.render())
                        + ": name each variant with letters, digits, '.', '_' or '-' (it names the run folder)");
            }
            String variantName = (String) name.unwrapped();
            for (Variant seen : out) {
                if (seen.name().equals(variantName)) {
                    throw new RunFileException(where + ": " + key + ".name = " + name.render()
                            + ": two variants have this name");
                }
            }
            ConfigValue settings = object.get("settings");
            if (settings != null && settings.valueType() != ConfigValueType.OBJECT) {
                throw new RunFileException(RunFile.describe(settings.origin()) + ": " + key
                        + ".settings: expected an object of run-file settings { … }");
            }
            Config variantSettings = settings == null ? ConfigFactory.empty() : ((ConfigObject) settings).toConfig();
            refuseBatchKeys(variantSettings, key + ".settings", true);
            out.add(new Variant(variantName, variantSettings));
        }
        return List.copyOf(out);
    }

    private static void refuseBatchKeys(Config settings, String section, boolean refuseBackend) {
        for (String key : SET_BY_BATCH) {
            if (settings.hasPathOrNull(key)) {
                throw new RunFileException(RunFile.where(settings, key) + ": " + section + "." + key
                        + ": the batch sets this itself (name and data file from the dataset, seed from the batch seed)");
            }
        }
        if (refuseBackend && settings.hasPathOrNull("backend")) {
            throw new RunFileException(RunFile.where(settings, "backend") + ": " + section + ".backend"
                    + ": the whole batch runs on one backend; set backend keys in the base run file or in `settings`");
        }
    }

    /** The batch file as read. */
    public Path file() {
        return file;
    }

    /** The resolved batch settings: the file over the defaults. */
    public Config config() {
        return config;
    }

    /** The resolved batch settings as HOCON text. */
    public String render() {
        return config.root().render(ConfigRenderOptions.defaults().setOriginComments(false).setComments(false)
                .setJson(false).setFormatted(true));
    }

    /** The base run file (absolute). */
    public Path base() {
        return base;
    }

    public List<Dataset> datasets() {
        return datasets;
    }

    /** The variants in the order listed; the first is the reference for Bayes factors. */
    public List<Variant> variants() {
        return variants;
    }

    public long seed() {
        return seed;
    }

    /** How many analyses run at once. */
    public int concurrent() {
        return concurrent;
    }

    public Path folder() {
        return folder;
    }

    public OutputSpec.Progress progress() {
        return progress;
    }

    /** Every analysis, dataset by dataset, variants in order within each. */
    public List<Planned> analyses() {
        return analyses;
    }
}
