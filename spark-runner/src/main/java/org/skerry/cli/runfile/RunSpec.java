package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.AdaptiveTemperature;
import org.skerry.engine.temper.FixedSchedule;
import org.skerry.checkpoint.CheckpointFileSystem;

/**
 * The typed, checked content of a run file: which model and data, the sampler settings, the
 * backend and the output. Every value is checked here, so a bad one is reported with its file,
 * line and key before anything runs.
 */
public final class RunSpec {

    /** The run-file key of the largest fraction of invalid evaluations an iteration may have. */
    public static final String MAX_INVALID_FRACTION_KEY = "sampler.max-invalid-fraction";

    /** The run-file key of the number of retries of an invalid likelihood call. */
    public static final String RETRIES_KEY = "model.retries";

    /** How progress is shown. */
    public enum Progress { AUTO, LIVE, LOG, OFF }

    private final RunFile file;
    private final String name;
    private final String modelName;
    private final String modelClass;
    private final Config modelSettings;
    private final Path dataFile;
    private final Config inlineData;
    private final Map<String, String> columnBindings;
    private final SamplerSettings sampler;
    private final String backendKind;
    private final String master;
    private final int partitions;
    private final Map<String, String> sparkSettings;
    private final List<String> jars;
    private final int connectTimeoutSeconds;
    private final int threads;
    private final int blockSize;
    private final Path outputFolder;
    private final Progress progress;
    private final boolean checkpointEnabled;
    private final String checkpointPath;
    private final int checkpointEveryIterations;
    private final double checkpointEveryMinutes;
    private final int checkpointKeep;
    private final java.time.Duration maxWallTime;
    private final int stopGraceSeconds;

    private RunSpec(RunFile file, SettingsReader r) {
        this.file = file;
        Config c = r.config();
        String runName = r.text("name");
        if (runName == null || !runName.matches("[A-Za-z0-9][A-Za-z0-9._-]*")) {
            throw r.error("name", "must be letters, digits, '.', '_' or '-' (it names the run folder)");
        }
        this.name = runName;
        this.modelName = r.text("model.name");
        this.modelClass = r.text("model.class");
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
        this.modelSettings = r.object("model.settings");
        String data = r.text("data.file");
        this.dataFile = data == null ? null : folderOf(c.getValue("data.file"), file).resolve(data).normalize();
        this.inlineData = c.getIsNull("data.inline") ? null : r.object("data.inline");
        if (dataFile != null && inlineData != null) {
            throw r.error("data.inline", "set data.file or data.inline, not both");
        }
        this.columnBindings = new LinkedHashMap<>();
        for (Map.Entry<String, ConfigValue> entry : r.object("data.columns").root().entrySet()) {
            if (entry.getValue().valueType() != ConfigValueType.STRING) {
                throw r.error("data.columns." + entry.getKey(), "expected the name of a data column");
            }
            columnBindings.put(entry.getKey(), (String) entry.getValue().unwrapped());
        }
        this.sampler = samplerSettings(r);
        this.backendKind = r.choice("backend.kind", List.of("spark", "threads"));
        this.master = r.text("backend.master");
        if (master == null || !SparkMasters.isValid(master)) {
            throw r.error("backend.master", "not a Spark master; use " + SparkMasters.FORMS);
        }
        this.partitions = r.integer("backend.partitions", 0, 1_000_000);
        this.sparkSettings = new LinkedHashMap<>();
        for (Map.Entry<String, ConfigValue> entry : r.object("backend.spark").entrySet()) {
            String key = "backend.spark." + entry.getKey();
            if (!entry.getKey().startsWith("\"spark.") && !entry.getKey().startsWith("spark.")) {
                throw r.error(key, "Spark settings start with spark. (quote the key: \"spark.executor.memory\" = 2g)");
            }
            sparkSettings.put(entry.getKey().replace("\"", ""), String.valueOf(entry.getValue().unwrapped()));
        }
        try {
            this.jars = List.copyOf(c.getStringList("backend.jars"));
        } catch (ConfigException.WrongType e) {
            throw r.error("backend.jars", "expected a list of jar paths");
        }
        this.connectTimeoutSeconds = r.integer("backend.connect-timeout-seconds", 1, 3600);
        this.threads = r.integer("backend.threads", 0, 4096);
        this.blockSize = r.integer("backend.block-size", 0, Integer.MAX_VALUE);
        String folder = r.text("output.folder");
        if (folder == null || folder.isBlank()) {
            throw r.error("output.folder", "must name a folder");
        }
        this.outputFolder = Path.of(folder);
        this.progress = Progress.valueOf(r.choice("output.progress", List.of("auto", "live", "log", "off"))
                .toUpperCase(java.util.Locale.ROOT));
        this.checkpointEnabled = r.bool("checkpoint.enabled");
        String path = r.text("checkpoint.path");
        if (path != null && path.isBlank()) {
            throw r.error("checkpoint.path", "must name a folder or URI, or be null for the run folder's checkpoints/");
        }
        if (path != null) {
            try {
                new org.apache.hadoop.fs.Path(path);
            } catch (IllegalArgumentException e) {
                throw r.error("checkpoint.path", "is not a path or URI: " + e.getMessage());
            }
            String unsupported = checkpointEnabled ? CheckpointFileSystem.unsupportedOnThisJava(path) : null;
            if (unsupported != null) {
                throw r.error("checkpoint.path", unsupported);
            }
        }
        this.checkpointPath = path;
        this.checkpointEveryIterations = r.integer("checkpoint.every-iterations", 1, 1_000_000);
        this.checkpointEveryMinutes = r.number("checkpoint.every-minutes", 0, true, 100_000, true);
        this.checkpointKeep = r.integer("checkpoint.keep", 1, 1000);
        this.maxWallTime = r.has("limits.max-wall-time") ? r.duration("limits.max-wall-time") : null;
        this.stopGraceSeconds = r.integer("limits.stop-grace-seconds", 1, 86_400);
    }

    /**
     * The folder a relative path in {@code value} is read from: that of the file it is written in
     * (an included file's own folder), else the run file's (a --set override, a batch's layers).
     */
    private static Path folderOf(ConfigValue value, RunFile file) {
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

    private static SamplerSettings samplerSettings(SettingsReader r) {
        SamplerSettings.Builder b = SamplerSettings.builder();
        b.particles(r.integer("sampler.particles", 2, 100_000_000));
        b.seed(r.seed("sampler.seed"));
        b.maxIterations(r.integer("sampler.max-iterations", 1, 1_000_000));
        b.minimumDistinctEves(r.integer("sampler.minimum-distinct-ancestors", 1, Integer.MAX_VALUE));
        b.evaluationRetries(r.integer(RETRIES_KEY, 0, 100));
        b.maxInvalidFraction(r.number(MAX_INVALID_FRACTION_KEY, 0, true, 1, true));
        String scheme = r.choice("sampler.resampling.scheme",
                List.of("multinomial", "stratified", "systematic", "residual"));
        b.resamplingScheme(ResamplingScheme.valueOf(scheme.toUpperCase(java.util.Locale.ROOT)));
        b.resampleThreshold(r.number("sampler.resampling.threshold", 0, false, 1, true));
        b.resampleEveryIteration(r.bool("sampler.resampling.every-iteration"));
        b.islands(r.integer("sampler.islands.count", 0, 10_000_000));
        b.islandInteractionEvery(r.integer("sampler.islands.interaction-every", 0, 1_000_000));
        b.islandInteractionThreshold(r.number("sampler.islands.interaction-threshold", 0, true, 1, true));
        String rule = r.choice("sampler.tempering.rule", List.of("adaptive", "fixed"));
        if (rule.equals("adaptive")) {
            b.temperatureRule(new AdaptiveTemperature(r.number("sampler.tempering.target", 0, false, 1, false)));
        } else {
            double[] schedule = r.numbers("sampler.tempering.schedule");
            try {
                b.temperatureRule(new FixedSchedule(schedule));
            } catch (IllegalArgumentException e) {
                throw r.error("sampler.tempering.schedule", e.getMessage());
            }
        }
        if (r.choice("sampler.sequence", List.of("likelihood-tempering", "data-tempering")).equals("data-tempering")) {
            ConfigValue batch = r.config().getValue("sampler.data-tempering.batch");
            if (batch.valueType() == ConfigValueType.NUMBER) {
                b.targets(SequenceSettings.fixedBatches(r.integer("sampler.data-tempering.batch", 1, 100_000_000)));
            } else if ("adaptive".equals(batch.unwrapped())) {
                b.targets(SequenceSettings.adaptiveBatches(r.integer("sampler.data-tempering.window", 1, 10_000),
                        r.number("sampler.data-tempering.target", 0, false, 1, false)));
            } else {
                throw r.error("sampler.data-tempering.batch", "must be \"adaptive\" or a number of observations");
            }
        }
        String kernel = r.choice("sampler.moves.kernel", List.of("random-walk", "independence"));
        b.moveKernel(kernel.equals("random-walk") ? MoveKernel.RANDOM_WALK : MoveKernel.INDEPENDENCE);
        ConfigValue steps = r.config().getValue("sampler.moves.steps");
        if (steps.valueType() == ConfigValueType.NUMBER) {
            b.fixedSteps(r.integer("sampler.moves.steps", 1, 65535));
        } else if (!"adaptive".equals(steps.unwrapped())) {
            throw r.error("sampler.moves.steps", "must be \"adaptive\" or a number of steps");
        }
        b.stayProbability(r.number("sampler.moves.stay-probability", 0, false, 1, false));
        b.maxSteps(r.integer("sampler.moves.max-steps", 1, 65535));
        b.initialScale(r.number("sampler.moves.initial-scale", 0, false, 100, true));
        ConfigValue target = r.config().getValue("sampler.moves.target-acceptance");
        if (target.valueType() == ConfigValueType.NUMBER) {
            b.targetAcceptance(r.number("sampler.moves.target-acceptance", 0, false, 1, false));
        } else if ("auto".equals(target.unwrapped())) {
            b.targetAcceptance(Double.NaN);
        } else {
            throw r.error("sampler.moves.target-acceptance", "must be \"auto\" or a number in (0, 1)");
        }
        try {
            return b.build();
        } catch (IllegalArgumentException e) {
            throw r.error("sampler.islands.count", e.getMessage());
        }
    }

    /** Checks every setting of a loaded run file. */
    public static RunSpec from(RunFile file) {
        try {
            return new RunSpec(file, SettingsReader.of(file.config()));
        } catch (SettingsException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    public RunFile file() {
        return file;
    }

    public String name() {
        return name;
    }

    /** The built-in model name, or null. */
    public String modelName() {
        return modelName;
    }

    /** The user model class name, or null. */
    public String modelClass() {
        return modelClass;
    }

    /** A label for outputs: the model name or class. */
    public String modelLabel() {
        return modelName != null ? modelName : modelClass;
    }

    public Config modelSettings() {
        return modelSettings;
    }

    /** The data file (absolute), or null. */
    public Path dataFile() {
        return dataFile;
    }

    /** The inline data object, or null. */
    public Config inlineData() {
        return inlineData;
    }

    /** Explicit role-to-column bindings. */
    public Map<String, String> columnBindings() {
        return columnBindings;
    }

    public SamplerSettings sampler() {
        return sampler;
    }

    /** "spark" or "threads". */
    public String backendKind() {
        return backendKind;
    }

    public String master() {
        return master;
    }

    /** Partitions for the Spark backend; 0 for automatic. */
    public int partitions() {
        return partitions;
    }

    /** Extra {@code spark.*} settings. */
    public Map<String, String> sparkSettings() {
        return sparkSettings;
    }

    /** Extra jars for the executors. */
    public List<String> jars() {
        return jars;
    }

    public int connectTimeoutSeconds() {
        return connectTimeoutSeconds;
    }

    public int threads() {
        return threads;
    }

    public int blockSize() {
        return blockSize;
    }

    public Path outputFolder() {
        return outputFolder;
    }

    /** Whether checkpoints are written. */
    public boolean checkpointEnabled() {
        return checkpointEnabled;
    }

    /** The checkpoint root as given (a path or URI), or null for the run folder's {@code checkpoints/}. */
    public String checkpointPath() {
        return checkpointPath;
    }

    public int checkpointEveryIterations() {
        return checkpointEveryIterations;
    }

    /** Minutes between checkpoints, or 0 to count iterations instead. */
    public double checkpointEveryMinutes() {
        return checkpointEveryMinutes;
    }

    public int checkpointKeep() {
        return checkpointKeep;
    }

    /** The wall-time limit of one invocation, or null. */
    public java.time.Duration maxWallTime() {
        return maxWallTime;
    }

    public int stopGraceSeconds() {
        return stopGraceSeconds;
    }

    public Progress progress() {
        return progress;
    }
}
