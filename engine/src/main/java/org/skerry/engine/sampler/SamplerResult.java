package org.skerry.engine.sampler;

import java.util.List;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;

/**
 * The outcome of a run: evidence with its error, posterior summaries per parameter, the
 * per-iteration records, totals of likelihood evaluations, and the final weighted particles in
 * canonical order. Everything but the phase times is determined by the settings and seed.
 *
 * @param evidence    log evidence and its single-run error
 * @param parameters  posterior summary per parameter, in parameter order
 * @param iterations  one record per iteration, starting with the initial draw
 * @param evaluations tally of every likelihood evaluation of the run
 * @param particles   the final population, or null when it streamed to a sink
 *                    ({@link SmcSampler#streamingTo})
 * @param normalisedWeights normalised weights of the final particles (summing to 1)
 * @param stepCap     iterations whose adaptive MH step count reached the cap
 * @param endedEarly  why the run ended before the last target of its sequence (ABC: an
 *                    acceptance floor or a simulation budget), or null when it reached it
 * @param exportSeconds wall seconds spent fetching the final population and computing its
 *                    summaries (posterior summaries, the evidence and its error), including
 *                    the time a sink took to take the rows it was handed
 */
public record SamplerResult(EvidenceEstimate evidence, List<ParameterSummary> parameters,
        List<IterationRecord> iterations, EvaluationTally evaluations, FinalParticles particles,
        double[] normalisedWeights, StepCapReport stepCap, String endedEarly, double exportSeconds) {

    /** The outcome of a run, its export not timed. */
    public SamplerResult(EvidenceEstimate evidence, List<ParameterSummary> parameters,
            List<IterationRecord> iterations, EvaluationTally evaluations, FinalParticles particles,
            double[] normalisedWeights, StepCapReport stepCap, String endedEarly) {
        this(evidence, parameters, iterations, evaluations, particles, normalisedWeights, stepCap, endedEarly, 0.0);
    }

    /** The outcome of a run that reached the last target. */
    public SamplerResult(EvidenceEstimate evidence, List<ParameterSummary> parameters,
            List<IterationRecord> iterations, EvaluationTally evaluations, FinalParticles particles,
            double[] normalisedWeights, StepCapReport stepCap) {
        this(evidence, parameters, iterations, evaluations, particles, normalisedWeights, stepCap, null);
    }

    /** The last iteration's ABC record (tolerance, simulations), or null for a run without tolerances. */
    public ToleranceRecord lastTolerance() {
        return iterations.isEmpty() ? null : iterations.get(iterations.size() - 1).abc();
    }

    /** Simulations of the whole run (ABC), 0 for a run without tolerances. */
    public long simulations() {
        long total = 0;
        for (IterationRecord record : iterations) {
            total += record.abc() == null ? 0 : record.abc().simulations();
        }
        return total;
    }

    /** Number of tempering iterations after the initial draw. */
    public int iterationCount() {
        return iterations.size() - 1;
    }

    /** The summary of the named parameter. */
    public ParameterSummary parameter(String name) {
        for (ParameterSummary summary : parameters) {
            if (summary.name().equals(name)) {
                return summary;
            }
        }
        throw new IllegalArgumentException("no parameter named '" + name + "'");
    }
}
