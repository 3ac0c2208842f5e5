package org.skerry.engine.model.settings;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigRenderOptions;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.UUID;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;

/**
 * A model in portable form: its built-in name or class, its settings as HOCON text and its data
 * columns, already bound to roles. Executors rebuild the model from it with {@link ModelCreator},
 * the code the driver used, so the model itself never needs to be serialisable and executors need
 * only the engine and its libraries (no command-line classes).
 */
public final class SettingsModelSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final String id = UUID.randomUUID().toString();
    private final String modelName;
    private final String modelClass;
    private final String settingsPath;
    private final String settingsText;
    private final LinkedHashMap<String, double[]> columns;
    private final String dataSource;

    /**
     * @param modelName    the built-in model's name, or null
     * @param modelClass   the model's class name when {@code modelName} is null
     * @param settings     the model's settings
     * @param settingsPath where the settings sit in their file ({@code model.settings}), for messages
     * @param columns      data columns by role, in binding order
     * @param dataSource   where the data came from, for messages
     */
    public SettingsModelSource(String modelName, String modelClass, Config settings, String settingsPath,
            Map<String, double[]> columns, String dataSource) {
        if ((modelName == null) == (modelClass == null)) {
            throw new IllegalArgumentException("exactly one of modelName and modelClass must be given, were "
                    + modelName + " and " + modelClass);
        }
        this.modelName = modelName;
        this.modelClass = modelClass;
        this.settingsPath = settingsPath;
        this.settingsText = settings.root().render(ConfigRenderOptions.concise());
        this.columns = new LinkedHashMap<>(columns);
        this.dataSource = dataSource;
    }

    @Override
    public Model create() {
        Config settings = ConfigFactory.parseString(settingsText);
        return ModelCreator.create(modelName, modelClass, ModelSettings.of(settings, settingsPath, columns, dataSource),
                "model");
    }

    @Override
    public String id() {
        return id;
    }

    /** The built-in name, or the model class name, for messages. */
    public String label() {
        return modelName != null ? modelName : modelClass;
    }
}
