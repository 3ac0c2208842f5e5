package org.skerry.cli.scaling;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.PrintWriter;
import java.io.Reader;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.stream.Stream;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.ExitCodes;
import org.skerry.cli.SkerryCommand;
import org.skerry.engine.Slow;
import org.w3c.dom.Document;

/**
 * {@code skerry scale} end to end on tiny grids (Spark local mode and the thread backend, the
 * synthetic costly-normal model at no cost): the files it writes, the plots as images, speed-up
 * and efficiency as defined, the evaluation count against the count the fixed schedule implies,
 * resuming, and the errors for bad study files.
 */
class ScaleCommandTest {

    @TempDir
    Path dir;

    /** Temperatures after φ = 0, and MH steps per iteration, of the base run below. */
    private static final int TEMPERATURES = 2;
    private static final int STEPS = 1;

    private Path base(String backend) throws Exception {
        Path file = dir.resolve("base.conf");
        Files.writeString(file, String.join("\n",
                "name = tiny",
                "model { name = costly-normal, settings { dimension = 2, cost-micros = 0 } }",
                "sampler { particles = 120, seed = 5, tempering { rule = fixed, schedule = [0.3, 1.0] }, moves.steps = "
                        + STEPS + " }",
                "backend { kind = " + backend + ", master = \"local[2]\", partitions = 4 }", ""));
        return file;
    }

    private record Result(int exitCode, String out, String err) {
    }

    private static Result scale(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        String[] all = new String[args.length + 1];
        all[0] = "scale";
        System.arraycopy(args, 0, all, 1, args.length);
        int code = SkerryCommand.execute(all, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Result(code, out.toString(), err.toString());
    }

    private static List<CSVRecord> csv(Path file) throws Exception {
        try (Reader reader = Files.newBufferedReader(file);
                CSVParser parser = CSVParser.parse(reader, CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get())) {
            return parser.getRecords();
        }
    }

    @Test
    @Slow
    @DisplayName("a strong-scaling study on Spark local mode writes its table, plots and summary; a second call resumes it")
    void strongScalingOnSpark() throws Exception {
        base("spark");
        Path study = dir.resolve("study.conf");
        Files.writeString(study, String.join("\n", "base = base.conf", "repeats = 1", "warm-up = false",
                "axes { cores = [2, 1] }", ""));
        Path out = dir.resolve("out");
        Result first = scale(study.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, first.exitCode(), first.err());

        List<CSVRecord> rows = csv(out.resolve("scaling.csv"));
        assertEquals(2, rows.size());
        // Cores are sorted: the first row is the baseline, whose speed-up is 1 by definition.
        assertEquals("1", rows.get(0).get("cores"));
        assertEquals(1.0, Double.parseDouble(rows.get(0).get("speedup")));
        assertEquals(1.0, Double.parseDouble(rows.get(0).get("efficiency")));
        double t1 = Double.parseDouble(rows.get(0).get("loop_seconds"));
        double t2 = Double.parseDouble(rows.get(1).get("loop_seconds"));
        assertEquals(t1 / t2, Double.parseDouble(rows.get(1).get("speedup")), 1e-12);
        assertEquals(t1 / t2 / 2, Double.parseDouble(rows.get(1).get("efficiency")), 1e-12);
        for (CSVRecord row : rows) {
            // One initial draw per particle, then STEPS proposals per particle per temperature
            // (real support: no proposal falls outside the prior, so each costs an evaluation).
            assertEquals(120L * (1 + TEMPERATURES * STEPS), Long.parseLong(row.get("evaluations")));
            assertEquals("4", row.get("partitions"));
            double phases = 0;
            for (String phase : List.of("evaluate", "reduce", "resample", "redistribute", "move", "checkpoint")) {
                phases += Double.parseDouble(row.get(phase + "_seconds"));
            }
            assertEquals(Double.parseDouble(row.get("loop_seconds")), phases, 1e-9);
            assertTrue(Long.parseLong(row.get("driver_bytes_received")) > 0, "bytes measured");
            // The export carries at least the N x d parameter values as 8-byte doubles.
            assertTrue(Long.parseLong(row.get("export_bytes_received")) >= 120L * 2 * 8, row.get("export_bytes_received"));
            assertTrue(Double.parseDouble(row.get("driver_cpu_seconds_per_iteration")) > 0);
            assertTrue(Files.isRegularFile(out.resolve(row.get("run_folder")).resolve("summary.json")));
        }

        // Same seed, same answer whatever the cores: the study changes only how the runs are spread.
        assertEquals(Files.readString(out.resolve(rows.get(0).get("run_folder")).resolve("summary.json")),
                Files.readString(out.resolve(rows.get(1).get("run_folder")).resolve("summary.json")));

        for (String plot : List.of("speedup", "efficiency", "phases")) {
            BufferedImage image = ImageIO.read(out.resolve(plot + ".png").toFile());
            assertEquals(ScalingCharts.WIDTH, image.getWidth(), plot);
            assertEquals(ScalingCharts.HEIGHT, image.getHeight(), plot);
            Set<Integer> colours = new HashSet<>();
            for (int x = 0; x < image.getWidth(); x += 7) {
                for (int y = 0; y < image.getHeight(); y += 7) {
                    colours.add(image.getRGB(x, y));
                }
            }
            assertTrue(colours.size() > 5, plot + " is not blank: " + colours.size() + " colours");
            DocumentBuilderFactory xml = DocumentBuilderFactory.newInstance();
            // The SVG names the W3C DTD; parse without fetching it (tests stay off the network).
            xml.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
            Document svg = xml.newDocumentBuilder().parse(out.resolve(plot + ".svg").toFile());
            assertEquals("svg", svg.getDocumentElement().getNodeName(), plot);
            assertTrue(svg.getElementsByTagName("text").getLength() > 0, plot + " has text");
        }
        String summary = Files.readString(out.resolve("summary.md"));
        assertTrue(summary.contains("| cores-1 | 1 | 120 |"), summary);
        assertTrue(summary.contains("driver_bytes_received"), "columns documented");

        // Resume: both runs are kept, their files untouched.
        Path kept = out.resolve(rows.get(1).get("run_folder")).resolve("summary.json");
        FileTime before = Files.getLastModifiedTime(kept);
        Result again = scale(study.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, again.exitCode(), again.err());
        assertEquals(2, again.out().split("kept from an earlier run", -1).length - 1, again.out());
        assertEquals(before, Files.getLastModifiedTime(kept));
        assertEquals(rows.get(1).get("loop_seconds"), csv(out.resolve("scaling.csv")).get(1).get("loop_seconds"));

        // A run without summary.json is unfinished: moved aside and run again; the other is kept.
        Path unfinished = out.resolve(rows.get(0).get("run_folder"));
        Files.delete(unfinished.resolve("summary.json"));
        Result third = scale(study.toString(), "--out", out.toString());
        assertEquals(ExitCodes.SUCCESS, third.exitCode(), third.err());
        assertEquals(1, third.out().split("kept from an earlier run", -1).length - 1, third.out());
        assertTrue(Files.isRegularFile(unfinished.resolve("summary.json")));
        try (Stream<Path> aside = Files.list(out.resolve("unfinished"))) {
            assertEquals(1, aside.count());
        }
    }

    @Test
    @Slow
    @DisplayName("weak scaling on the thread backend: N grows with the cores, efficiency of the baseline is 1, no byte counts")
    void weakScalingOnThreads() throws Exception {
        base("threads");
        Path study = dir.resolve("weak.conf");
        Files.writeString(study, String.join("\n", "base = base.conf", "scaling = weak", "particles-per-core = 50",
                "repeats = 2", "axes { cores = [1, 2] }", "output.folder = \"" + dir.resolve("studies") + "\"", ""));
        Result result = scale(study.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());
        Path out = dir.resolve("studies").resolve("weak");
        List<CSVRecord> rows = csv(out.resolve("scaling.csv"));
        assertEquals(4, rows.size());
        for (CSVRecord row : rows) {
            int cores = Integer.parseInt(row.get("cores"));
            assertEquals(50 * cores, Integer.parseInt(row.get("particles")));
            assertEquals("", row.get("driver_bytes_received"));
            if (cores == 1) {
                assertEquals(1.0, Double.parseDouble(row.get("efficiency")));
                assertEquals(1.0, Double.parseDouble(row.get("speedup")));
            } else {
                assertEquals(2 * Double.parseDouble(row.get("efficiency")), Double.parseDouble(row.get("speedup")), 1e-12);
            }
        }
        assertFalse(Files.exists(out.resolve("warm-up")), "the warm-up folder is removed");
    }

    private void assertBadStudy(String text, String... fragments) throws Exception {
        base("threads");
        Path study = dir.resolve("bad.conf");
        Files.writeString(study, text);
        Path out = dir.resolve("bad-out");
        Result result = scale(study.toString(), "--out", out.toString());
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err() + result.out());
        String message = result.err().strip();
        assertTrue(message.startsWith("skerry: bad input:"), message);
        for (String fragment : fragments) {
            assertTrue(message.contains(fragment), "'" + fragment + "' in: " + message);
        }
        assertFalse(Files.exists(out), "nothing written");
    }

    @Test
    @DisplayName("bad study files are refused with file, line, key and value, before anything runs")
    void badStudyFiles() throws Exception {
        assertBadStudy("base = base.conf\nrepeat = 2\n", "bad.conf: line 2", "'repeat'", "did you mean 'repeats'");
        assertBadStudy("base = base.conf\naxes {\n  sampler.particls = [10, 20]\n}\n", "bad.conf: line 3",
                "axes.sampler.particls", "did you mean 'sampler.particles'");
        assertBadStudy("base = base.conf\naxes { cores = [1, 0] }\n", "bad.conf: line 2", "axes.cores", "0");
        assertBadStudy("base = base.conf\naxes { sampler.particles = [1] }\n", "bad.conf: line 2",
                "sampler.particles", "between 2");
        assertBadStudy("base = base.conf\nscaling = weak\nparticles-per-core = 10\n", "bad.conf: line 2", "scaling",
                "cores axis");
        assertBadStudy("base = missing.conf\n", "bad.conf: line 1", "base", "missing.conf");
        assertBadStudy("base = base.conf\nrepeats = 0\n", "bad.conf: line 2", "repeats = 0", "between 1");
        assertBadStudy("base = base.conf\nrepeats = [\n", "bad.conf");
    }
}
