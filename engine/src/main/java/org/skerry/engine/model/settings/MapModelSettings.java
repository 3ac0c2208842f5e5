package org.skerry.engine.model.settings;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * {@link ModelSettings} held in memory: a tree of nested maps whose leaves are numbers, text,
 * booleans or lists of those, plus a map from role to data column. Built with {@link #builder()}
 * or from an existing tree with {@link #of}; the tree and columns are copied, so an instance is
 * immutable and safe to share between threads.
 *
 * <p>Text that reads as a number is accepted where a number is asked for, as run files commonly
 * quote numbers.
 */
public final class MapModelSettings implements ModelSettings {

    private final String origin;
    private final String path;
    private final Map<String, Object> tree;
    private final Map<String, double[]> columns;

    private MapModelSettings(String origin, String path, Map<String, Object> tree,
            Map<String, double[]> columns) {
        this.origin = origin;
        this.path = path;
        this.tree = tree;
        this.columns = columns;
    }

    /** A builder with origin {@code "settings"} and nothing set. */
    public static Builder builder() {
        return new Builder();
    }

    /**
     * Settings holding a copy of {@code tree} (nested {@code Map<String, ?>} objects) and no data.
     *
     * @throws IllegalArgumentException if a key is blank or holds a dot, or a leaf has an
     *     unsupported type
     */
    public static MapModelSettings of(Map<String, ?> tree) {
        return builder().setAll(tree).build();
    }

    /** Empty settings with no data. */
    public static MapModelSettings empty() {
        return builder().build();
    }

    // ---- lookup -------------------------------------------------------------------------------

    private Object find(String key) {
        Object node = tree;
        int start = 0;
        requireKey(key);
        while (true) {
            int dot = key.indexOf('.', start);
            String part = dot < 0 ? key.substring(start) : key.substring(start, dot);
            if (!(node instanceof Map)) {
                return null;
            }
            node = ((Map<?, ?>) node).get(part);
            if (dot < 0 || node == null) {
                return node;
            }
            start = dot + 1;
        }
    }

    private static void requireKey(String key) {
        if (key == null || key.isEmpty() || key.startsWith(".") || key.endsWith(".")
                || key.contains("..")) {
            throw new IllegalArgumentException("key must be a non-empty dotted path, was '" + key + "'");
        }
    }

    private Object require(String key) {
        Object value = find(key);
        if (value == null) {
            throw new IllegalArgumentException(where(key) + ": missing setting");
        }
        return value;
    }

    private String fullPath(String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    private IllegalArgumentException wrongType(String key, String expected, Object value) {
        return new IllegalArgumentException(where(key) + ": expected " + expected + ", was "
                + describe(value));
    }

    private static String describe(Object value) {
        if (value instanceof Map) {
            return "an object " + ((Map<?, ?>) value).keySet();
        }
        if (value instanceof List) {
            return "a list " + value;
        }
        if (value instanceof String) {
            return "'" + value + "'";
        }
        return String.valueOf(value);
    }

    private double toDouble(String key, Object value) {
        if (value instanceof Number) {
            return ((Number) value).doubleValue();
        }
        if (value instanceof String) {
            try {
                return Double.parseDouble(((String) value).trim());
            } catch (NumberFormatException e) {
                throw wrongType(key, "a number", value);
            }
        }
        throw wrongType(key, "a number", value);
    }

    private int toInt(String key, Object value) {
        if (value instanceof Integer || value instanceof Short || value instanceof Byte) {
            return ((Number) value).intValue();
        }
        if (value instanceof Long) {
            long whole = (Long) value;
            if ((int) whole == whole) {
                return (int) whole;
            }
            throw wrongType(key, "a whole number in the int range", value);
        }
        double x = toDouble(key, value);
        if (x == StrictMath.rint(x) && x >= Integer.MIN_VALUE && x <= Integer.MAX_VALUE) {
            return (int) x;
        }
        throw wrongType(key, "a whole number in the int range", value);
    }

    // ---- ModelSettings ------------------------------------------------------------------------

    @Override
    public boolean has(String key) {
        return find(key) != null;
    }

    @Override
    public double getDouble(String key) {
        return toDouble(key, require(key));
    }

    @Override
    public double getDouble(String key, double fallback) {
        Object value = find(key);
        return value == null ? fallback : toDouble(key, value);
    }

    @Override
    public int getInt(String key) {
        return toInt(key, require(key));
    }

    @Override
    public int getInt(String key, int fallback) {
        Object value = find(key);
        return value == null ? fallback : toInt(key, value);
    }

    @Override
    public boolean getBoolean(String key, boolean fallback) {
        Object value = find(key);
        if (value == null) {
            return fallback;
        }
        if (value instanceof Boolean) {
            return (Boolean) value;
        }
        if ("true".equals(value)) {
            return true;
        }
        if ("false".equals(value)) {
            return false;
        }
        throw wrongType(key, "true or false", value);
    }

    @Override
    public String getString(String key) {
        Object value = require(key);
        if (value instanceof Map || value instanceof List) {
            throw wrongType(key, "a plain value", value);
        }
        return value.toString();
    }

    @Override
    public String getString(String key, String fallback) {
        return find(key) == null ? fallback : getString(key);
    }

    @Override
    public double[] getDoubles(String key) {
        Object value = require(key);
        if (!(value instanceof List)) {
            throw wrongType(key, "a list of numbers", value);
        }
        List<?> list = (List<?>) value;
        double[] out = new double[list.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = toDouble(key + "[" + i + "]", list.get(i));
        }
        return out;
    }

    @Override
    public List<String> getStrings(String key) {
        Object value = require(key);
        if (!(value instanceof List)) {
            throw wrongType(key, "a list", value);
        }
        List<String> out = new ArrayList<>();
        List<?> list = (List<?>) value;
        for (int i = 0; i < list.size(); i++) {
            Object item = list.get(i);
            if (item instanceof Map || item instanceof List) {
                throw wrongType(key + "[" + i + "]", "a plain value", item);
            }
            out.add(item.toString());
        }
        return Collections.unmodifiableList(out);
    }

    @Override
    @SuppressWarnings("unchecked")
    public ModelSettings at(String key) {
        Object value = require(key);
        if (!(value instanceof Map)) {
            throw wrongType(key, "an object", value);
        }
        return new MapModelSettings(origin, fullPath(key), (Map<String, Object>) value, columns);
    }

    @Override
    public Set<String> keys() {
        return tree.keySet();
    }

    @Override
    public String where(String key) {
        return origin + ", " + fullPath(key);
    }

    @Override
    public boolean hasColumn(String role) {
        return columns.containsKey(role);
    }

    @Override
    public double[] column(String role) {
        double[] column = columns.get(role);
        if (column == null) {
            throw new IllegalArgumentException(origin + ": no data column is bound to role '" + role
                    + "'; bound roles: " + columns.keySet());
        }
        return column.clone();
    }

    @Override
    public Set<String> columnRoles() {
        return columns.keySet();
    }

    @Override
    public String toString() {
        return "settings(" + origin + (path.isEmpty() ? "" : ", " + path) + ": " + tree + ", columns "
                + columns.keySet() + ")";
    }

    // ---- building -----------------------------------------------------------------------------

    /** Collects settings and columns; not thread-safe. */
    public static final class Builder {

        private final Map<String, Object> tree = new LinkedHashMap<>();
        private final Map<String, double[]> columns = new LinkedHashMap<>();
        private String origin = "settings";

        private Builder() {
        }

        /** What {@link ModelSettings#where} names as the source, for example a file name. */
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
         * or a {@code double[]} (stored as a list).
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

        public MapModelSettings build() {
            return new MapModelSettings(origin, "", freeze(tree),
                    Collections.unmodifiableMap(new LinkedHashMap<>(columns)));
        }

        private static Object copy(String key, Object value) {
            if (value instanceof Number || value instanceof String || value instanceof Boolean) {
                if (value instanceof Double && !Double.isFinite((Double) value)
                        || value instanceof Float && !Float.isFinite((Float) value)) {
                    throw new IllegalArgumentException("setting " + key + " must be finite, was " + value);
                }
                return value;
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

        @SuppressWarnings("unchecked")
        private static Map<String, Object> freeze(Map<String, Object> map) {
            Map<String, Object> frozen = new LinkedHashMap<>();
            for (Map.Entry<String, Object> entry : map.entrySet()) {
                Object value = entry.getValue();
                if (value instanceof Map) {
                    value = freeze((Map<String, Object>) value);
                } else if (value instanceof List) {
                    value = Collections.unmodifiableList(new ArrayList<>((List<Object>) value));
                }
                frozen.put(entry.getKey(), value);
            }
            return Collections.unmodifiableMap(frozen);
        }
    }
}
