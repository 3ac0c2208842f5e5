package org.skerry.engine.model.settings;

/**
 * A model that cannot be created from its name or class: no such class, no usable constructor,
 * not a model, or a factory that returned none. Bad input on the driver; on an executor, a class
 * found on the driver but missing there.
 */
public final class ModelNotCreatedException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    public ModelNotCreatedException(String message) {
        super(message);
    }

    public ModelNotCreatedException(String message, Throwable cause) {
        super(message, cause);
    }
}
