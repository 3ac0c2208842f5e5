package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.population.EvaluationTally;

/**
 * What one iteration of the sampler did, for the per-iteration table and progress display.
 * Iteration 0 is the initial draw. Immutable.
 *
 * @param iteration            iteration number, 0 for the initial draw
 * @param temperature          φ reached in this iteration
 * @param ess                  effective sample size after reweighting, before any resampling
 * @param resampled            whether the population was resampled
 * @param distinctAncestors    particles with at least one offspring (N when not resampled)
 * @param particlesMoved       particles sent to another block (partition) while rebalancing after
 *                             resampling ({@code particles_sent_to_other_partitions} in iterations.csv)
 * @param acceptanceRate       MH acceptance rate over all steps of the iteration
 * @param mhSteps              MH steps made per particle
 * @param scale                random-walk scale λ used
 * @param logEvidenceIncrement log of the weighted mean incremental weight
 * @param logEvidence          running log evidence estimate
 * @param evaluations          likelihood evaluations in this iteration
 * @param zeroLikelihood       evaluations that returned a valid zero likelihood
 * @param invalidEvaluations   invalid evaluations (NaN, +∞, exception)
 * @param firstInvalidIndex    lowest particle index with an invalid evaluation, or −1
 * @param firstInvalidReason   its reason, or null
 * @param seconds              wall time per phase
 * @param retriedEvaluations   evaluations whose first call was invalid and that were retried
 * @param failedAfterRetries   of those, evaluations still invalid after the last retry
 * @param firstInvalidParameters the parameter values of the particle {@code firstInvalidIndex}
 *                             names, in parameter order; empty when there is none
 * @param abc                  ABC runs: tolerance, share within it and simulations; null otherwise
 */
public record IterationRecord(int iteration, double temperature, double ess, boolean resampled,
        long distinctAncestors, long particlesMoved, double acceptanceRate, int mhSteps, double scale,
        double logEvidenceIncrement, double logEvidence, long evaluations, long zeroLikelihood,
        long invalidEvaluations, long firstInvalidIndex, String firstInvalidReason, PhaseTimes seconds,
        long retriedEvaluations, long failedAfterRetries, List<Double> firstInvalidParameters, ToleranceRecord abc) {

    public IterationRecord {
        firstInvalidParameters = firstInvalidParameters == null ? List.of() : List.copyOf(firstInvalidParameters);
    }

    /** A record of an iteration of a run without tolerances. */
    public IterationRecord(int iteration, double temperature, double ess, boolean resampled,
            long distinctAncestors, long particlesMoved, double acceptanceRate, int mhSteps, double scale,
            double logEvidenceIncrement, double logEvidence, long evaluations, long zeroLikelihood,
            long invalidEvaluations, long firstInvalidIndex, String firstInvalidReason, PhaseTimes seconds,
            long retriedEvaluations, long failedAfterRetries, List<Double> firstInvalidParameters) {
        this(iteration, temperature, ess, resampled, distinctAncestors, particlesMoved, acceptanceRate, mhSteps, scale,
                logEvidenceIncrement, logEvidence, evaluations, zeroLikelihood, invalidEvaluations, firstInvalidIndex,
                firstInvalidReason, seconds, retriedEvaluations, failedAfterRetries, firstInvalidParameters, null);
    }

    /** This record with its phase times replaced. */
    public IterationRecord withSeconds(PhaseTimes times) {
        return new IterationRecord(iteration, temperature, ess, resampled, distinctAncestors, particlesMoved,
                acceptanceRate, mhSteps, scale, logEvidenceIncrement, logEvidence, evaluations, zeroLikelihood,
                invalidEvaluations, firstInvalidIndex, firstInvalidReason, times, retriedEvaluations, failedAfterRetries,
                firstInvalidParameters, abc);
    }

    /** A record of an iteration without retries and without the first invalid particle's values. */
    public IterationRecord(int iteration, double temperature, double ess, boolean resampled,
            long distinctAncestors, long particlesMoved, double acceptanceRate, int mhSteps, double scale,
            double logEvidenceIncrement, double logEvidence, long evaluations, long zeroLikelihood,
            long invalidEvaluations, long firstInvalidIndex, String firstInvalidReason, PhaseTimes seconds) {
        this(iteration, temperature, ess, resampled, distinctAncestors, particlesMoved, acceptanceRate, mhSteps, scale,
                logEvidenceIncrement, logEvidence, evaluations, zeroLikelihood, invalidEvaluations, firstInvalidIndex,
                firstInvalidReason, seconds, 0, 0, List.of());
    }

    /** The parameter values of {@code tally}'s first invalid evaluation, for the last component. */
    static List<Double> valuesOf(EvaluationTally tally) {
        double[] values = tally.firstInvalidParameters();
        if (values == null) {
            return List.of();
        }
        List<Double> list = new ArrayList<>(values.length);
        for (double v : values) {
            list.add(v);
        }
        return list;
    }
}
