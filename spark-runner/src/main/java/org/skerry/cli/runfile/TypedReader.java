package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.math.BigDecimal;
import java.util.List;
import java.util.Locale;

/**
 * Reads typed values from a resolved run file, turning Typesafe Config's exceptions and our own
 * range checks into {@link RunFileException}s that name the file, line, key and value.
 */
public final class TypedReader {

    private final Config config;

    public TypedReader(Config config) {
        this.config = config;
    }

    public Config config() {
        return config;
    }

    public String where(String key) {
        return RunFile.where(config, key);
    }

    public RunFileException error(String key, String problem) {
        String value = config.hasPath(key) ? config.getValue(key).render() : "null";
        return new RunFileException(where(key) + ": " + key + " = " + value + ": " + problem);
    }

    public boolean isSet(String key) {
        return config.hasPath(key);
    }

    /**
     * A whole number in [min, max]. A fraction ({@code 200.7}) is refused, never truncated, and a
     * whole number outside the range ({@code 1e12}) is refused with the range.
     */
    public int getInt(String key, int min, int max) {
        return (int) getLong(key, min, max);
    }

    /** A whole number in [min, max]; see {@link #getInt}. */
    public long getLong(String key, long min, long max) {
        BigDecimal value = wholeNumber(key);
        if (value.compareTo(BigDecimal.valueOf(min)) < 0 || value.compareTo(BigDecimal.valueOf(max)) > 0) {
            throw error(key, "must be between " + min + " and " + max);
        }
        return value.longValueExact();
    }

    /**
     * A seed: exactly the whole numbers a random stream can key, the 64-bit signed range
     * [-2^63, 2^63 - 1], each of which is one 64-bit key. Anything else (a fraction, 2^63,
     * {@code 1e30}) is refused: clamping or rounding it would silently give another seed's run.
     */
    public long getSeed(String key) {
        BigDecimal value = wholeNumber(key);
        if (value.compareTo(BigDecimal.valueOf(Long.MIN_VALUE)) < 0
                || value.compareTo(BigDecimal.valueOf(Long.MAX_VALUE)) > 0) {
            throw error(key, "a seed must be a whole number from " + Long.MIN_VALUE + " to " + Long.MAX_VALUE
                    + " (-2^63 to 2^63 - 1: the 64-bit key of the random streams)");
        }
        return value.longValueExact();
    }

    private BigDecimal wholeNumber(String key) {
        BigDecimal value = config.hasPath(key) ? wholeNumber(config.getValue(key)) : null;
        if (value == null) {
            throw error(key, "expected a whole number");
        }
        return value;
    }

    /**
     * The exact value of a whole number, or null when {@code value} holds none (a fraction, text
     * that is not a number, a list …). Numbers written as text ({@code "12"}) count, as HOCON
     * converts them; the value is compared exactly, never through a rounded {@code long}.
     */
    static BigDecimal wholeNumber(ConfigValue value) {
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
            try {
                exact = new BigDecimal(((String) raw).trim());
            } catch (NumberFormatException e) {
                return null;
            }
        } else {
            return null;
        }
        return exact.signum() == 0 || exact.stripTrailingZeros().scale() <= 0 ? exact : null;
    }

    public double getDouble(String key) {
        try {
            double value = config.getDouble(key);
            if (!Double.isFinite(value)) {
                throw error(key, "expected a finite number");
            }
            return value;
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a number");
        }
    }

    /** A number in (low, high] or [low, high] as {@code closedLow} says. */
    public double getDouble(String key, double low, boolean closedLow, double high, boolean closedHigh) {
        double value = getDouble(key);
        boolean aboveLow = closedLow ? value >= low : value > low;
        boolean belowHigh = closedHigh ? value <= high : value < high;
        if (!aboveLow || !belowHigh) {
            throw error(key, "must be in " + (closedLow ? "[" : "(") + low + ", " + high + (closedHigh ? "]" : ")"));
        }
        return value;
    }

    public boolean getBoolean(String key) {
        try {
            return config.getBoolean(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected true or false");
        }
    }

    public String getString(String key) {
        if (config.getIsNull(key)) {
            return null;
        }
        ConfigValueType type = config.getValue(key).valueType();
        if (type == ConfigValueType.OBJECT || type == ConfigValueType.LIST) {
            throw error(key, "expected a text value");
        }
        return config.getString(key);
    }

    /** One of the given words (case-insensitive, '-' and '_' alike). */
    public String getChoice(String key, List<String> choices) {
        String value = getString(key);
        String normal = value == null ? "" : value.toLowerCase(Locale.ROOT).replace('_', '-');
        if (!choices.contains(normal)) {
            throw error(key, "must be one of " + String.join(", ", choices));
        }
        return normal;
    }

    public double[] getDoubleList(String key) {
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
}
