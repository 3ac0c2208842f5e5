package org.skerry.engine.model.builtin;

import org.skerry.engine.model.settings.ModelSettings;

/** Typed reads with range checks for the factories; failures name where the setting is. */
final class Read {

    private Read() {
    }

    static double positive(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!(value > 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be finite and > 0, was " + value);
        }
        return value;
    }

    static double finite(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be finite, was " + value);
        }
        return value;
    }

    static double fraction(ModelSettings settings, String key, double fallback) {
        double value = settings.getDouble(key, fallback);
        if (!(value > 0.0 && value < 1.0)) {
            throw new IllegalArgumentException(settings.where(key) + ": must be in (0, 1), was " + value);
        }
        return value;
    }

    static int atLeast(ModelSettings settings, String key, int fallback, int minimum) {
        int value = settings.getInt(key, fallback);
        if (value < minimum) {
            throw new IllegalArgumentException(settings.where(key) + ": must be >= " + minimum + ", was " + value);
        }
        return value;
    }
}
