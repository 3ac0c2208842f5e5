package org.skerry.engine.sampler;

/**
 * What one iteration of the sampler did, for the per-iteration table and progress display.
 * Iteration 0 is the initial draw. Immutable.
 *
 * @param iteration            iteration number, 0 for the initial draw
 * @param temperature          φ reached in this iteration
 * @param ess                  effective sample size after reweighting, before any resampling
 * @param resampled            whether the population was resampled
 * @param distinctAncestors    particles with at least one offspring (N when not resampled)
 * @param particlesMoved       particles that changed block while rebalancing
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
 */
public record IterationRecord(int iteration, double temperature, double ess, boolean resampled,
        long distinctAncestors, long particlesMoved, double acceptanceRate, int mhSteps, double scale,
        double logEvidenceIncrement, double logEvidence, long evaluations, long zeroLikelihood,
        long invalidEvaluations, long firstInvalidIndex, String firstInvalidReason, PhaseTimes seconds) {
}
