package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigRenderOptions;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.UUID;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;

/**
 * A run file's model in portable form: the model's name or class, its settings as text and its
 * bound data columns. Spark executors rebuild the model from it with the same code the driver
 * used, so the model itself never needs to be serialisable.
 */
public final class RunModelSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final String id = UUID.randomUUID().toString();
    private final String modelName;
    private final String modelClass;
    private final String settingsText;
    private final LinkedHashMap<String, double[]> columns;
    private final String dataSource;

    RunModelSource(String modelName, String modelClass, Config settings, Map<String, double[]> columns,
            String dataSource) {
        this.modelName = modelName;
        this.modelClass = modelClass;
        this.settingsText = settings.root().render(ConfigRenderOptions.concise());
        this.columns = new LinkedHashMap<>(columns);
        this.dataSource = dataSource;
    }

    @Override
    public Model create() {
        Config settings = ConfigFactory.parseString(settingsText);
        return ModelBuilder.create(modelName, modelClass, ConfigModelSettings.of(settings, columns, dataSource),
                "model");
    }

    @Override
    public String id() {
        return id;
    }

    /** The model class name for error messages, or the built-in name. */
    public String label() {
        return modelName != null ? modelName : modelClass;
    }
}
