package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Reads back what a batch summary needs from a finished run folder: the answer from
 * {@code summary.json} and the wall time from {@code timing.json}. Reading the files, rather
 * than keeping results in memory, gives the same summary row for an analysis run now and one
 * kept from an earlier, interrupted batch.
 */
public final class RunSummaryReader {

    /**
     * The parts of a run's summary a batch row shows; parameters map to {mean, q2_5, q97_5}. An ABC
     * run also gives its final tolerance and simulations (NaN and −1 for a likelihood run).
     */
    public record RunSummary(double logEvidence, double logEvidenceError, int iterations, long likelihoodEvaluations,
            Map<String, double[]> parameters, double finalTolerance, long simulations) {
    }

    private static final JsonFactory FACTORY = new JsonFactory();

    private RunSummaryReader() {
    }

    /** Reads {@code summary.json} of {@code folder}. */
    public static RunSummary read(Path folder) throws IOException {
        Path file = folder.resolve(SummaryJson.FILE_NAME);
        double logEvidence = Double.NaN;
        double error = Double.NaN;
        boolean reliable = true;
        int iterations = -1;
        long evaluations = -1;
        Map<String, double[]> parameters = new LinkedHashMap<>();
        double[] abc = {Double.NaN, -1};
        try (JsonParser p = FACTORY.createParser(file.toFile())) {
            expect(p, JsonToken.START_OBJECT, file);
            while (p.nextToken() == JsonToken.FIELD_NAME) {
                String field = p.currentName();
                p.nextToken();
                switch (field) {
                    case "log_evidence" -> logEvidence = number(p);
                    case "log_evidence_error" -> error = number(p);
                    case "log_evidence_error_reliable" -> reliable = p.getBooleanValue();
                    case "iterations" -> iterations = p.getIntValue();
                    case "likelihood_evaluations" -> evaluations = p.getLongValue();
                    case "parameters" -> readParameters(p, parameters);
                    case "abc" -> readAbc(p, abc);
                    default -> p.skipChildren();
                }
            }
        }
        // An error the run itself marks unreliable is not shown as a figure in batch tables.
        return new RunSummary(logEvidence, reliable ? error : Double.NaN, iterations, evaluations, parameters, abc[0],
                (long) abc[1]);
    }

    /** The wall time in {@code timing.json} of {@code folder}, or NaN when it is missing or unreadable. */
    public static double wallSeconds(Path folder) {
        Path file = folder.resolve(TimingJson.FILE_NAME);
        if (!Files.isRegularFile(file)) {
            return Double.NaN;
        }
        try (JsonParser p = FACTORY.createParser(file.toFile())) {
            expect(p, JsonToken.START_OBJECT, file);
            while (p.nextToken() == JsonToken.FIELD_NAME) {
                String field = p.currentName();
                p.nextToken();
                if (field.equals("wall_seconds")) {
                    return number(p);
                }
                p.skipChildren();
            }
        } catch (IOException e) {
            // the wall time is information, not part of the answer
        }
        return Double.NaN;
    }

    /** The abc object of an ABC run's summary.json: its final tolerance and simulations into {@code out}. */
    private static void readAbc(JsonParser p, double[] out) throws IOException {
        if (p.currentToken() != JsonToken.START_OBJECT) {
            p.skipChildren();
            return;
        }
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String key = p.currentName();
            p.nextToken();
            switch (key) {
                case "final_tolerance" -> out[0] = number(p);
                case "simulations" -> out[1] = p.getLongValue();
                default -> p.skipChildren();
            }
        }
    }

    private static void readParameters(JsonParser p, Map<String, double[]> out) throws IOException {
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String name = p.currentName();
            p.nextToken();
            double[] values = {Double.NaN, Double.NaN, Double.NaN};
            while (p.nextToken() == JsonToken.FIELD_NAME) {
                String key = p.currentName();
                p.nextToken();
                switch (key) {
                    case "mean" -> values[0] = number(p);
                    case "q2_5" -> values[1] = number(p);
                    case "q97_5" -> values[2] = number(p);
                    default -> p.skipChildren();
                }
            }
            out.put(name, values);
        }
    }

    private static double number(JsonParser p) throws IOException {
        return p.currentToken() == JsonToken.VALUE_NULL ? Double.NaN : p.getDoubleValue();
    }

    private static void expect(JsonParser p, JsonToken token, Path file) throws IOException {
        if (p.nextToken() != token) {
            throw new IOException(file + ": expected a JSON object");
        }
    }
}
