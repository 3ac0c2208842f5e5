package org.skerry.spark;

import java.io.Serializable;
import org.skerry.engine.model.ModelSource;

/**
 * A model source as one broadcast value: Java-serialised inside Kryo (see
 * {@link SkerryKryoRegistrator}), since a source is any serialisable class of a user's and Kryo
 * requires every class it meets to be registered.
 */
final class ModelShipment implements Serializable {

    private static final long serialVersionUID = 1L;

    final ModelSource source;

    ModelShipment(ModelSource source) {
        this.source = source;
    }
}
