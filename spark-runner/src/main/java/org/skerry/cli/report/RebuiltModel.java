package org.skerry.cli.report;

import java.util.List;
import org.skerry.cli.runfile.ModelBuilder;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.model.Model;

/**
 * The run's model built once more from {@code run.conf} (its data read again), for the prior
 * overlay and the fit against the data; or why it could not be, which the page then says.
 *
 * @param model the model, or null
 * @param label the model's name or class, for messages
 * @param note  why there is no model; null when there is one
 */
record RebuiltModel(Model model, String label, String note) {

    static RebuiltModel of(RunSpec spec, List<String> parameters) {
        String label = spec.model().label();
        Model model;
        try {
            model = ModelBuilder.build(spec).model();
        } catch (RuntimeException e) {
            return new RebuiltModel(null, label, "the model could not be built again from run.conf: " + e.getMessage());
        }
        if (!model.parameters().names().equals(parameters)) {
            return new RebuiltModel(null, label, "the model built from run.conf has the parameters "
                    + model.parameters().names() + ", summary.json " + parameters);
        }
        return new RebuiltModel(model, label, null);
    }
}
