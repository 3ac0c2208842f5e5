package org.skerry.engine.program;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Builds a {@link ProgramModel} from a run file's {@code model.program} object (a {@link
 * ProgramSimulator} when it names summaries). Not in the
 * built-in catalogue (a run file chooses it with {@code model.program}, not {@code model.name});
 * executors rebuild the model through this class by name, like any model class.
 */
public final class ProgramModelFactory implements ModelFactory {

    @Override
    public String name() {
        return "program";
    }

    @Override
    public String description() {
        return "your own program, in any language, as a worker speaking skerry's line protocol";
    }

    @Override
    public List<SettingDescription> settings() {
        return List.of(
                SettingDescription.required("command", "the program and its arguments, a list"),
                SettingDescription.required("parameters", "[{ name = NAME, prior { distribution = … } }, …]"),
                SettingDescription.optional("files", "files the program reads, handed over by absolute path", "[]"),
                SettingDescription.optional("environment", "variables added to the program's environment", "{}"),
                SettingDescription.optional("timeout", "the longest one request may take", "5m"),
                SettingDescription.optional("start-timeout", "the longest a worker may take to be ready", "60s"),
                SettingDescription.optional("mode", "worker", "worker"),
                SettingDescription.optional("batch", "the most particles one request carries", "1"),
                SettingDescription.optional("scratch", "the folder holding the workers' scratch folders",
                        "the system's temporary folder"),
                SettingDescription.optional("summaries", "names of the summaries the program replies with, for "
                        + "sampler.sequence = abc (then it gives no log-likelihood)", "none: a log-likelihood"));
    }

    @Override
    public Model create(ModelSettings settings) {
        ProgramSettings program = ProgramSettings.read(settings);
        return program.simulatesSummaries() ? new ProgramSimulator(program) : new ProgramModel(program);
    }
}
