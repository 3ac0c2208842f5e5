package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.spi.ToolProvider;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.apache.commons.math3.special.Gamma;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.output.JsonTree;
import org.skerry.engine.Slow;
import org.skerry.engine.model.Model;

/**
 * The README's "Your own model" example, exactly as written there: its Java source, data and run
 * file are taken from the README, compiled with the README's {@code javac} line against the
 * engine (the jar the README names, from this build), packaged with its {@code jar} line, and run
 * with the program in a separate JVM with the jar after skerry's class path, as
 * {@code SKERRY_CLASSPATH} does, and the run file's {@code backend.jars} pointing at it. The
 * gamma prior is conjugate to the Poisson likelihood, so evidence and posterior are known in
 * closed form (e.g. Gelman et al., Bayesian Data Analysis, 3rd ed., §2.6: Gamma(α + Σk, β + n)
 * posterior; the evidence is the negative-binomial marginal).
 */
class OwnModelTest {

    private static final Path README = Path.of("..", "README.md").toAbsolutePath().normalize();
    private static final Pattern BLOCK = Pattern.compile("<!-- own-model: (\\S+) -->\\n```[a-z]*\\n(.*?)```",
            Pattern.DOTALL);
    /** How the README names the jar to compile against. */
    private static final String ENGINE_JAR = "$SKERRY/spark-runner/target/lib/skerry-engine-";

    @TempDir
    Path folder;

    @Test
    @Slow
    @DisplayName("README's own-model example: javac and jar as written, skerry run with the jar on the class path "
            + "and in backend.jars; evidence, posterior and the particles' log-likelihood and log-prior against the "
            + "closed form")
    void readmeExampleRuns() throws Exception {
        Map<String, String> blocks = blocks(Files.readString(README));
        assertEquals(List.of("com/example/PoissonRate.java", "calls.csv", "calls.conf", "commands"),
                new ArrayList<>(blocks.keySet()));
        Path jar = folder.resolve("poisson-rate.jar");
        for (Map.Entry<String, String> block : blocks.entrySet()) {
            if (!block.getKey().equals("commands")) {
                Path file = folder.resolve(block.getKey());
                Files.createDirectories(file.getParent());
                Files.writeString(file, block.getValue().replace("/path/to/", folder + "/"));
            }
        }
        assertTrue(Files.readString(folder.resolve("calls.conf")).contains("backend.jars = [\"" + jar + "\"]"));

        List<String> commands = blocks.get("commands").lines().filter(l -> !l.isBlank()).toList();
        assertEquals(3, commands.size(), blocks.get("commands"));
        tool("javac", commands.get(0));
        tool("jar", commands.get(1));
        assertTrue(Files.isRegularFile(jar));

        String run = commands.get(2);
        assertTrue(run.startsWith("SKERRY_CLASSPATH=poisson-rate.jar $SKERRY/bin/skerry "), run);
        List<String> args = new ArrayList<>();
        for (String word : run.substring(run.indexOf("bin/skerry ") + "bin/skerry ".length()).split(" ")) {
            args.add(word.endsWith(".conf") ? folder.resolve(word).toString() : word);
        }
        Path out = folder.resolve("run");
        args.addAll(List.of("--out", out.toString()));
        Path log = folder.resolve("log.txt");
        Process process = ProgramProcess.start(log, List.of(jar), args.toArray(new String[0]));
        assertTrue(process.waitFor(150, TimeUnit.SECONDS), "the run finished in time");
        String text = Files.readString(log);
        assertEquals(ExitCodes.SUCCESS, process.exitValue(), text);
        assertTrue(text.contains("running calls: model com.example.PoissonRate, 1000 particles, seed 11"), text);
        assertTrue(text.contains(" temperature "), text);
        assertFalse(text.contains(" phi "), text);
        assertFalse(text.contains("resolves to a loopback address"), "Spark's host name warning in local mode: " + text);

        // Closed form: counts k_1..k_n ~ Poisson(λ), λ ~ Gamma(shape a, rate b), exposure 1.
        double[] counts = {4, 7, 3, 6, 5, 8, 2, 5};
        double a = 2;
        double b = 0.5;
        double sum = Arrays.stream(counts).sum();
        double logFactorials = 0;
        for (double k : counts) {
            logFactorials += Gamma.logGamma(k + 1);
        }
        double exact = a * Math.log(b) - Gamma.logGamma(a) - logFactorials + Gamma.logGamma(a + sum)
                - (a + sum) * Math.log(b + counts.length);
        double posteriorMean = (a + sum) / (b + counts.length);
        double posteriorSd = Math.sqrt(a + sum) / (b + counts.length);

        Map<String, Object> summary = JsonTree.read(out.resolve("summary.json"));
        assertEquals("calls", summary.get("name"));
        assertEquals("com.example.PoissonRate", summary.get("model"));
        double logZ = (Double) summary.get("log_evidence");
        double error = (Double) summary.get("log_evidence_error");
        // One run with a fixed seed: four reported errors, and never tighter than four times the
        // spread such a run shows over seeds (about 0.05 at N = 1000 in one dimension).
        assertEquals(exact, logZ, Math.max(4 * error, 0.2), "log Z against the closed form " + exact);
        @SuppressWarnings("unchecked")
        Map<String, Object> rate = (Map<String, Object>) ((Map<String, Object>) summary.get("parameters")).get("rate");
        // Monte Carlo error of a weighted mean over ~1000 particles is about sd/20: allow four of them.
        assertEquals(posteriorMean, (Double) rate.get("mean"), 0.2 * posteriorSd, "posterior mean");
        assertEquals(posteriorSd, (Double) rate.get("sd"), 0.15 * posteriorSd, "posterior sd");

        try (Reader in = Files.newBufferedReader(out.resolve("particles.csv"));
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180.builder().setHeader().get())) {
            assertEquals(List.of("rate", "weight", "log_likelihood", "log_prior"), parser.getHeaderNames());
            int rows = 0;
            for (CSVRecord row : parser) {
                double lambda = Double.parseDouble(row.get("rate"));
                double logLikelihood = sum * Math.log(lambda) - counts.length * lambda - logFactorials;
                double logPrior = a * Math.log(b) - Gamma.logGamma(a) + (a - 1) * Math.log(lambda) - b * lambda;
                assertEquals(logLikelihood, Double.parseDouble(row.get("log_likelihood")), 1e-9 * Math.abs(logLikelihood),
                        "log_likelihood of row " + rows);
                assertEquals(logPrior, Double.parseDouble(row.get("log_prior")), 1e-9 * (1 + Math.abs(logPrior)),
                        "log_prior of row " + rows);
                rows++;
            }
            assertEquals(1000, rows);
        }
    }

    /** A model whose parameter takes the name of a particles.csv column. */
    public static final class ClashingName implements Model {
        @Override
        public org.skerry.engine.model.ParameterSpace parameters() {
            return org.skerry.engine.model.ParameterSpace.of(List.of("log_prior"),
                    List.of(org.skerry.engine.model.Support.real()));
        }

        @Override
        public org.skerry.engine.model.Prior prior() {
            return org.skerry.engine.model.prior.IndependentPrior.of(org.skerry.engine.model.prior.Normal.of(0, 1));
        }

        @Override
        public double logLikelihood(double[] parameters, org.skerry.engine.model.LikelihoodContext context) {
            return 0;
        }
    }

    @Test
    @DisplayName("a parameter named like a particles.csv column (log_prior) is refused before the run: exit 2, "
            + "nothing written")
    void clashingParameterName() throws IOException {
        Path conf = folder.resolve("clash.conf");
        Files.writeString(conf, "name = clash\nmodel.class = \"" + ClashingName.class.getName() + "\"\n");
        Path out = folder.resolve("out");
        CommandRunner.Result result = CommandRunner.run("run", conf.toString(), "--out", out.toString());
        CommandRunner.assertBadInput(result, "parameter 0 is named 'log_prior'", "particles.csv");
        assertFalse(Files.exists(out), "nothing written");
    }

    /** The README's own-model blocks, in order: marker name → text. */
    private static Map<String, String> blocks(String readme) {
        Map<String, String> blocks = new LinkedHashMap<>();
        Matcher m = BLOCK.matcher(readme);
        while (m.find()) {
            blocks.put(m.group(1), m.group(2));
        }
        return blocks;
    }

    /**
     * Runs a README command line with the JDK's own tool of that name, in-process: the engine jar
     * the README names becomes the engine this build compiled, other non-option words are paths
     * relative to the example's folder.
     */
    private void tool(String name, String line) throws IOException {
        List<String> words = List.of(line.split(" "));
        assertEquals(name, words.get(0), line);
        List<String> args = new ArrayList<>();
        for (String word : words.subList(1, words.size())) {
            if (word.startsWith(ENGINE_JAR)) {
                assertEquals(ENGINE_JAR + projectVersion() + ".jar", word, "the README names this version's engine jar");
                args.add(enginePath().toString());
            } else if (word.startsWith("-") || word.matches("\\d+") || word.equals(".")) {
                args.add(word); // options, --release 17, and jar's "-C classes ." (relative to -C's folder)
            } else {
                args.add(folder.resolve(word).toString());
            }
        }
        ByteArrayOutputStream output = new ByteArrayOutputStream();
        PrintStream print = new PrintStream(output, true, StandardCharsets.UTF_8);
        int code = ToolProvider.findFirst(name).orElseThrow().run(print, print, args.toArray(new String[0]));
        assertEquals(0, code, name + " " + args + ": " + output.toString(StandardCharsets.UTF_8));
    }

    /** Where this JVM loads the engine from: its jar, or its classes folder in a reactor build. */
    private static Path enginePath() {
        try {
            return Path.of(Model.class.getProtectionDomain().getCodeSource().getLocation().toURI());
        } catch (java.net.URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    private static String projectVersion() throws IOException {
        Matcher m = Pattern.compile("<artifactId>skerry-parent</artifactId>\\s*<version>([^<]+)</version>")
                .matcher(Files.readString(Path.of("..", "pom.xml")));
        assertTrue(m.find(), "the project version in pom.xml");
        return m.group(1);
    }
}
