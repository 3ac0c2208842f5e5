package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.settings.PriorSettings;
import picocli.CommandLine;

/** What the program and the project's documents point a reader to exists. */
class HelpAndDocsTest {

    private static final Path ROOT = Path.of("..").toAbsolutePath().normalize();

    @Test
    @DisplayName("skerry models lists every prior distribution with its parameters, after the models")
    void modelsListsPriors() {
        CommandRunner.Result result = CommandRunner.run("models");
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        String text = result.out();
        int priors = text.indexOf("prior distributions");
        assertTrue(priors > text.indexOf("normal-mean — "), text);
        List<String> names = PriorSettings.distributionNames();
        assertEquals(List.of("normal", "lognormal", "uniform", "gamma", "beta", "half-normal", "exponential"), names);
        for (String name : names) {
            String line = text.lines().filter(l -> l.startsWith("  " + name + " ")).findFirst().orElse("");
            assertTrue(line.contains(String.join(", ", PriorSettings.parameterKeys(name))), "'" + name + "' in:\n" + text);
            assertTrue(line.contains(PriorSettings.description(name)), line);
        }
        assertTrue(text.contains("gamma        shape, rate      density rate^shape"), text);
    }

    @Test
    @DisplayName("every project file a command's --help names exists (conf/demo/README.md for skerry demo)")
    void helpNamesExistingFiles() {
        CommandLine root = new CommandLine(new SkerryCommand());
        List<CommandLine> commands = new ArrayList<>(List.of(root));
        commands.addAll(root.getSubcommands().values());
        Pattern path = Pattern.compile("\\b((?:conf|deploy|spark-runner|engine|benchmarks|bin)/[\\w./-]*\\w)");
        Set<String> named = new TreeSet<>();
        for (CommandLine command : commands) {
            Matcher m = path.matcher(command.getUsageMessage(CommandLine.Help.Ansi.OFF));
            while (m.find()) {
                named.add(m.group(1));
            }
        }
        assertTrue(named.contains("conf/demo/README.md"), named.toString());
        for (String file : named) {
            assertTrue(Files.exists(ROOT.resolve(file)), "a --help names " + file + ", which does not exist");
        }
    }

    @Test
    @DisplayName("the README, DEVELOPERS.md, deploy/README.md and RESULTS.md name only test classes that exist")
    void documentsNameExistingTests() throws IOException {
        Set<String> tests;
        try (Stream<Path> files = Files.walk(ROOT)) {
            tests = files.filter(f -> !f.toString().contains("/target/"))
                    .map(f -> f.getFileName().toString())
                    .filter(n -> n.endsWith("Test.java"))
                    .map(n -> n.substring(0, n.length() - ".java".length()))
                    .collect(Collectors.toSet());
        }
        Pattern named = Pattern.compile("`([A-Z]\\w*Test)`");
        for (String document : List.of("README.md", "DEVELOPERS.md", "deploy/README.md", "benchmarks/RESULTS.md",
                "conf/demo/README.md")) {
            Matcher m = named.matcher(Files.readString(ROOT.resolve(document)));
            while (m.find()) {
                assertTrue(tests.contains(m.group(1)), document + " names " + m.group(1) + ", which does not exist");
            }
        }
    }
}
