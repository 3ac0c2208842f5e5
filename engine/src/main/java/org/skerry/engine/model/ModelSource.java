package org.skerry.engine.model;

import java.io.Serializable;

/**
 * How to make a model, as opposed to the model itself: a distributed backend sends the source to
 * each executor and builds the model there once per JVM, so models need not be serialisable.
 * {@link #create()} must give the same model (same answers) every time and everywhere.
 *
 * <p>{@link #local(Model)} wraps a model that stays in this JVM (thread backend, tests).
 */
public interface ModelSource extends Serializable {

    /** Builds the model. Called once per JVM by a backend; may be costly (reading data). */
    Model create();

    /** An identifier equal for sources that build the same model, for caching per JVM. */
    String id();

    /** A source that hands out one existing model; it cannot leave this JVM. */
    static ModelSource local(Model model) {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        return new LocalModelSource(model);
    }

    /** Whether this source can be sent to other JVMs. */
    default boolean isPortable() {
        return true;
    }
}
