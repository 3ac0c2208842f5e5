package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ConjugateRun;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.output.JsonTree;
import org.skerry.engine.Slow;
import org.skerry.engine.reference.NormalMeanExact;

/**
 * {@code skerry report} on real run folders made by the command: the page parsed with jsoup (an
 * HTML parser outside the project) stays inside report/, its table holds summary.json's numbers,
 * its histograms the weights of particles.csv counted here independently, and every image
 * decodes (ImageIO) or parses (the JDK's XML parser). Bad folders are bad input and write nothing.
 */
@Slow
class ReportCommandTest {

    @TempDir
    static Path root;

    /** The 1-D conjugate run (prior overlay available). */
    static Path conjugate;
    /** costly-normal in 10 dimensions: more parameters than the pair plot shows. */
    static Path wide;

    @BeforeAll
    static void runs() throws IOException {
        Files.writeString(root.resolve("data.csv"), ConjugateRun.DATA);
        Path file = root.resolve("run.conf");
        Files.writeString(file, ConjugateRun.RUN_FILE);
        conjugate = root.resolve("conjugate");
        run(file, conjugate);
        Path wideFile = root.resolve("wide.conf");
        Files.writeString(wideFile, String.join("\n", "# synthetic: costly-normal without busy work",
                "name = wide", "model { name = costly-normal, settings { dimension = 10, cost-micros = 0 } }",
                "sampler { particles = 400, seed = 9 }", "output.progress = off", "backend.kind = threads", ""));
        wide = root.resolve("wide");
        run(wideFile, wide);
        for (Path folder : List.of(conjugate, wide)) {
            CommandRunner.Result result = CommandRunner.run("report", folder.toString());
            assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
            assertTrue(result.out().contains("index.html"), result.out());
        }
    }

    private static void run(Path file, Path out, String... extra) {
        List<String> args = new ArrayList<>(List.of("run", file.toString(), "--out", out.toString()));
        args.addAll(List.of(extra));
        CommandRunner.Result result = CommandRunner.run(args.toArray(String[]::new));
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
    }

    private static Document page(Path folder) throws IOException {
        return Jsoup.parse(folder.resolve("report/index.html").toFile(), "UTF-8");
    }

    @Test
    @DisplayName("every address on the page is a file inside report/; no network or protocol-relative address anywhere")
    void offline() throws IOException {
        for (Path folder : List.of(conjugate, wide)) {
            Path report = folder.resolve("report").toAbsolutePath().normalize();
            Document page = page(folder);
            String text = Files.readString(report.resolve("index.html"));
            assertFalse(text.contains("http://") || text.contains("https://"), "a network address in the page");
            assertTrue(page.select("script, link, iframe, object, embed, base").isEmpty(), "external resources");
            List<Element> addressed = page.select("[src], [href]");
            assertTrue(addressed.size() >= 2 * 6, "images and links: " + addressed.size());
            for (Element element : addressed) {
                String address = element.hasAttr("src") ? element.attr("src") : element.attr("href");
                assertFalse(address.startsWith("//") || address.contains(":"), "not a plain file name: " + address);
                Path target = report.resolve(address).normalize();
                assertTrue(target.startsWith(report) && Files.isRegularFile(target), address + " is not in report/");
            }
            for (Element style : page.select("[style], style")) {
                assertFalse(style.outerHtml().contains("url("), "CSS fetches something: " + style.outerHtml());
            }
        }
    }

    @Test
    @DisplayName("the sections come in order: warnings, summary, posteriors, pairs, fit, iterations, reading advice")
    void order() throws IOException {
        List<String> ids = page(wide).select("body > section").eachAttr("id");
        assertEquals(List.of("warnings", "summary", "posteriors", "pairs", "fit", "iterations", "reading"), ids);
        assertTrue(page(wide).selectFirst("#reading").text().contains("independent review"));
    }

    @Test
    @DisplayName("fit against the data: the SVG's points are the data file's values; the predictive mean and sd "
            + "agree with the closed form (BDA3 §2.5) within Monte Carlo error")
    void fitAgainstTheData() throws Exception {
        Element section = page(conjugate).selectFirst("#fit");
        assertEquals(2, section.select("figure img").size(), section.outerHtml());
        DocumentBuilderFactory factory = DocumentBuilderFactory.newInstance();
        factory.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
        org.w3c.dom.Element svg = factory.newDocumentBuilder()
                .parse(conjugate.resolve("report/fit-data.svg").toFile()).getDocumentElement();
        double[] observed = numbers(svg.getAttribute("data-observed"));
        double[] fromFile = ConjugateRun.DATA.lines().filter(l -> !l.startsWith("#") && !l.equals("y"))
                .mapToDouble(Double::parseDouble).toArray();
        assertArrayEquals(fromFile, observed, 0.0, "the points are the data file's values, in its order");
        // Closed form: y_new | y ~ Normal(mu_n, sigma^2 + tau_n^2), with sigma = 2, prior Normal(0, 3^2).
        NormalMeanExact exact = new NormalMeanExact(
                Arrays.stream(fromFile).mapToObj(v -> new double[] {v}).toArray(double[][]::new), 2.0, 0.0, 3.0);
        double predictiveSd = Math.sqrt(4.0 + exact.posteriorVariance());
        // Error of the estimate: the 200 particles' posterior (ESS at least N/2 after the last
        // resampling) and the 400 replicate draws, four standard errors.
        double tolerance = 4 * Math.sqrt(exact.posteriorVariance() / 100 + predictiveSd * predictiveSd / 400);
        for (double mean : numbers(svg.getAttribute("data-predictive-mean"))) {
            assertEquals(exact.posteriorMean(0), mean, tolerance, "predictive mean");
        }
        for (double sd : numbers(svg.getAttribute("data-predictive-sd"))) {
            // The sd of 400 draws: relative standard error about 1/sqrt(2 * 399).
            assertEquals(predictiveSd, sd, 4 * predictiveSd / Math.sqrt(2 * 399.0) + tolerance, "predictive sd");
        }
        assertTrue(page(wide).selectFirst("#fit").text().contains("offers no predictions"),
                page(wide).selectFirst("#fit").text());
    }

    @Test
    @DisplayName("the summary table holds summary.json's numbers: exact in data-value, to 4 significant digits as shown")
    void summaryTable() throws IOException {
        for (Path folder : List.of(conjugate, wide)) {
            Map<String, Object> summary = JsonTree.read(folder.resolve("summary.json"));
            Document page = page(folder);
            checkCell(page.selectFirst("#evidence td[data-key=log_evidence]"), (Double) summary.get("log_evidence"));
            assertEquals(Boolean.TRUE, summary.get("log_evidence_error_reliable"));
            checkCell(page.selectFirst("#evidence td[data-key=log_evidence_error]"),
                    (Double) summary.get("log_evidence_error"));
            @SuppressWarnings("unchecked")
            Map<String, Map<String, Object>> parameters = (Map<String, Map<String, Object>>) summary.get("parameters");
            List<Element> rows = page.select("#parameters tbody tr");
            assertEquals(new ArrayList<>(parameters.keySet()), rows.stream().map(r -> r.attr("data-parameter")).toList());
            for (Element row : rows) {
                Map<String, Object> expected = parameters.get(row.attr("data-parameter"));
                List<Element> cells = row.select("td");
                assertEquals(expected.keySet().stream().toList(), cells.stream().map(c -> c.attr("data-key")).toList());
                for (Element cell : cells) {
                    checkCell(cell, ((Number) expected.get(cell.attr("data-key"))).doubleValue());
                }
            }
        }
    }

    /** The exact value round-trips; the shown one is within half a unit of its fourth significant digit. */
    private static void checkCell(Element cell, double expected) {
        assertNotNull(cell, "missing cell");
        assertEquals(expected, Double.parseDouble(cell.attr("data-value")), 0.0, cell.outerHtml());
        double shown = Double.parseDouble(cell.text().replace("\u202F", ""));
        assertEquals(expected, shown, Math.abs(expected) * 5e-4 + 1e-300, cell.outerHtml());
    }

    @Test
    @DisplayName("each histogram holds the weights of particles.csv in its bins, counted here from the file")
    void histograms() throws IOException {
        for (Path folder : List.of(conjugate, wide)) {
            Map<String, double[]> particles = readColumns(folder.resolve("particles.csv"));
            double[] weight = particles.get("weight");
            List<Element> figures = page(folder).select("#posteriors figure[data-parameter]");
            assertEquals(particles.size() - 3, figures.size());
            for (Element figure : figures) {
                double[] values = particles.get(figure.attr("data-parameter"));
                double[] edges = numbers(figure.attr("data-bin-edges"));
                double[] mass = numbers(figure.attr("data-bin-mass"));
                assertEquals(edges.length - 1, mass.length);
                double low = Double.POSITIVE_INFINITY;
                double high = Double.NEGATIVE_INFINITY;
                double[] counted = new double[mass.length];
                for (int n = 0; n < values.length; n++) {
                    if (weight[n] > 0) {
                        low = Math.min(low, values[n]);
                        high = Math.max(high, values[n]);
                        // Linear search: the bin whose [lower, upper) holds the value, the last one closed.
                        int b = 0;
                        while (b < mass.length - 1 && values[n] >= edges[b + 1]) {
                            b++;
                        }
                        counted[b] += weight[n];
                    }
                }
                assertEquals(low, edges[0], 0.0);
                assertEquals(high, edges[edges.length - 1], 0.0);
                for (int b = 0; b < mass.length; b++) {
                    assertEquals(counted[b], mass[b], 1e-12, "bin " + b + " of " + figure.attr("data-parameter"));
                }
                assertEquals(Arrays.stream(weight).sum(), Arrays.stream(mass).sum(), 1e-12);
            }
        }
    }

    @Test
    @DisplayName("beyond 8 parameters the pair plot shows the 8 most correlated (weighted r computed here), in model order")
    void pairSelection() throws IOException {
        Map<String, double[]> particles = readColumns(wide.resolve("particles.csv"));
        double[] w = particles.get("weight");
        List<String> names = new ArrayList<>(particles.keySet().stream()
                .filter(n -> !List.of("weight", "log_likelihood", "log_prior").contains(n)).toList());
        assertEquals(10, names.size());
        double[] strongest = new double[names.size()];
        for (int i = 0; i < names.size(); i++) {
            for (int j = 0; j < names.size(); j++) {
                if (i != j) {
                    strongest[i] = Math.max(strongest[i], Math.abs(weightedR(particles.get(names.get(i)),
                            particles.get(names.get(j)), w)));
                }
            }
        }
        List<Integer> top = IntStream.range(0, names.size()).boxed()
                .sorted(Comparator.<Integer>comparingDouble(i -> -strongest[i])).limit(8).sorted().toList();
        String shown = page(wide).selectFirst("#pairs-figure").attr("data-parameters");
        assertEquals(top.stream().map(names::get).toList(), List.of(shown.split(" ")));
    }

    /** Weighted Pearson correlation, straight from its definition. */
    private static double weightedR(double[] x, double[] y, double[] w) {
        double sw = 0, mx = 0, my = 0;
        for (int n = 0; n < w.length; n++) {
            sw += w[n];
            mx += w[n] * x[n];
            my += w[n] * y[n];
        }
        mx /= sw;
        my /= sw;
        double sxy = 0, sxx = 0, syy = 0;
        for (int n = 0; n < w.length; n++) {
            sxy += w[n] * (x[n] - mx) * (y[n] - my);
            sxx += w[n] * (x[n] - mx) * (x[n] - mx);
            syy += w[n] * (y[n] - my) * (y[n] - my);
        }
        return sxy / Math.sqrt(sxx * syy);
    }

    @Test
    @DisplayName("every PNG decodes; every SVG parses as XML (no DOCTYPE, no address but namespaces) with an svg root")
    void images() throws Exception {
        for (Path folder : List.of(conjugate, wide)) {
            Path report = folder.resolve("report");
            List<Path> files;
            try (Stream<Path> list = Files.list(report)) {
                files = list.sorted().toList();
            }
            List<Path> pngs = files.stream().filter(f -> f.toString().endsWith(".png")).toList();
            List<Path> svgs = files.stream().filter(f -> f.toString().endsWith(".svg")).toList();
            assertEquals(pngs.size(), svgs.size());
            assertTrue(pngs.size() >= 6, files.toString());
            for (Path png : pngs) {
                BufferedImage image = ImageIO.read(png.toFile());
                assertNotNull(image, png + " does not decode");
                assertTrue(image.getWidth() >= 600 && image.getHeight() >= 400, png.toString());
            }
            DocumentBuilderFactory factory = DocumentBuilderFactory.newInstance();
            factory.setNamespaceAware(true);
            factory.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
            for (Path svg : svgs) {
                // Namespace names are identifiers, never fetched; any other address would be.
                String text = Files.readString(svg).replaceAll("xmlns(:\\w+)?=(['\"])[^'\"]*\\2", "");
                assertFalse(text.contains("http://") || text.contains("https://") || text.contains("'//")
                        || text.contains("\"//"), svg.toString());
                var document = factory.newDocumentBuilder().parse(svg.toFile());
                assertEquals("svg", document.getDocumentElement().getLocalName(), svg.toString());
            }
        }
    }

    @Test
    @DisplayName("the same run folder gives the same page and SVG files, byte for byte")
    void sameFolderSameReport() throws IOException {
        Path page = conjugate.resolve("report/index.html");
        byte[] before = Files.readAllBytes(page);
        byte[] svgBefore = Files.readAllBytes(conjugate.resolve("report/ess.svg"));
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("report", conjugate.toString()).exitCode());
        assertArrayEquals(before, Files.readAllBytes(page));
        assertArrayEquals(svgBefore, Files.readAllBytes(conjugate.resolve("report/ess.svg")));
    }

    @Test
    @DisplayName("an unreliable evidence error is a warning, and its ± figure is not shown")
    void unreliableError() throws IOException {
        Path out = root.resolve("systematic");
        run(root.resolve("run.conf"), out, "--set", "sampler.resampling.scheme=systematic");
        assertEquals(Boolean.FALSE, JsonTree.read(out.resolve("summary.json")).get("log_evidence_error_reliable"));
        assertEquals(ExitCodes.SUCCESS, CommandRunner.run("report", out.toString()).exitCode());
        Document page = page(out);
        Element first = page.selectFirst("#warnings li");
        assertTrue(first.hasClass("warning") && first.text().contains("not reliable")
                && first.text().contains("systematic"), first.outerHtml());
        assertTrue(page.select("#evidence td[data-key=log_evidence_error]").isEmpty());
    }

    @Test
    @DisplayName("a run writes its report at its end, as skerry report would")
    void runWritesItsReport() throws IOException {
        Path folder = root.resolve("reported");
        run(root.resolve("run.conf"), folder);
        String written = Files.readString(folder.resolve("report/index.html"));
        CommandRunner.Result again = CommandRunner.run("report", folder.toString());
        assertEquals(ExitCodes.SUCCESS, again.exitCode(), again.err());
        assertEquals(written, Files.readString(folder.resolve("report/index.html")));
    }

    @Test
    @DisplayName("bad folders: exit 2, one message naming the folder or file (and line, column), nothing written")
    void badInput() throws IOException {
        Path missing = root.resolve("no-such-run");
        CommandRunner.assertBadInput(CommandRunner.run("report", missing.toString()), missing.toString(), "does not exist");
        assertFalse(Files.exists(missing));

        Path unfinished = Files.createDirectories(root.resolve("unfinished"));
        CommandRunner.assertBadInput(CommandRunner.run("report", unfinished.toString()), unfinished.toString(),
                "summary.json");
        assertFalse(Files.exists(unfinished.resolve("report")));

        Path broken = root.resolve("broken");
        run(root.resolve("run.conf"), broken, "--set", "output.report=false");
        assertFalse(Files.exists(broken.resolve("report")), "output.report = false: the run writes no report");
        List<String> lines = new ArrayList<>(Files.readAllLines(broken.resolve("particles.csv")));
        lines.set(2, "oops," + lines.get(2).substring(lines.get(2).indexOf(',') + 1));
        Files.write(broken.resolve("particles.csv"), lines);
        CommandRunner.assertBadInput(CommandRunner.run("report", broken.toString()), "particles.csv", "line 3",
                "column mu", "oops");
        assertFalse(Files.exists(broken.resolve("report")));

        Files.writeString(broken.resolve("summary.json"), "{\"name\": \"x\",\n  \"model\": }");
        CommandRunner.assertBadInput(CommandRunner.run("report", broken.toString()), "summary.json", "line 2");
        assertFalse(Files.exists(broken.resolve("report")));
    }

    private static Map<String, double[]> readColumns(Path file) throws IOException {
        try (Reader reader = Files.newBufferedReader(file);
                CSVParser parser = CSVParser.builder().setReader(reader)
                        .setFormat(CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()).get()) {
            List<String> header = parser.getHeaderNames();
            List<CSVRecord> records = parser.getRecords();
            Map<String, double[]> columns = new java.util.LinkedHashMap<>();
            for (String name : header) {
                columns.put(name, records.stream().mapToDouble(r -> Double.parseDouble(r.get(name))).toArray());
            }
            return columns;
        }
    }

    private static double[] numbers(String text) {
        return Arrays.stream(text.split(" ")).mapToDouble(Double::parseDouble).toArray();
    }
}
