package org.skerry.engine.model.settings;

import java.util.List;
import org.skerry.engine.model.Model;

/**
 * Builds a named kind of model from {@link ModelSettings}. Implementations are found with
 * {@link java.util.ServiceLoader} (listed in
 * {@code META-INF/services/org.skerry.engine.model.settings.ModelFactory}), so a user's own models
 * plug in the same way as the built-in ones; {@link ModelCatalog} collects them. Implementations
 * must have a public no-argument constructor and be stateless.
 */
public interface ModelFactory {

    /** The name a run file selects this model by: lower case, words joined by hyphens. */
    String name();

    /** One line saying what the model is. */
    String description();

    /** The settings {@link #create} reads, for listing to the user. */
    List<SettingDescription> settings();

    /**
     * The data roles {@link #create} reads columns from (key = role), for listing to the user;
     * binding a file's columns to these roles is the run file's business.
     */
    default List<SettingDescription> dataRoles() {
        return List.of();
    }

    /**
     * Builds the model.
     *
     * @throws IllegalArgumentException naming {@link ModelSettings#where} of a missing or invalid
     *     setting, or the data role that is missing
     */
    Model create(ModelSettings settings);
}
