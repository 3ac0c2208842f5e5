package org.skerry.engine.model.settings;

import java.util.List;
import java.util.Set;

/**
 * The settings a model is built from: a tree of values addressed by dotted keys
 * ({@code prior.mu.sd}), plus the data columns bound to the model's roles. A run file backs it
 * on the command line; {@link MapModelSettings} backs it in tests and embedded use.
 *
 * <p>Every getter fails fast with an {@link IllegalArgumentException} whose message starts with
 * {@link #where(String)}, so a user can find the offending line. Implementations are immutable.
 */
public interface ModelSettings {

    /** Whether a value (of any type, including a nested object) is set at {@code key}. */
    boolean has(String key);

    /** The number at {@code key}; fails if it is missing or not a number. */
    double getDouble(String key);

    /** The number at {@code key}, or {@code fallback} if nothing is set there. */
    double getDouble(String key, double fallback);

    /** The whole number at {@code key}; fails if it is missing, not a number or not integral. */
    int getInt(String key);

    /** The whole number at {@code key}, or {@code fallback} if nothing is set there. */
    int getInt(String key, int fallback);

    /** The boolean at {@code key}, or {@code fallback} if nothing is set there. */
    boolean getBoolean(String key, boolean fallback);

    /** The text at {@code key}; fails if it is missing or not a plain value. */
    String getString(String key);

    /** The text at {@code key}, or {@code fallback} if nothing is set there. */
    String getString(String key, String fallback);

    /** The list of numbers at {@code key} (a fresh array); fails if missing or not such a list. */
    double[] getDoubles(String key);

    /** The list of plain values at {@code key}, as text; fails if missing or not a list. */
    List<String> getStrings(String key);

    /**
     * The nested object at {@code key} as settings of its own; keys in the view are relative to
     * {@code key}, while {@link #where} still reports full paths. Fails if {@code key} does not
     * hold an object.
     */
    ModelSettings at(String key);

    /** The keys directly below this level, in their order of definition. */
    Set<String> keys();

    /**
     * Where {@code key} is (or would be) defined, for error messages: a source and the full
     * dotted path, for example {@code "run.conf line 12, model.prior.mu"}.
     */
    String where(String key);

    /** Whether a data column is bound to {@code role}. */
    boolean hasColumn(String role);

    /**
     * The data column bound to {@code role}, as a fresh array; fails with a message naming the
     * role and the roles that are bound.
     */
    double[] column(String role);

    /** The roles that have a data column bound, in their order of definition. */
    Set<String> columnRoles();
}
