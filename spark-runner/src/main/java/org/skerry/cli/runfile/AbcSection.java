package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.skerry.cli.data.CsvDataReader;
import org.skerry.cli.data.DataException;
import org.skerry.cli.data.DataTable;
import org.skerry.engine.abc.AbcKernel;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.abc.ToleranceRule;
import org.skerry.engine.settings.SettingsReader;

/**
 * Reads a run file's {@code sampler.abc} keys into the engine's {@link AbcSettings}, naming the
 * key (or the observed-summary file and line) of a value it refuses. Names of summaries are
 * checked against the model later, when it is built ({@link ModelBuilder}).
 */
final class AbcSection {

    static final String KEY = "sampler.abc";

    private AbcSection() {
    }

    static AbcSettings read(SettingsReader r, RunFile file) {
        double[] schedule = r.numbers(KEY + ".schedule");
        double finalTolerance;
        if (schedule.length > 0) {
            if (r.config().hasPath(KEY + ".final-tolerance")) {
                throw r.error(KEY + ".schedule", "give a schedule or a final tolerance, not both (the schedule ends "
                        + "at the final tolerance)");
            }
            finalTolerance = schedule[schedule.length - 1];
        } else {
            if (!r.config().hasPath(KEY + ".final-tolerance")) {
                throw r.error(KEY + ".final-tolerance", "sampler.sequence = abc needs a final tolerance (or a schedule)");
            }
            finalTolerance = r.number(KEY + ".final-tolerance", 0, false, Double.MAX_VALUE, true);
        }
        ToleranceRule rule = ToleranceRule.valueOf(r.choice(KEY + ".tolerance-rule", List.of("ess", "share"))
                .toUpperCase(java.util.Locale.ROOT));
        double factor = r.number(KEY + ".ess-factor", 0, false, 1, false);
        double share = r.number(KEY + ".share-factor", 0, false, 1, false);
        int simulations = r.integer(KEY + ".simulations-per-particle", 1, 10_000);
        AbcKernel kernel = AbcKernel.valueOf(r.choice(KEY + ".kernel", List.of("uniform", "gaussian"))
                .toUpperCase(java.util.Locale.ROOT));
        Map<String, Double> weights = named(r, KEY + ".distance-weights", true);
        int fixedSteps = 0;
        ConfigValue steps = r.config().getValue(KEY + ".steps");
        if (steps.valueType() == ConfigValueType.NUMBER) {
            fixedSteps = r.integer(KEY + ".steps", 1, 65535);
        } else if (!"adaptive".equals(steps.unwrapped())) {
            throw r.error(KEY + ".steps", "must be \"adaptive\" or a number of steps");
        }
        double stay = r.number(KEY + ".stay-probability", 0, false, 1, false);
        int maxSteps = r.integer(KEY + ".max-steps", 1, 65535);
        double floor = r.number(KEY + ".acceptance-floor", 0, true, 1, false);
        long budget = r.wholeNumber(KEY + ".simulation-budget", 0, Long.MAX_VALUE);
        Map<String, Double> observed = named(r, KEY + ".observed", false);
        String observedFile = r.text(KEY + ".observed-file");
        if (observedFile != null) {
            if (observed != null) {
                throw r.error(KEY + ".observed-file", "give observed summaries in the run file or in a file, not both");
            }
            Path path = ModelSpec.folderOf(r.config().getValue(KEY + ".observed-file"), file).resolve(observedFile)
                    .normalize();
            observed = observedFile(r, path);
        }
        try {
            return new AbcSettings(finalTolerance, schedule, rule, factor, share, simulations, kernel, weights, fixedSteps, stay,
                    maxSteps, floor, budget, observed);
        } catch (IllegalArgumentException e) {
            throw r.error(schedule.length > 0 ? KEY + ".schedule" : KEY, e.getMessage());
        }
    }

    /** An object of summary name = number, or null when the key is null. */
    private static Map<String, Double> named(SettingsReader r, String key, boolean positive) {
        if (!r.config().hasPath(key)) {
            return null;
        }
        ConfigValue value = r.config().getValue(key);
        if (value.valueType() != ConfigValueType.OBJECT) {
            throw r.error(key, "must be an object of summary name = number, e.g. { mean = 1.5 }");
        }
        Config object = r.config().getConfig(key);
        Map<String, Double> values = new LinkedHashMap<>();
        for (String name : new java.util.TreeSet<>(object.root().keySet())) {
            String full = key + ".\"" + name + "\"";
            values.put(name, positive ? r.number(full, 0, false, Double.MAX_VALUE, true) : r.number(full));
        }
        return values;
    }

    /** A CSV file with a header of summary names and one row of values. */
    private static Map<String, Double> observedFile(SettingsReader r, Path path) {
        DataTable table;
        try {
            table = CsvDataReader.read(path);
        } catch (DataException e) {
            throw r.error(KEY + ".observed-file", e.getMessage());
        }
        if (table.rowCount() != 1) {
            throw r.error(KEY + ".observed-file", path + " must hold one row of observed summaries under a header of "
                    + "their names; it holds " + table.rowCount() + " rows");
        }
        Map<String, Double> values = new LinkedHashMap<>();
        for (String column : table.columns()) {
            values.put(column, table.column(column)[0]);
        }
        return values;
    }
}
