package org.skerry.cli.report;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigParseOptions;
import com.typesafe.config.ConfigSyntax;
import java.io.IOException;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Everything a study report shows, read and checked before anything is written: the study's
 * name, kind of scaling, repeats and base run file from {@code study.conf}, and one row per run
 * from {@code scaling.csv} (its axis columns are those between {@code islands} and {@code
 * iterations}). A missing column or a field that is not a number is bad input naming the file,
 * line and column.
 *
 * @param axes the study's axis columns besides cores, in order
 * @param runs one per row of scaling.csv, in its order
 */
record StudyReport(Path folder, String name, String scaling, int repeats, String base, List<String> axes,
        List<Run> runs) {

    /** The phase columns of scaling.csv in stacking order, as the study's own table names them. */
    static final List<String> PHASES = List.of("evaluate", "reduce", "resample", "redistribute", "move", "checkpoint");

    /**
     * One run of the study.
     *
     * @param cores  the cores it could use, or 0 when the study has no cores axis
     * @param axes   its value on each axis column
     * @param phases seconds per phase, in {@link #PHASES} order
     */
    record Run(String point, int repeat, int cores, long particles, Map<String, String> axes, double wallSeconds,
            double loopSeconds, double[] phases, double evaluationsPerSecond, double speedup, double efficiency,
            double loadAverage, String runFolder) {

        /** The combination of non-core axis values: runs of one group differ only in cores. */
        String group() {
            StringBuilder out = new StringBuilder();
            axes.forEach((key, value) -> out.append(out.length() > 0 ? ", " : "").append(key).append(" = ").append(value));
            return out.length() == 0 ? "all points" : out.toString();
        }
    }

    StudyReport {
        axes = List.copyOf(axes);
        runs = List.copyOf(runs);
    }

    /** Whether the study had a cores axis (else speed-up and efficiency have no baseline but the point itself). */
    boolean hasCores() {
        return runs.stream().anyMatch(r -> r.cores() > 0);
    }

    /**
     * {median, min, max} of a few repeated measurements: the median, because one repeat disturbed
     * by another process on a shared machine should not move the figure.
     */
    static double[] spread(List<Double> values) {
        if (values.isEmpty()) {
            throw new IllegalArgumentException("no values");
        }
        double[] sorted = values.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        int n = sorted.length;
        double median = n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
        return new double[] {median, sorted[0], sorted[n - 1]};
    }

    /** The runs of each point, in order of first appearance. */
    Map<String, List<Run>> byPoint() {
        Map<String, List<Run>> out = new LinkedHashMap<>();
        runs.forEach(r -> out.computeIfAbsent(r.point(), p -> new ArrayList<>()).add(r));
        return out;
    }

    static StudyReport read(Path folder) {
        Path reportFolder = folder.resolve(ReportWriter.FOLDER);
        if (Files.exists(reportFolder) && !Files.isDirectory(reportFolder)) {
            throw new ReportInputException(reportFolder + " is in the way: a file where the report folder goes");
        }
        Path settingsFile = folder.resolve(FolderKind.STUDY_SETTINGS);
        Config settings;
        try {
            settings = ConfigFactory.parseFile(settingsFile.toFile(),
                    ConfigParseOptions.defaults().setSyntax(ConfigSyntax.CONF).setAllowMissing(false));
        } catch (ConfigException e) {
            throw new ReportInputException(settingsFile + ": " + e.getMessage(), e);
        }
        String name = text(settings, "name", String.valueOf(folder.toAbsolutePath().normalize().getFileName()));
        String scaling = text(settings, "scaling", "strong");
        String base = text(settings, "base", "");
        int repeats;
        try {
            repeats = settings.hasPath("repeats") ? settings.getInt("repeats") : 0;
        } catch (ConfigException e) {
            throw new ReportInputException(settingsFile + ": key repeats: " + e.getMessage(), e);
        }
        Path table = folder.resolve(FolderKind.STUDY_TABLE);
        List<String> axes = new ArrayList<>();
        List<Run> runs = new ArrayList<>();
        try (Reader reader = Files.newBufferedReader(table, StandardCharsets.UTF_8);
                CSVParser parser = CSVParser.builder().setReader(reader)
                        .setFormat(CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).get()).get()) {
            List<String> header = parser.getHeaderNames();
            int from = header.indexOf("islands");
            int to = header.indexOf("iterations");
            if (from < 0 || to < from) {
                throw new ReportInputException(table + " line 1: expected the columns islands … iterations of a "
                        + "study's table, found " + String.join(",", header));
            }
            axes.addAll(header.subList(from + 1, to));
            for (CSVRecord record : parser) {
                runs.add(run(new Line(table, record, header), axes));
            }
        } catch (UncheckedIOException e) {
            throw new ReportInputException(table + ": not a readable CSV file: " + e.getCause().getMessage(), e);
        } catch (IOException e) {
            throw new ReportInputException("cannot read " + table + ": " + e.getMessage(), e);
        } catch (IllegalArgumentException | IllegalStateException e) {
            throw new ReportInputException(table + ": not a readable CSV file: " + e.getMessage(), e);
        }
        if (runs.isEmpty()) {
            throw new ReportInputException(table + ": no runs (only a header)");
        }
        return new StudyReport(folder, name, scaling, repeats, base, axes, runs);
    }

    private static Run run(Line line, List<String> axes) {
        Map<String, String> values = new LinkedHashMap<>();
        axes.forEach(a -> values.put(a, line.text(a)));
        double[] phases = new double[PHASES.size()];
        for (int i = 0; i < phases.length; i++) {
            phases[i] = line.number(PHASES.get(i) + "_seconds");
        }
        String cores = line.text("cores");
        return new Run(line.text("point"), (int) line.number("repeat"), cores.isEmpty() ? 0 : (int) line.number("cores"),
                (long) line.number("particles"), values, line.number("wall_seconds"), line.number("loop_seconds"),
                phases, line.number("evaluations_per_second"), line.number("speedup"), line.number("efficiency"),
                line.text("load_average").isEmpty() ? Double.NaN : line.number("load_average"), line.text("run_folder"));
    }

    private static String text(Config settings, String key, String fallback) {
        try {
            return settings.hasPath(key) ? settings.getString(key) : fallback;
        } catch (ConfigException e) {
            throw new ReportInputException(e.getMessage(), e);
        }
    }

    /** One row of scaling.csv, read by column name; errors name the file, line and column. */
    private record Line(Path file, CSVRecord record, List<String> header) {

        String text(String column) {
            if (!header.contains(column)) {
                throw new ReportInputException(file + " line 1: no column " + column);
            }
            if (record.size() != header.size()) {
                throw new ReportInputException(file + " line " + (record.getRecordNumber() + 1) + ": " + record.size()
                        + " fields, the header has " + header.size());
            }
            return record.get(column);
        }

        double number(String column) {
            String text = text(column);
            try {
                return Double.parseDouble(text);
            } catch (NumberFormatException e) {
                throw new ReportInputException(file + " line " + (record.getRecordNumber() + 1) + " column " + column
                        + ": '" + text + "' is not a number");
            }
        }
    }
}
