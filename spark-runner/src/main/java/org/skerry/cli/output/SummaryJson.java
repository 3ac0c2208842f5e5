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

/**
 * Writes {@code summary.json}, the answer of a run: log evidence and its error, posterior
 * summaries per parameter, evaluation counts, population size, seed and model name. It holds
 * nothing timing-dependent (that is {@link TimingJson}), so the same settings and seed give the
 * same bytes.
 *
 * <p>Keys, in this order: {@code logEvidence}, {@code logEvidenceError},
 * {@code logEvidenceErrorReliable}, {@code logEvidenceErrorWarning} (null when none),
 * {@code islands} (0 in global mode), {@code islandLogEvidenceError} (the error of log Z from the
 * islands' spread, null unless islands ran without interaction),
 * {@code distinctAncestorsAtEnd} (distinct iteration-0 ancestors among particles of positive
 * weight), {@code parameters} (an object with one entry per parameter, in parameter order, each
 * holding {@code mean, sd, q025, q050, q250, q500, q750, q950, q975}), {@code iterations}
 * (tempering iterations after the initial draw), {@code likelihoodEvaluations},
 * {@code zeroLikelihoodEvaluations}, {@code invalidEvaluations}, {@code retriedEvaluations}
 * (evaluations whose first call was invalid and that were retried), {@code failedAfterRetries}
 * (those still invalid after the last retry), {@code firstInvalid} (the earliest invalid
 * evaluation, of lowest particle index in its iteration: {@code {iteration, particle, reason,
 * parameters: {name: value}}}, {@code iteration} null when the result has no iteration records;
 * or null when every evaluation was valid), {@code particles}, {@code seed} and {@code model}. A number that is not finite (an
 * error that cannot be estimated, say) is written as null.
 */
public final class SummaryJson {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "summary.json";

    private SummaryJson() {
    }

    /**
     * Writes {@code summary.json} in {@code folder}, atomically.
     *
     * @param folder an existing folder
     * @param model  the model's name as the user chose it
     * @param seed   the seed of the run
     * @param result what the sampler returned
     * @return the file written
     */
    public static Path write(Path folder, String model, long seed, SamplerResult result) throws IOException {
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
            EvidenceEstimate evidence = result.evidence();
            JsonOutput.number(json, "logEvidence", evidence.logEvidence());
            JsonOutput.number(json, "logEvidenceError", evidence.standardError());
            json.writeBooleanField("logEvidenceErrorReliable", evidence.reliable());
            JsonOutput.text(json, "logEvidenceErrorWarning", evidence.warning());
            json.writeNumberField("distinctAncestorsAtEnd", evidence.distinctEves());
            json.writeNumberField("islands", evidence.islands());
            JsonOutput.number(json, "islandLogEvidenceError", evidence.islandStandardError());
            json.writeObjectFieldStart("parameters");
            for (ParameterSummary p : result.parameters()) {
                json.writeObjectFieldStart(p.name());
                JsonOutput.number(json, "mean", p.mean());
                JsonOutput.number(json, "sd", p.sd());
                JsonOutput.number(json, "q025", p.q025());
                JsonOutput.number(json, "q050", p.q050());
                JsonOutput.number(json, "q250", p.q250());
                JsonOutput.number(json, "q500", p.q500());
                JsonOutput.number(json, "q750", p.q750());
                JsonOutput.number(json, "q950", p.q950());
                JsonOutput.number(json, "q975", p.q975());
                json.writeEndObject();
            }
            json.writeEndObject();
            json.writeNumberField("iterations", result.iterationCount());
            json.writeNumberField("iterationsAtStepCap", result.stepCap().iterationsAtCap());
            JsonOutput.text(json, "stepCapWarning", result.stepCap().warning());
            EvaluationTally tally = result.evaluations();
            json.writeNumberField("likelihoodEvaluations", tally.evaluations());
            json.writeNumberField("zeroLikelihoodEvaluations", tally.zeroLikelihood());
            json.writeNumberField("invalidEvaluations", tally.invalid());
            json.writeNumberField("retriedEvaluations", tally.retried());
            json.writeNumberField("failedAfterRetries", tally.failedAfterRetries());
            if (tally.firstInvalidIndex() < 0) {
                json.writeNullField("firstInvalid");
            } else {
                json.writeObjectFieldStart("firstInvalid");
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
            json.writeNumberField("particles", result.particles().size());
            json.writeNumberField("seed", seed);
            json.writeStringField("model", model);
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
