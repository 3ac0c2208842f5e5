package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigValueType;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.skerry.engine.model.settings.ModelSettings;

/**
 * A model's settings read from the {@code model.settings} section of a run file, with the data
 * columns bound to the model's roles. Wrong types and missing keys become
 * {@link IllegalArgumentException}s naming the run file line and key, as the model interface
 * expects.
 */
public final class ConfigModelSettings implements ModelSettings {

    private final Config config;
    private final String prefix;
    private final Map<String, double[]> columns;
    private final String dataSource;
    /** The roles whose column the model read, shared with the views {@link #at} makes. */
    private final Set<String> read;

    private ConfigModelSettings(Config config, String prefix, Map<String, double[]> columns, String dataSource,
            Set<String> read) {
        this.config = config;
        this.prefix = prefix;
        this.columns = columns;
        this.dataSource = dataSource;
        this.read = read;
    }

    /**
     * @param settings   the {@code model.settings} object (possibly empty)
     * @param columns    data columns by role, in binding order
     * @param dataSource where the data came from, for messages
     */
    public static ConfigModelSettings of(Config settings, Map<String, double[]> columns, String dataSource) {
        return new ConfigModelSettings(settings, "model.settings.", new LinkedHashMap<>(columns), dataSource,
                java.util.Collections.synchronizedSet(new LinkedHashSet<>()));
    }

    /** Settings without data. */
    public static ConfigModelSettings of(Config settings) {
        return of(settings, Map.of(), "no data");
    }

    private IllegalArgumentException error(String key, String problem) {
        String value = config.hasPath(key) ? config.getValue(key).render() : "(not set)";
        return new IllegalArgumentException(where(key) + ": " + prefix + key + " = " + value + ": " + problem);
    }

    private IllegalArgumentException missing(String key) {
        return new IllegalArgumentException(RunFile.describe(config.origin()) + ": the model needs setting "
                + prefix + key + ", which is not set");
    }

    @Override
    public boolean has(String key) {
        return config.hasPath(key);
    }

    @Override
    public double getDouble(String key) {
        if (!config.hasPath(key)) {
            throw missing(key);
        }
        try {
            return config.getDouble(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a number");
        }
    }

    @Override
    public double getDouble(String key, double fallback) {
        return config.hasPath(key) ? getDouble(key) : fallback;
    }

    @Override
    public int getInt(String key) {
        if (!config.hasPath(key)) {
            throw missing(key);
        }
        java.math.BigDecimal value = TypedReader.wholeNumber(config.getValue(key));
        if (value == null) {
            throw error(key, "expected a whole number");
        }
        if (value.compareTo(java.math.BigDecimal.valueOf(Integer.MIN_VALUE)) < 0
                || value.compareTo(java.math.BigDecimal.valueOf(Integer.MAX_VALUE)) > 0) {
            throw error(key, "must be between " + Integer.MIN_VALUE + " and " + Integer.MAX_VALUE);
        }
        return value.intValueExact();
    }

    @Override
    public int getInt(String key, int fallback) {
        return config.hasPath(key) ? getInt(key) : fallback;
    }

    @Override
    public boolean getBoolean(String key, boolean fallback) {
        if (!config.hasPath(key)) {
            return fallback;
        }
        try {
            return config.getBoolean(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected true or false");
        }
    }

    @Override
    public String getString(String key) {
        if (!config.hasPath(key)) {
            throw missing(key);
        }
        ConfigValueType type = config.getValue(key).valueType();
        if (type == ConfigValueType.OBJECT || type == ConfigValueType.LIST) {
            throw error(key, "expected a text value");
        }
        return config.getString(key);
    }

    @Override
    public String getString(String key, String fallback) {
        return config.hasPath(key) ? getString(key) : fallback;
    }

    @Override
    public double[] getDoubles(String key) {
        if (!config.hasPath(key)) {
            throw missing(key);
        }
        try {
            List<Double> list = config.getDoubleList(key);
            double[] values = new double[list.size()];
            for (int i = 0; i < values.length; i++) {
                values[i] = list.get(i);
            }
            return values;
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a list of numbers");
        }
    }

    @Override
    public List<String> getStrings(String key) {
        if (!config.hasPath(key)) {
            throw missing(key);
        }
        try {
            return new ArrayList<>(config.getStringList(key));
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a list of text values");
        }
    }

    @Override
    public ModelSettings at(String key) {
        Config child;
        try {
            child = config.hasPath(key) ? config.getConfig(key) : ConfigFactory.empty(where(key));
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected an object { … }");
        }
        return new ConfigModelSettings(child, prefix + key + ".", columns, dataSource, read);
    }

    @Override
    public Set<String> keys() {
        Set<String> keys = new TreeSet<>();
        config.root().keySet().forEach(keys::add);
        return Collections.unmodifiableSet(keys);
    }

    @Override
    public String where(String key) {
        try {
            return RunFile.describe(config.getValue(key).origin());
        } catch (ConfigException e) {
            return RunFile.describe(config.origin());
        }
    }

    @Override
    public boolean hasColumn(String role) {
        return columns.containsKey(role);
    }

    /** The roles whose data column the model has read so far ({@link #column}), in order. */
    public Set<String> rolesRead() {
        synchronized (read) {
            return Set.copyOf(new ArrayList<>(read));
        }
    }

    @Override
    public double[] column(String role) {
        double[] column = columns.get(role);
        if (column != null) {
            read.add(role);
        }
        if (column == null) {
            throw new IllegalArgumentException("the model needs data for role '" + role + "', but " + dataSource
                    + " binds only " + columns.keySet() + " (bind a column with data.columns." + role + " = \"name\")");
        }
        return column.clone();
    }

    @Override
    public Set<String> columnRoles() {
        return Collections.unmodifiableSet(new LinkedHashSet<>(columns.keySet()));
    }
}
