package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.apache.commons.csv.CSVPrinter;

/**
 * Writes {@code batch-summary.csv} and {@code batch-summary.json}: one row per analysis of a
 * batch, in batch order, each file written whole or not at all.
 *
 * <p>CSV columns (snake_case, as in {@code summary.json}): {@code dataset, variant, status,
 * log_evidence, log_evidence_error, log_bayes_factor, log_bayes_factor_error, iterations,
 * likelihood_evaluations, final_tolerance, simulations} (the last two for ABC runs: the tolerance
 * reached and the simulations spent, empty for likelihood runs, whose evidence columns an ABC run
 * leaves empty in turn), then for each parameter (in order of first appearance over the rows)
 * {@code <name>.mean, <name>.q2_5, <name>.q97_5} (the dot separates the parameter's own name
 * from the statistic, which a {@code _} could not: parameter names may hold one), then
 * {@code seed, folder, wall_seconds, message}. The Bayes factor is the
 * variant's against the batch's reference variant on the same dataset (empty for the reference
 * itself and where either analysis failed); its error is the root sum of squares of the two
 * single-run evidence errors, treating the runs as independent. Absent values are empty fields
 * (CSV) or null (JSON). The JSON file holds {@code reference_variant} and {@code analyses}, a list
 * of objects with the same fields, parameters as {@code {name: {mean, q2_5, q97_5}}}.
 *
 * <p>{@code status} is {@code succeeded} or {@code failed}; in the files rewritten while a batch
 * runs (and left by an interrupted one) also {@code running} or {@code waiting}.
 *
 * <p>{@code wall_seconds} is the only field that differs between two runs of the same batch: it
 * is measured, not computed from settings and seed.
 */
public final class BatchSummary {

    /** The CSV file's name in the batch folder. */
    public static final String CSV_NAME = "batch-summary.csv";
    /** The JSON file's name in the batch folder. */
    public static final String JSON_NAME = "batch-summary.json";

    /**
     * One analysis of a batch. For a failed one the numbers are NaN, counts −1 and parameters
     * empty; a likelihood run has no final tolerance (NaN) or simulations (−1), an ABC run no evidence; {@code message} says what went wrong (null when it succeeded).
     */
    public record Row(String dataset, String variant, String status, double logEvidence, double logEvidenceError,
            double logBayesFactor, double logBayesFactorError, int iterations, long likelihoodEvaluations,
            double finalTolerance, long simulations, Map<String, double[]> parameters, long seed, String folder,
            double wallSeconds, String message) {
    }

    private BatchSummary() {
    }

    /** Writes both files into {@code folder}. */
    public static void write(Path folder, String referenceVariant, List<Row> rows) throws IOException {
        if (folder == null || rows == null) {
            throw new IllegalArgumentException("folder and rows must not be null");
        }
        Set<String> parameters = new LinkedHashSet<>();
        rows.forEach(r -> parameters.addAll(r.parameters().keySet()));
        writeCsv(folder.resolve(CSV_NAME), rows, parameters);
        writeJson(folder.resolve(JSON_NAME), referenceVariant, rows);
    }

    private static void writeCsv(Path file, List<Row> rows, Set<String> parameters) throws IOException {
        List<String> columns = new ArrayList<>(List.of("dataset", "variant", "status", "log_evidence",
                "log_evidence_error", "log_bayes_factor", "log_bayes_factor_error", "iterations", "likelihood_evaluations",
                "final_tolerance", "simulations"));
        for (String p : parameters) {
            columns.add(p + ".mean");
            columns.add(p + ".q2_5");
            columns.add(p + ".q97_5");
        }
        columns.addAll(List.of("seed", "folder", "wall_seconds", "message"));
        AtomicFile.writeText(file, out -> {
            CSVPrinter printer = new CSVPrinter(out, CsvOutput.withHeader(columns.toArray(new String[0])));
            for (Row r : rows) {
                List<Object> fields = new ArrayList<>(List.of(r.dataset(), r.variant(), r.status()));
                fields.add(number(r.logEvidence()));
                fields.add(number(r.logEvidenceError()));
                fields.add(number(r.logBayesFactor()));
                fields.add(number(r.logBayesFactorError()));
                fields.add(r.iterations() < 0 ? null : r.iterations());
                fields.add(r.likelihoodEvaluations() < 0 ? null : r.likelihoodEvaluations());
                fields.add(number(r.finalTolerance()));
                fields.add(r.simulations() < 0 ? null : r.simulations());
                for (String p : parameters) {
                    double[] values = r.parameters().get(p);
                    for (int k = 0; k < 3; k++) {
                        fields.add(values == null ? null : number(values[k]));
                    }
                }
                fields.add(r.seed());
                fields.add(r.folder());
                fields.add(number(r.wallSeconds()));
                fields.add(r.message());
                printer.printRecord(fields);
            }
            printer.flush();
        });
    }

    private static String number(double x) {
        return Double.isNaN(x) ? null : DoubleText.format(x);
    }

    private static void writeJson(Path file, String referenceVariant, List<Row> rows) throws IOException {
        AtomicFile.write(file, out -> {
            JsonGenerator json = JsonOutput.open(out);
            json.writeStartObject();
            JsonOutput.text(json, "reference_variant", referenceVariant);
            json.writeArrayFieldStart("analyses");
            for (Row r : rows) {
                json.writeStartObject();
                json.writeStringField("dataset", r.dataset());
                json.writeStringField("variant", r.variant());
                json.writeStringField("status", r.status());
                JsonOutput.number(json, "log_evidence", r.logEvidence());
                JsonOutput.number(json, "log_evidence_error", r.logEvidenceError());
                JsonOutput.number(json, "log_bayes_factor", r.logBayesFactor());
                JsonOutput.number(json, "log_bayes_factor_error", r.logBayesFactorError());
                count(json, "iterations", r.iterations());
                count(json, "likelihood_evaluations", r.likelihoodEvaluations());
                JsonOutput.number(json, "final_tolerance", r.finalTolerance());
                count(json, "simulations", r.simulations());
                json.writeObjectFieldStart("parameters");
                for (Map.Entry<String, double[]> p : r.parameters().entrySet()) {
                    json.writeObjectFieldStart(p.getKey());
                    JsonOutput.number(json, "mean", p.getValue()[0]);
                    JsonOutput.number(json, "q2_5", p.getValue()[1]);
                    JsonOutput.number(json, "q97_5", p.getValue()[2]);
                    json.writeEndObject();
                }
                json.writeEndObject();
                json.writeNumberField("seed", r.seed());
                json.writeStringField("folder", r.folder());
                JsonOutput.number(json, "wall_seconds", r.wallSeconds());
                JsonOutput.text(json, "message", r.message());
                json.writeEndObject();
            }
            json.writeEndArray();
            json.writeEndObject();
            JsonOutput.close(json);
        });
    }

    private static void count(JsonGenerator json, String field, long value) throws IOException {
        if (value < 0) {
            json.writeNullField(field);
        } else {
            json.writeNumberField(field, value);
        }
    }
}
