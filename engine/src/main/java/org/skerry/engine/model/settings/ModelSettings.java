package org.skerry.engine.model.settings;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigValueFactory;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * The settings a model is built from: a Typesafe Config tree addressed by dotted keys
 * ({@code prior.mu.sd}), read with the rules of {@link SettingsReader}, plus the data columns
 * bound to the model's roles. A run file's {@code model.settings} backs it on the command line and
 * on executors; {@link #builder()} builds one in memory for tests and embedded use.
 *
 * <p>Every getter fails fast with a {@link SettingsException} (an {@link IllegalArgumentException})
 * naming where the setting is, its full key and its value. Immutable, apart from the record of
 * which data roles were read, which only grows.
 */
public final class ModelSettings {

    private final SettingsReader reader;
    private final Map<String, double[]> columns;
    private final String dataSource;
    /** The roles whose column the model read, shared with the views {@link #at} makes. */
    private final Set<String> read;

    private ModelSettings(SettingsReader reader, Map<String, double[]> columns, String dataSource, Set<String> read) {
        this.reader = reader;
        this.columns = columns;
        this.dataSource = dataSource;
        this.read = read;
    }

    /**
     * Settings read from {@code settings}, which sits at {@code path} in its file (messages name
     * keys with that prefix), with data columns by role in binding order.
     *
     * @param dataSource where the data came from, for messages
     */
    public static ModelSettings of(Config settings, String path, Map<String, double[]> columns, String dataSource) {
        Map<String, double[]> copy = new LinkedHashMap<>();
        columns.forEach((role, values) -> copy.put(role, values.clone()));
        return new ModelSettings(SettingsReader.of(settings, path), Collections.unmodifiableMap(copy), dataSource,
                Collections.synchronizedSet(new LinkedHashSet<>()));
    }

    /** Settings without data, keys named as they are in {@code settings}. */
    public static ModelSettings of(Config settings) {
        return of(settings, "", Map.of(), "no data");
    }

    /**
     * Settings holding {@code tree} (nested {@code Map<String, ?>} objects, keys without dots) and
     * no data.
     */
    public static ModelSettings of(Map<String, ?> tree) {
        return builder().setAll(tree).build();
    }

    /** Empty settings with no data. */
    public static ModelSettings empty() {
        return builder().build();
    }

    /** A builder with origin {@code "settings"} and nothing set. */
    public static Builder builder() {
        return new Builder();
    }

    /** The reader behind these settings, for models that read structures of their own (lists of objects). */
    public SettingsReader reader() {
        return reader;
    }

    /** The settings' Typesafe Config tree. */
    public Config config() {
        return reader.config();
    }

    /** Whether a value (of any type, including a nested object) is set at {@code key}. */
    public boolean has(String key) {
        return reader.has(key);
    }

    /** The number at {@code key}; fails if it is missing or not a finite number. */
    public double getDouble(String key) {
        return reader.number(key);
    }

    /** The number at {@code key}, or {@code fallback} if nothing is set there. */
    public double getDouble(String key, double fallback) {
        return has(key) ? reader.number(key) : fallback;
    }

    /** The number at {@code key} (or {@code fallback}), which must be finite and {@code > 0}. */
    public double getPositive(String key, double fallback) {
        double value = getDouble(key, fallback);
        if (!(value > 0)) {
            throw outOfRange(key, value, "must be finite and > 0");
        }
        return value;
    }

    /** The number at {@code key} (or {@code fallback}), which must lie in the open interval (0, 1). */
    public double getFraction(String key, double fallback) {
        double value = getDouble(key, fallback);
        if (!(value > 0 && value < 1)) {
            throw outOfRange(key, value, "must be in (0, 1)");
        }
        return value;
    }

    /** The whole number at {@code key}; fails if it is missing, not a number or not integral. */
    public int getInt(String key) {
        return reader.integer(key, Integer.MIN_VALUE, Integer.MAX_VALUE);
    }

    /** The whole number at {@code key}, or {@code fallback} if nothing is set there. */
    public int getInt(String key, int fallback) {
        return has(key) ? getInt(key) : fallback;
    }

    /** The whole number at {@code key} (or {@code fallback}), which must be at least {@code minimum}. */
    public int getInt(String key, int fallback, int minimum) {
        int value = getInt(key, fallback);
        if (value < minimum) {
            throw outOfRange(key, value, "must be >= " + minimum);
        }
        return value;
    }

    /** "where, key: rule, was value", the form a factory's own checks use too. */
    private IllegalArgumentException outOfRange(String key, Object value, String rule) {
        return new SettingsException(where(key) + ": " + rule + ", was " + value);
    }

    /** The boolean at {@code key}, or {@code fallback} if nothing is set there. */
    public boolean getBoolean(String key, boolean fallback) {
        return has(key) ? reader.bool(key) : fallback;
    }

    /** The text at {@code key}; fails if it is missing or not a plain value. */
    public String getString(String key) {
        return reader.requiredText(key);
    }

    /** The text at {@code key}, or {@code fallback} if nothing is set there. */
    public String getString(String key, String fallback) {
        return has(key) ? reader.text(key) : fallback;
    }

    /** The list of numbers at {@code key} (a fresh array); fails if missing or not such a list. */
    public double[] getDoubles(String key) {
        return reader.numbers(key);
    }

    /** The list of plain values at {@code key}, as text; fails if missing or not a list. */
    public List<String> getStrings(String key) {
        return reader.texts(key);
    }

    /**
     * The nested object at {@code key} as settings of its own; keys in the view are relative to
     * {@code key}, while messages still name full keys. Fails if {@code key} does not hold an
     * object.
     */
    public ModelSettings at(String key) {
        return new ModelSettings(reader.at(key), columns, dataSource, read);
    }

    /** The keys directly below this level, in sorted order. */
    public Set<String> keys() {
        return reader.keys();
    }

    /**
     * Where {@code key} is (or would be) defined and its full key, for a factory's own error
     * messages: {@code "run.conf: line 12, model.settings.prior.mu"}, or for settings built in
     * memory their origin and key ({@code "settings, prior.mu"}).
     */
    public String where(String key) {
        return reader.where(key) + ", " + reader.fullKey(key);
    }

    /** The key as written in the file ({@code model.settings.prior.mu.sd}), for messages. */
    public String fullKey(String key) {
        return reader.fullKey(key);
    }

    /** Whether a data column is bound to {@code role}. */
    public boolean hasColumn(String role) {
        return columns.containsKey(role);
    }

    /**
     * The data column bound to {@code role}, as a fresh array; fails with a message naming the
     * role and the roles that are bound.
     */
    public double[] column(String role) {
        double[] column = columns.get(role);
        if (column == null) {
            throw new IllegalArgumentException("the model needs data for role '" + role + "', but " + dataSource
                    + " binds only " + columns.keySet() + " (bind a column with data.columns." + role + " = \"name\")");
        }
        read.add(role);
        return column.clone();
    }

    /** The roles that have a data column bound, in their order of binding. */
    public Set<String> columnRoles() {
        return columns.keySet();
    }

    /** The roles whose data column the model has read so far ({@link #column}). */
    public Set<String> rolesRead() {
        synchronized (read) {
            return Set.copyOf(new ArrayList<>(read));
        }
    }

    @Override
    public String toString() {
        return "settings(" + where("") + ": " + reader.config().root().render() + ", columns " + columns.keySet() + ")";
    }

    /** Collects settings and columns in memory; not thread-safe. */
    public static final class Builder {

        private final Map<String, Object> tree = new LinkedHashMap<>();
        private final Map<String, double[]> columns = new LinkedHashMap<>();
        private String origin = "settings";

        private Builder() {
        }

        /** What messages name as the source, for example a file name. */
        public Builder origin(String origin) {
            if (origin == null || origin.isBlank()) {
                throw new IllegalArgumentException("origin must not be blank, was '" + origin + "'");
            }
            this.origin = origin;
            return this;
        }

        /**
         * Sets {@code value} at the dotted {@code key}, creating the objects on the way. The
         * value may be a number, text, boolean, list of those, a nested {@code Map<String, ?>},
         * or a {@code double[]} (stored as a list); numbers must be finite.
         */
        @SuppressWarnings("unchecked")
        public Builder set(String key, Object value) {
            requireKey(key);
            String[] parts = key.split("\\.");
            Map<String, Object> node = tree;
            for (int i = 0; i < parts.length - 1; i++) {
                Object child = node.get(parts[i]);
                if (!(child instanceof Map)) {
                    child = new LinkedHashMap<String, Object>();
                    node.put(parts[i], child);
                }
                node = (Map<String, Object>) child;
            }
            node.put(parts[parts.length - 1], copy(key, value));
            return this;
        }

        /** Sets every entry of {@code values} as by {@link #set}, keys read as dotted paths. */
        public Builder setAll(Map<String, ?> values) {
            for (Map.Entry<String, ?> entry : values.entrySet()) {
                set(entry.getKey(), entry.getValue());
            }
            return this;
        }

        /** Binds a copy of {@code values} to the data role {@code role}. */
        public Builder column(String role, double[] values) {
            if (role == null || role.isBlank()) {
                throw new IllegalArgumentException("role must not be blank, was '" + role + "'");
            }
            columns.put(role, values.clone());
            return this;
        }

        public ModelSettings build() {
            Config config = tree.isEmpty() ? ConfigFactory.empty(origin)
                    : ConfigValueFactory.fromMap(tree, origin).toConfig();
            return ModelSettings.of(config, "", columns, "the settings' data");
        }

        private static void requireKey(String key) {
            if (key == null || key.isEmpty() || key.startsWith(".") || key.endsWith(".") || key.contains("..")) {
                throw new IllegalArgumentException("key must be a non-empty dotted path, was '" + key + "'");
            }
        }

        private static Object copy(String key, Object value) {
            if (value instanceof Number || value instanceof String || value instanceof Boolean) {
                if (value instanceof Double && !Double.isFinite((Double) value)
                        || value instanceof Float && !Float.isFinite((Float) value)) {
                    throw new IllegalArgumentException("setting " + key + " must be finite, was " + value);
                }
                return value instanceof Float ? (Object) ((Float) value).doubleValue() : value;
            }
            if (value instanceof double[]) {
                List<Object> list = new ArrayList<>();
                for (double x : (double[]) value) {
                    list.add(copy(key, x));
                }
                return list;
            }
            if (value instanceof List) {
                List<Object> list = new ArrayList<>();
                for (Object item : (List<?>) value) {
                    list.add(copy(key, item));
                }
                return list;
            }
            if (value instanceof Map) {
                Map<String, Object> map = new LinkedHashMap<>();
                for (Map.Entry<?, ?> entry : ((Map<?, ?>) value).entrySet()) {
                    Object k = entry.getKey();
                    if (!(k instanceof String) || ((String) k).isEmpty() || ((String) k).contains(".")) {
                        throw new IllegalArgumentException("setting " + key
                                + " has a key that is not a plain name: '" + k + "'");
                    }
                    map.put((String) k, copy(key + "." + k, entry.getValue()));
                }
                return map;
            }
            throw new IllegalArgumentException("setting " + key + " has unsupported value "
                    + value + (value == null ? "" : " of type " + value.getClass().getName()));
        }
    }
}
