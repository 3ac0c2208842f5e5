package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.File;
import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;
import org.skerry.engine.population.ParticleRows;

/**
 * particles.arrow read by a reader that shares no code with the writer: the JavaScript Apache
 * Arrow library (npm package apache-arrow, pinned in src/test/node/package-lock.json), run by
 * Node as a process (src/test/node/read-arrow.mjs prints each value's IEEE-754 bits). Its values
 * must be, bit for bit, those of particles.csv from the same run (output.particles-format =
 * both), and those handed to the writer for a file of awkward doubles in many record batches.
 * Without node or without {@code npm ci} having been run in src/test/node the test is skipped,
 * saying so, except under CI ({@code CI=true}), where it fails; .ci/run installs both.
 */
@Slow
class ArrowIndependentReaderTest {

    private static final Path NODE_FOLDER = Path.of("src", "test", "node");

    @TempDir
    Path folder;

    /** What read-arrow.mjs printed. */
    private record Read(List<String> schema, int rows, int batches, List<long[]> bits) {
    }

    private static String nodeExecutable() {
        String message = null;
        String found = null;
        for (String dir : System.getenv().getOrDefault("PATH", "").split(File.pathSeparator)) {
            if (!dir.isEmpty() && Files.isExecutable(Path.of(dir, "node"))) {
                found = Path.of(dir, "node").toString();
                break;
            }
        }
        if (found == null) {
            message = "no node on PATH: install Debian's nodejs and npm (as .ci/run does)";
        } else if (!Files.isDirectory(NODE_FOLDER.resolve("node_modules").resolve("apache-arrow"))) {
            message = "apache-arrow is not installed: run `npm ci` in spark-runner/src/test/node (as .ci/run does)";
        }
        if (message != null) {
            if ("true".equals(System.getenv("CI"))) {
                fail(message);
            }
            assumeTrue(false, message + "; skipped outside CI");
        }
        return found;
    }

    /** Runs the reader on {@code file}: an argument list, a time limit, and no process left behind. */
    private static Read readWithNode(Path file) throws IOException, InterruptedException {
        String node = nodeExecutable();
        Path output = Files.createTempFile(file.getParent(), "node", ".txt");
        Process process = new ProcessBuilder(node, "read-arrow.mjs", file.toAbsolutePath().toString())
                .directory(NODE_FOLDER.toFile()).redirectErrorStream(true).redirectOutput(output.toFile()).start();
        try {
            if (!process.waitFor(60, TimeUnit.SECONDS)) {
                fail("node did not finish reading " + file + " within 60 s");
            }
        } finally {
            process.destroyForcibly();
            process.waitFor();
        }
        List<String> lines = Files.readAllLines(output, StandardCharsets.UTF_8);
        assertEquals(0, process.exitValue(), "node failed: " + String.join("\n", lines));
        int header = 0;
        while (!lines.get(header).startsWith("rows\t")) {
            header++;
        }
        String[] counts = lines.get(header).split("\t");
        int rows = Integer.parseInt(counts[1]);
        List<long[]> bits = new ArrayList<>();
        for (int c = 0; c < header; c++) {
            String line = lines.get(header + 1 + c);
            String[] words = line.isEmpty() ? new String[0] : line.split(" ");
            long[] column = new long[words.length];
            for (int i = 0; i < words.length; i++) {
                column[i] = Long.parseUnsignedLong(words[i], 16);
            }
            bits.add(column);
        }
        return new Read(lines.subList(0, header), rows, Integer.parseInt(counts[3]), bits);
    }

    @Test
    @DisplayName("JavaScript's Arrow reader reads from particles.arrow the bits of particles.csv of the same run")
    void sameBitsAsTheCsv() throws IOException, InterruptedException {
        nodeExecutable();
        Path runFile = folder.resolve("run.conf");
        Files.writeString(runFile, String.join("\n", "# synthetic: costly-normal without busy work",
                "name = js", "model { name = costly-normal, settings { dimension = 4, cost-micros = 0 } }",
                "sampler { particles = 500, seed = 23 }", "output.progress = off", "output.report = false",
                "output.particles-format = both", "backend.kind = threads", ""));
        Path run = folder.resolve("run");
        CommandRunner.Result result = CommandRunner.run("run", runFile.toString(), "--out", run.toString());
        assertEquals(ExitCodes.SUCCESS, result.exitCode(), result.err());

        List<CSVRecord> records;
        try (Reader in = Files.newBufferedReader(run.resolve(ParticlesCsv.FILE_NAME));
                CSVParser parser = CSVParser.parse(in, CSVFormat.RFC4180)) {
            records = parser.getRecords();
        }
        Read read = readWithNode(run.resolve(ParticlesArrow.FILE_NAME));
        List<String> header = records.get(0).toList();
        assertEquals(header.size(), read.schema().size());
        for (int c = 0; c < header.size(); c++) {
            assertEquals(header.get(c) + "\tFloat64\tfalse", read.schema().get(c), "column " + c);
        }
        assertEquals(records.size() - 1, read.rows());
        assertEquals(500, read.rows());
        for (int c = 0; c < header.size(); c++) {
            assertEquals(read.rows(), read.bits().get(c).length, header.get(c));
            for (int i = 0; i < read.rows(); i++) {
                long fromCsv = Double.doubleToRawLongBits(Double.parseDouble(records.get(i + 1).get(c)));
                assertEquals(fromCsv, read.bits().get(c)[i], "row " + (i + 1) + " column " + header.get(c));
            }
        }
    }

    @Test
    @DisplayName("JavaScript's Arrow reader reads back random bit patterns, subnormals and extremes across many batches")
    void awkwardDoubles() throws IOException, InterruptedException {
        nodeExecutable();
        int n = 1000;
        int d = 2;
        DoubleSamples samples = new DoubleSamples(41);
        double[][] columns = new double[d + 3][n];
        for (double[] column : columns) {
            for (int i = 0; i < n; i++) {
                column[i] = samples.next();
            }
        }
        // Quiet NaNs with payloads and a negative zero: a reader that goes through numbers rather
        // than bits would lose them.
        columns[0][7] = Double.longBitsToDouble(0x7ff8_0000_dead_beefL);
        columns[3][500] = Double.longBitsToDouble(0xfff8_1234_5678_9abcL);
        columns[4][999] = -0.0;
        double[] values = new double[n * d];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < d; k++) {
                values[i * d + k] = columns[k][i];
            }
        }
        Path file;
        try (ParticlesArrow writer = ParticlesArrow.open(folder, List.of("a", "b"), 96)) {
            writer.append(new ParticleRows(0, n, d, values, columns[d], columns[d + 1], columns[d + 2]));
            file = writer.finish();
        }
        Read read = readWithNode(file);
        assertEquals(n, read.rows());
        assertEquals((n + 95) / 96, read.batches());
        for (int c = 0; c < d + 3; c++) {
            for (int i = 0; i < n; i++) {
                assertEquals(Double.doubleToRawLongBits(columns[c][i]), read.bits().get(c)[i], "row " + i + " col " + c);
            }
        }
    }
}
