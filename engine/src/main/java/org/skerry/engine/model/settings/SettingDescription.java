package org.skerry.engine.model.settings;

import java.util.Objects;

/**
 * One setting a {@link ModelFactory} reads: its dotted key, what it means, and its default as the
 * user would write it, or none if the setting is required. Listed by the command line so a user
 * can see what a built-in model accepts. Immutable.
 */
public final class SettingDescription {

    private final String key;
    private final String meaning;
    private final String defaultValue;

    private SettingDescription(String key, String meaning, String defaultValue) {
        if (key == null || key.isBlank()) {
            throw new IllegalArgumentException("key must not be blank, was '" + key + "'");
        }
        if (meaning == null || meaning.isBlank()) {
            throw new IllegalArgumentException("meaning of " + key + " must not be blank");
        }
        this.key = key;
        this.meaning = meaning;
        this.defaultValue = defaultValue;
    }

    /** An optional setting with the given default. */
    public static SettingDescription optional(String key, String meaning, String defaultValue) {
        Objects.requireNonNull(defaultValue, "defaultValue");
        return new SettingDescription(key, meaning, defaultValue);
    }

    /** A setting the user must give. */
    public static SettingDescription required(String key, String meaning) {
        return new SettingDescription(key, meaning, null);
    }

    public String key() {
        return key;
    }

    public String meaning() {
        return meaning;
    }

    /** Whether the setting has no default. */
    public boolean isRequired() {
        return defaultValue == null;
    }

    /** The default as text; fails for a required setting. */
    public String defaultValue() {
        if (defaultValue == null) {
            throw new IllegalStateException("setting " + key + " is required and has no default");
        }
        return defaultValue;
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof SettingDescription)) {
            return false;
        }
        SettingDescription that = (SettingDescription) other;
        return key.equals(that.key) && meaning.equals(that.meaning)
                && Objects.equals(defaultValue, that.defaultValue);
    }

    @Override
    public int hashCode() {
        return Objects.hash(key, meaning, defaultValue);
    }

    @Override
    public String toString() {
        return key + (defaultValue == null ? " (required)" : " = " + defaultValue) + ": " + meaning;
    }
}
