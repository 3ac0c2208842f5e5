package org.skerry.engine.model.settings;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.ServiceLoader;
import java.util.TreeMap;

/**
 * The {@link ModelFactory} implementations visible to a class loader, found with
 * {@link ServiceLoader} and indexed by name. Immutable once loaded.
 */
public final class ModelCatalog {

    private final Map<String, ModelFactory> byName;

    private ModelCatalog(Map<String, ModelFactory> byName) {
        this.byName = byName;
    }

    /** The factories visible to this class's loader. */
    public static ModelCatalog load() {
        return load(ModelCatalog.class.getClassLoader());
    }

    /**
     * The factories visible to {@code loader}.
     *
     * @throws IllegalStateException if two factories share a name
     */
    public static ModelCatalog load(ClassLoader loader) {
        Map<String, ModelFactory> byName = new TreeMap<>();
        for (ModelFactory factory : ServiceLoader.load(ModelFactory.class, loader)) {
            ModelFactory earlier = byName.putIfAbsent(factory.name(), factory);
            if (earlier != null) {
                throw new IllegalStateException("two model factories are named '" + factory.name()
                        + "': " + earlier.getClass().getName() + " and " + factory.getClass().getName());
            }
        }
        return new ModelCatalog(Collections.unmodifiableMap(byName));
    }

    /** All factories, sorted by name. */
    public List<ModelFactory> factories() {
        return Collections.unmodifiableList(new ArrayList<>(byName.values()));
    }

    /** The factory called {@code name}, if any. */
    public Optional<ModelFactory> find(String name) {
        return Optional.ofNullable(byName.get(name));
    }

    /**
     * The factory called {@code name}.
     *
     * @throws IllegalArgumentException naming {@code name} and the known names if there is none
     */
    public ModelFactory get(String name) {
        ModelFactory factory = byName.get(name);
        if (factory == null) {
            throw new IllegalArgumentException("unknown model '" + name + "'; known models: "
                    + byName.keySet());
        }
        return factory;
    }
}
