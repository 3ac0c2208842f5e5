package org.skerry.engine.settings;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigList;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.math.BigDecimal;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Pattern;

/**
 * Reads typed values from Typesafe Config with the one set of rules every settings file follows
 * (run, batch and study files, model settings), and reports a bad value as a
 * {@link SettingsException} that names the file, line, full key and value.
 *
 * <p>The rules: a <em>number</em> is a HOCON number or text in decimal notation ({@code "2.5e-3"},
 * as files often quote numbers); {@code NaN}, infinities, hexadecimal and type suffixes
 * ({@code 1f}) are refused, and so is a number too large for a double, so every number read is
 * finite. A <em>whole number</em> is a number whose exact decimal value is integral ({@code 200.7}
 * is refused, never truncated; {@code 1e3} is 1000). A <em>boolean</em> is HOCON's: {@code true}
 * or {@code false}, also as text, and the words {@code yes}, {@code no}, {@code on}, {@code off}.
 * <em>Text</em> is any plain value. Immutable.
 */
public final class SettingsReader {

    /** Decimal notation: what {@link BigDecimal} and {@link Double#parseDouble} both read alike. */
    private static final Pattern DECIMAL = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    private final Config config;
    private final String path;

    private SettingsReader(Config config, String path) {
        this.config = config;
        this.path = path;
    }

    /** A reader of {@code config}, whose keys are named as they are in messages. */
    public static SettingsReader of(Config config) {
        return of(config, "");
    }

    /**
     * A reader of {@code config} that sits at {@code path} in a larger file ({@code model.settings}):
     * messages name keys with that prefix, so a user finds them.
     */
    public static SettingsReader of(Config config, String path) {
        if (config == null) {
            throw new IllegalArgumentException("config must not be null");
        }
        if (path == null) {
            throw new IllegalArgumentException("path must not be null");
        }
        return new SettingsReader(config, path);
    }

    public Config config() {
        return config;
    }

    /** The path of this reader in the file ("" at the top). */
    public String path() {
        return path;
    }

    /** The key as a user wrote it in the file: this reader's path, then {@code key}. */
    public String fullKey(String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    /** Whether a non-null value is set at {@code key}. */
    public boolean has(String key) {
        try {
            return config.hasPath(key);
        } catch (ConfigException.BadPath e) {
            throw new SettingsException(Origins.describe(config.origin()) + ": '" + fullKey(key)
                    + "' is not a valid key: " + e.getMessage(), e);
        }
    }

    /** Whether {@code key} is absent or set to null. */
    private boolean absent(String key) {
        return !has(key);
    }

    /** Where {@code key} is written ("run.conf: line 12"), or where these settings come from. */
    public String where(String key) {
        try {
            return Origins.describe(config.getValue(key).origin());
        } catch (ConfigException e) {
            return Origins.describe(config.origin());
        }
    }

    /** A located error: "where: full.key = value: problem". */
    public SettingsException error(String key, String problem) {
        String value = has(key) ? render(config.getValue(key)) : "null";
        return new SettingsException(where(key) + ": " + fullKey(key) + " = " + value + ": " + problem);
    }

    /** A value as messages show it: scalars as HOCON writes them, lists and objects on one line. */
    private static String render(ConfigValue value) {
        com.typesafe.config.ConfigValueType type = value.valueType();
        return type == com.typesafe.config.ConfigValueType.LIST || type == com.typesafe.config.ConfigValueType.OBJECT
                ? value.render(com.typesafe.config.ConfigRenderOptions.concise()) : value.render();
    }

    /** A located error for a required setting that is not set: "where, full.key: missing setting". */
    public SettingsException missing(String key) {
        return new SettingsException(where(key) + ", " + fullKey(key) + ": missing setting");
    }

    private ConfigValue required(String key) {
        if (absent(key)) {
            throw missing(key);
        }
        return config.getValue(key);
    }

    // ---- the rules ----------------------------------------------------------------------------

    /** The finite number {@code value} holds under the rules above, or null. */
    public static Double finiteNumber(ConfigValue value) {
        Object raw = value.unwrapped();
        double number;
        if (raw instanceof Integer || raw instanceof Long || raw instanceof Double) {
            number = ((Number) raw).doubleValue();
        } else if (raw instanceof String) {
            String text = ((String) raw).trim();
            if (!DECIMAL.matcher(text).matches()) {
                return null;
            }
            number = Double.parseDouble(text);
        } else {
            return null;
        }
        return Double.isFinite(number) ? number : null;
    }

    /**
     * The exact value of a whole number {@code value} holds under the rules above, or null. The
     * value is compared exactly, never through a rounded {@code long}.
     */
    public static BigDecimal wholeNumber(ConfigValue value) {
        Object raw = value.unwrapped();
        BigDecimal exact;
        if (raw instanceof Integer || raw instanceof Long) {
            return BigDecimal.valueOf(((Number) raw).longValue());
        } else if (raw instanceof Double) {
            double d = (Double) raw;
            if (!Double.isFinite(d)) {
                return null;
            }
            exact = new BigDecimal(d);
        } else if (raw instanceof String) {
            String text = ((String) raw).trim();
            if (!DECIMAL.matcher(text).matches()) {
                return null;
            }
            exact = new BigDecimal(text);
        } else {
            return null;
        }
        return exact.signum() == 0 || exact.stripTrailingZeros().scale() <= 0 ? exact : null;
    }

    // ---- typed values -------------------------------------------------------------------------

    /** A finite number. */
    public double number(String key) {
        Double value = finiteNumber(required(key));
        if (value == null) {
            throw error(key, "expected a finite number");
        }
        return value;
    }

    /** A number in (low, high] or [low, high] as {@code closedLow} and {@code closedHigh} say. */
    public double number(String key, double low, boolean closedLow, double high, boolean closedHigh) {
        double value = number(key);
        boolean aboveLow = closedLow ? value >= low : value > low;
        boolean belowHigh = closedHigh ? value <= high : value < high;
        if (!aboveLow || !belowHigh) {
            throw error(key, "must be in " + (closedLow ? "[" : "(") + low + ", " + high + (closedHigh ? "]" : ")"));
        }
        return value;
    }

    /** A whole number in [min, max]; a fraction or a number out of range is refused with the range. */
    public long wholeNumber(String key, long min, long max) {
        BigDecimal value = wholeNumber(required(key));
        if (value == null) {
            throw error(key, "expected a whole number");
        }
        if (value.compareTo(BigDecimal.valueOf(min)) < 0 || value.compareTo(BigDecimal.valueOf(max)) > 0) {
            throw error(key, "must be between " + min + " and " + max);
        }
        return value.longValueExact();
    }

    /** A whole number in [min, max], as {@link #wholeNumber(String, long, long)}. */
    public int integer(String key, int min, int max) {
        return (int) wholeNumber(key, min, max);
    }

    /**
     * A seed: exactly the whole numbers a random stream can key, the 64-bit signed range
     * [-2^63, 2^63 - 1]. Anything else (a fraction, 2^63, {@code 1e30}) is refused: clamping or
     * rounding it would silently give another seed's run.
     */
    public long seed(String key) {
        BigDecimal value = wholeNumber(required(key));
        if (value == null) {
            throw error(key, "expected a whole number");
        }
        if (value.compareTo(BigDecimal.valueOf(Long.MIN_VALUE)) < 0
                || value.compareTo(BigDecimal.valueOf(Long.MAX_VALUE)) > 0) {
            throw error(key, "a seed must be a whole number from " + Long.MIN_VALUE + " to " + Long.MAX_VALUE
                    + " (-2^63 to 2^63 - 1: the 64-bit key of the random streams)");
        }
        return value.longValueExact();
    }

    /** A boolean. */
    public boolean bool(String key) {
        required(key);
        try {
            return config.getBoolean(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected true or false");
        }
    }

    /** Text, or null where the key is set to null or not set. */
    public String text(String key) {
        if (absent(key)) {
            return null;
        }
        ConfigValueType type = config.getValue(key).valueType();
        if (type == ConfigValueType.OBJECT || type == ConfigValueType.LIST) {
            throw error(key, "expected a text value");
        }
        return config.getString(key);
    }

    /** Text that must be set. */
    public String requiredText(String key) {
        required(key);
        return text(key);
    }

    /** One of the given words (case-insensitive, '-' and '_' alike), as written in {@code choices}. */
    public String choice(String key, List<String> choices) {
        String value = text(key);
        String normal = value == null ? "" : value.toLowerCase(Locale.ROOT).replace('_', '-');
        if (!choices.contains(normal)) {
            throw error(key, "must be one of " + String.join(", ", choices));
        }
        return normal;
    }

    /** A list of finite numbers, as a fresh array. */
    public double[] numbers(String key) {
        ConfigValue value = required(key);
        if (value.valueType() != ConfigValueType.LIST) {
            throw error(key, "expected a list of numbers");
        }
        ConfigList list = (ConfigList) value;
        double[] values = new double[list.size()];
        for (int i = 0; i < values.length; i++) {
            Double number = finiteNumber(list.get(i));
            if (number == null) {
                throw error(key, "expected a list of finite numbers; item " + (i + 1) + " is "
                        + list.get(i).render());
            }
            values[i] = number;
        }
        return values;
    }

    /** A list of plain values, as text. */
    public List<String> texts(String key) {
        required(key);
        try {
            return Collections.unmodifiableList(new ArrayList<>(config.getStringList(key)));
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a list of text values");
        }
    }

    /** The object at {@code key}. */
    public Config object(String key) {
        required(key);
        try {
            return config.getConfig(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected an object { … }");
        }
    }

    /** A reader of the object at {@code key}, naming keys with their full path. */
    public SettingsReader at(String key) {
        return new SettingsReader(object(key), fullKey(key));
    }

    /** The keys directly below this level, in sorted order. */
    public Set<String> keys() {
        return Collections.unmodifiableSet(new TreeSet<>(config.root().keySet()));
    }

    /** A positive duration such as {@code "11h30m"}, {@code "90m"} or {@code "3600s"}. */
    public Duration duration(String key) {
        required(key);
        Duration value;
        try {
            value = config.getDuration(key);
        } catch (ConfigException e) {
            throw error(key, "expected a duration such as \"11h30m\", \"90m\" or \"3600s\"");
        }
        if (value.isNegative() || value.isZero()) {
            throw error(key, "must be a positive duration, was " + value);
        }
        return value;
    }
}
