package org.skerry.cli.report;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * What the report shows of a run's {@code summary.json}: the evidence and whether its error can
 * be trusted, every parameter's mean, sd and quantiles in the file's order, and the counts behind
 * the warnings. Reads the whole file (the batch reader, {@code RunSummaryReader}, keeps only what
 * a batch row needs); a missing or mistyped key is bad input naming the file and key.
 *
 * @param quantileKeys the quantile keys in file order ({@code q2_5} … {@code q97_5})
 */
record SummaryFile(Path file, String name, String model, double logEvidence, double logEvidenceError,
        boolean errorReliable, String errorWarning, long distinctAncestorsAtEnd, Map<String, ParameterSummary> parameters,
        List<String> quantileKeys, long iterations, long iterationsAtStepCap, String stepCapWarning,
        long likelihoodEvaluations, long invalidEvaluations, String firstInvalid, long particles, long seed,
        Abc abc) {

    /**
     * An ABC run's {@code abc} object: the tolerance reached, whether it is the final one asked
     * for, why the run ended before it (or null) and the simulations made.
     */
    record Abc(double finalTolerance, boolean reachedFinalTolerance, String endedEarly, long simulations) {
    }

    /** Whether the run is an ABC run: no evidence, a tolerance instead of a temperature. */
    boolean isAbc() {
        return abc != null;
    }

    /** One parameter's summary: mean, sd and the quantiles keyed as in the file. */
    record ParameterSummary(double mean, double sd, Map<String, Double> quantiles) {
        ParameterSummary {
            quantiles = Collections.unmodifiableMap(new LinkedHashMap<>(quantiles));
        }
    }

    SummaryFile {
        parameters = Collections.unmodifiableMap(new LinkedHashMap<>(parameters));
        quantileKeys = List.copyOf(quantileKeys);
    }

    static SummaryFile read(Path file) {
        Map<String, Object> json = JsonValues.readObject(file);
        JsonFields r = new JsonFields(file, json);
        Map<String, Object> parameterObjects = r.object(json, "parameters", "parameters");
        Map<String, ParameterSummary> parameters = new LinkedHashMap<>();
        List<String> quantileKeys = new ArrayList<>();
        for (Map.Entry<String, Object> entry : parameterObjects.entrySet()) {
            String where = "parameters." + entry.getKey();
            Map<String, Object> p = r.object(parameterObjects, entry.getKey(), where);
            Map<String, Double> quantiles = new LinkedHashMap<>();
            for (String key : p.keySet()) {
                if (key.matches("q\\d+(_\\d+)?")) {
                    quantiles.put(key, r.number(p, key, where + "." + key));
                }
            }
            if (quantileKeys.isEmpty()) {
                quantileKeys.addAll(quantiles.keySet());
            } else if (!quantileKeys.equals(new ArrayList<>(quantiles.keySet()))) {
                throw new ReportInputException(file + ": " + where + " has the quantiles " + quantiles.keySet()
                        + ", the first parameter " + quantileKeys);
            }
            parameters.put(entry.getKey(), new ParameterSummary(r.number(p, "mean", where + ".mean"),
                    r.number(p, "sd", where + ".sd"), quantiles));
        }
        if (parameters.isEmpty()) {
            throw new ReportInputException(file + ": key parameters lists no parameter");
        }
        Object firstInvalid = json.get("first_invalid");
        return new SummaryFile(file, r.text("name"), r.text("model"), r.number(json, "log_evidence", "log_evidence"),
                r.number(json, "log_evidence_error", "log_evidence_error"), r.flag("log_evidence_error_reliable"),
                r.optionalText("log_evidence_error_warning"), r.count("distinct_ancestors_at_end"), parameters,
                quantileKeys, r.count("iterations"), r.count("iterations_at_step_cap"),
                r.optionalText("step_cap_warning"), r.count("likelihood_evaluations"), r.count("invalid_evaluations"),
                firstInvalid instanceof Map<?, ?> m ? describe(m) : null, r.count("particles"), r.whole("seed"),
                abc(r, json));
    }

    private static Abc abc(JsonFields r, Map<String, Object> json) {
        if (json.get("abc") == null) {
            return null;
        }
        Map<String, Object> abc = r.object(json, "abc", "abc");
        Object reached = abc.get("reached_final_tolerance");
        if (!(reached instanceof Boolean)) {
            throw r.wrong("abc.reached_final_tolerance", reached, "true or false");
        }
        return new Abc(r.number(abc, "final_tolerance", "abc.final_tolerance"), (Boolean) reached,
                r.optionalText(abc, "ended_early", "abc.ended_early"),
                r.optionalCount(abc, "simulations", "abc.simulations"));
    }

    /** {@code first_invalid} in words: iteration, particle, reason and the parameter values. */
    private static String describe(Map<?, ?> first) {
        return "iteration " + first.get("iteration") + ", particle " + first.get("particle") + ": "
                + first.get("reason") + (first.get("parameters") == null ? "" : " at " + first.get("parameters"));
    }
}
