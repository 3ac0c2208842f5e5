package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigValueType;
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

    public int getInt(String key, int min, int max) {
        int value;
        try {
            value = config.getInt(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a whole number");
        }
        if (value < min || value > max) {
            throw error(key, "must be between " + min + " and " + max);
        }
        return value;
    }

    public long getLong(String key) {
        try {
            return config.getLong(key);
        } catch (ConfigException.WrongType e) {
            throw error(key, "expected a whole number");
        }
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
