package org.skerry.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.PriorSettings;
import org.skerry.engine.model.settings.SettingDescription;
import picocli.CommandLine.Command;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code skerry models}: the models (built-in, and any on the class path listed as a
 * {@code ModelFactory} service), their settings and data roles, then the prior distributions
 * with their parameters.
 */
@Command(name = "models", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "List the models with their settings (model.settings.*) and data roles, and the prior "
            + "distributions a prior setting can name, with their parameters.")
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
        printPriors(out);
        out.flush();
        return ExitCodes.SUCCESS;
    }

    /** The distributions a prior setting (one whose default is { distribution = … }) can name. */
    private static void printPriors(PrintWriter out) {
        out.println("prior distributions, for settings that take a prior (default { distribution = ... }), e.g.");
        out.println("  model.settings.prior.k_n = { distribution = lognormal, meanlog = -0.7, sdlog = 0.4 }");
        out.println("  (every parameter of the distribution is required; densities are normalised; a model of your");
        out.println("  own reads such a setting with org.skerry.engine.model.settings.PriorSettings):");
        for (String name : PriorSettings.distributionNames()) {
            out.println(String.format("  %-12s %-16s %s", name, String.join(", ", PriorSettings.parameterKeys(name)),
                    PriorSettings.description(name)));
        }
    }

    private static String describe(SettingDescription setting) {
        String value = setting.isRequired() ? "required" : "default " + setting.defaultValue();
        return String.format("%-28s %s (%s)", setting.key(), setting.meaning(), value);
    }
}
