package org.skerry.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.SettingDescription;
import picocli.CommandLine.Command;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code skerry models}: the built-in models, their settings and data roles. */
@Command(name = "models", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "List the built-in models with their settings (model.settings.*) and data roles.")
final class ModelsCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        for (ModelFactory factory : ModelCatalog.load().factories()) {
            out.println(factory.name() + " — " + factory.description());
            if (!factory.settings().isEmpty()) {
                out.println("  settings (model.settings.<key>):");
                for (SettingDescription setting : factory.settings()) {
                    out.println("    " + describe(setting));
                }
            }
            if (!factory.dataRoles().isEmpty()) {
                out.println("  data roles (data.columns.<role> = \"column\"):");
                for (SettingDescription role : factory.dataRoles()) {
                    out.println("    " + describe(role));
                }
            }
            out.println();
        }
        out.flush();
        return ExitCodes.SUCCESS;
    }

    private static String describe(SettingDescription setting) {
        String value = setting.isRequired() ? "required" : "default " + setting.defaultValue();
        return String.format("%-28s %s (%s)", setting.key(), setting.meaning(), value);
    }
}
