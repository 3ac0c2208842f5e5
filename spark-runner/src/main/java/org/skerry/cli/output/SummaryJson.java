package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.sampler.EvidenceEstimate;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.ToleranceRecord;

/**
 * Writes {@code summary.json}, the answer of a run: its name and model, log evidence and its
 * error, posterior summaries per parameter, evaluation counts, population size and seed. It holds
 * nothing timing-dependent (that is {@link TimingJson}), so the same settings and seed give the
 * same bytes.
 *
 * <p>Keys (snake_case, as every column and key of the run outputs), in this order: {@code name}
 * (the run file's {@code name}; null when written without one), {@code model},
 * {@code log_evidence}, {@code log_evidence_error}, {@code log_evidence_error_reliable},
 * {@code log_evidence_error_warning} (null when none), {@code distinct_ancestors_at_end}
 * (distinct iteration-0 ancestors among particles of positive weight), {@code islands} (0 in
 * global mode), {@code island_log_evidence_error} (the error of log Z from the islands' spread,
 * null unless islands ran without interaction), {@code parameters} (an object with one entry per
 * parameter, in parameter order, each holding {@code mean, sd, q2_5, q5, q25, q50, q75, q95,
 * q97_5}: quantiles named after their percentage, {@code q2_5} the 2.5 % quantile, {@code q50}
 * the median), {@code iterations} (tempering iterations after the initial draw),
 * {@code likelihood_evaluations}, {@code zero_likelihood_evaluations},
 * {@code invalid_evaluations}, {@code retried_evaluations} (evaluations whose first call was
 * invalid and that were retried), {@code failed_after_retries} (those still invalid after the
 * last retry), {@code first_invalid} (the earliest invalid evaluation, of lowest particle index
 * in its iteration: {@code {iteration, particle, reason, parameters: {name: value}}},
 * {@code iteration} null when the result has no iteration records; or null when every evaluation
 * was valid), {@code particles} and {@code seed}. A number that is not finite (an error that
 * cannot be estimated, say) is written as null.
 *
 * <p>An ABC run writes null for {@code log_evidence}, {@code log_evidence_error} and
 * {@code island_log_evidence_error} and says why in {@code log_evidence_error_warning}
 * ({@link #ABC_EVIDENCE_NOTE}), and adds before {@code particles} the object {@code abc}:
 * {@code final_tolerance} (the tolerance reached), {@code reached_final_tolerance} (false when
 * the run ended early), {@code ended_early} (why, or null) and {@code simulations} (all the run
 * made); its evaluation counts count evaluations of M simulations each.
 */
public final class SummaryJson {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "summary.json";

    /** Why an ABC run reports no evidence (Robert, Cornuet, Marin &amp; Pillai 2011, PNAS 108(37)). */
    public static final String ABC_EVIDENCE_NOTE = "not reported for an ABC run: the ABC approximation of the evidence "
            + "is not a likelihood evidence, and summaries sufficient within each model are in general not sufficient "
            + "for choosing between models (Robert, Cornuet, Marin & Pillai 2011)";

    private SummaryJson() {
    }

    /** As {@link #write(Path, String, String, long, SamplerResult)} for a run without a name. */
    public static Path write(Path folder, String model, long seed, SamplerResult result) throws IOException {
        return write(folder, null, model, seed, result);
    }

    /**
     * Writes {@code summary.json} in {@code folder}, atomically.
     *
     * @param folder an existing folder
     * @param name   the run's name (the run file's {@code name}), or null
     * @param model  the model's name as the user chose it
     * @param seed   the seed of the run
     * @param result what the sampler returned
     * @return the file written
     */
    public static Path write(Path folder, String name, String model, long seed, SamplerResult result)
            throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        if (result == null) {
            throw new IllegalArgumentException("result must not be null");
        }
        List<String> names = new ArrayList<>();
        for (ParameterSummary p : result.parameters()) {
            names.add(p.name());
        }
        double[] invalidAt = result.evaluations().firstInvalidParameters();
        if (invalidAt != null && invalidAt.length != names.size()) {
            throw new IllegalArgumentException("the first invalid evaluation has " + invalidAt.length
                    + " parameter values but the result has " + names.size() + " parameters " + names);
        }
        Path file = folder.resolve(FILE_NAME);
        AtomicFile.write(file, out -> {
            JsonGenerator json = JsonOutput.open(out);
            json.writeStartObject();
            JsonOutput.text(json, "name", name);
            json.writeStringField("model", model);
            EvidenceEstimate evidence = result.evidence();
            ToleranceRecord abc = result.lastTolerance();
            JsonOutput.number(json, "log_evidence", abc != null ? Double.NaN : evidence.logEvidence());
            JsonOutput.number(json, "log_evidence_error", abc != null ? Double.NaN : evidence.standardError());
            json.writeBooleanField("log_evidence_error_reliable", abc == null && evidence.reliable());
            JsonOutput.text(json, "log_evidence_error_warning", abc != null ? ABC_EVIDENCE_NOTE : evidence.warning());
            json.writeNumberField("distinct_ancestors_at_end", evidence.distinctEves());
            json.writeNumberField("islands", evidence.islands());
            JsonOutput.number(json, "island_log_evidence_error", abc != null ? Double.NaN : evidence.islandStandardError());
            json.writeObjectFieldStart("parameters");
            for (ParameterSummary p : result.parameters()) {
                json.writeObjectFieldStart(p.name());
                JsonOutput.number(json, "mean", p.mean());
                JsonOutput.number(json, "sd", p.sd());
                JsonOutput.number(json, "q2_5", p.q2_5());
                JsonOutput.number(json, "q5", p.q5());
                JsonOutput.number(json, "q25", p.q25());
                JsonOutput.number(json, "q50", p.q50());
                JsonOutput.number(json, "q75", p.q75());
                JsonOutput.number(json, "q95", p.q95());
                JsonOutput.number(json, "q97_5", p.q97_5());
                json.writeEndObject();
            }
            json.writeEndObject();
            json.writeNumberField("iterations", result.iterationCount());
            json.writeNumberField("iterations_at_step_cap", result.stepCap().iterationsAtCap());
            JsonOutput.text(json, "step_cap_warning", result.stepCap().warning());
            EvaluationTally tally = result.evaluations();
            json.writeNumberField("likelihood_evaluations", tally.evaluations());
            json.writeNumberField("zero_likelihood_evaluations", tally.zeroLikelihood());
            json.writeNumberField("invalid_evaluations", tally.invalid());
            json.writeNumberField("retried_evaluations", tally.retried());
            json.writeNumberField("failed_after_retries", tally.failedAfterRetries());
            if (tally.firstInvalidIndex() < 0) {
                json.writeNullField("first_invalid");
            } else {
                json.writeObjectFieldStart("first_invalid");
                Integer iteration = firstInvalidIteration(result.iterations());
                if (iteration == null) {
                    json.writeNullField("iteration");
                } else {
                    json.writeNumberField("iteration", iteration);
                }
                json.writeNumberField("particle", tally.firstInvalidIndex());
                JsonOutput.text(json, "reason", tally.firstInvalidReason());
                if (invalidAt == null) {
                    json.writeNullField("parameters");
                } else {
                    json.writeObjectFieldStart("parameters");
                    for (int k = 0; k < invalidAt.length; k++) {
                        JsonOutput.number(json, names.get(k), invalidAt[k]);
                    }
                    json.writeEndObject();
                }
                json.writeEndObject();
            }
            if (abc != null) {
                json.writeObjectFieldStart("abc");
                JsonOutput.number(json, "final_tolerance", abc.tolerance());
                json.writeBooleanField("reached_final_tolerance", result.endedEarly() == null);
                JsonOutput.text(json, "ended_early", result.endedEarly());
                json.writeNumberField("simulations", result.simulations());
                json.writeEndObject();
            }
            json.writeNumberField("particles", result.normalisedWeights().length);
            json.writeNumberField("seed", seed);
            json.writeEndObject();
            JsonOutput.close(json);
        });
        return file;
    }

    /** The first iteration with an invalid evaluation: the one the run's first-invalid report is from. */
    private static Integer firstInvalidIteration(List<IterationRecord> records) {
        for (IterationRecord r : records) {
            if (r.firstInvalidIndex() >= 0) {
                return r.iteration();
            }
        }
        return null;
    }
}
