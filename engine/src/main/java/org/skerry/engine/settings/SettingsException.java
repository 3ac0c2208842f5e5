package org.skerry.engine.settings;

/**
 * A setting that is missing, of the wrong type or out of range; the message names where it is
 * written (file and line, or the settings' origin), its full key and its value. It is bad input,
 * never a program error.
 */
public class SettingsException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    public SettingsException(String message) {
        super(message);
    }

    public SettingsException(String message, Throwable cause) {
        super(message, cause);
    }
}
