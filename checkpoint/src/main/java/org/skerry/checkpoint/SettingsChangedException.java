package org.skerry.checkpoint;

import java.util.List;

/**
 * A resume whose settings would change the answer: it names each setting that differs from the
 * checkpointed run, with both values. Settings that do not change the answer (output, progress,
 * backend, executors, checkpoint frequency) are never compared.
 */
public final class SettingsChangedException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    private final List<String> keys;

    public SettingsChangedException(List<String> keys, List<String> differences) {
        super("the run cannot be resumed with changed settings that alter its answer: " + String.join("; ", differences)
                + " (set them back, or start a new run)");
        this.keys = List.copyOf(keys);
    }

    /** The settings that differ. */
    public List<String> keys() {
        return keys;
    }
}
