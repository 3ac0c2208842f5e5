package org.skerry.engine.sampler;

/**
 * The log evidence (log marginal likelihood) of a run with its Monte Carlo error estimated from
 * the run itself (Lee &amp; Whiteley 2018, Biometrika 105(3)), and whether that error estimate can
 * be trusted: it degenerates when few distinct Eve indices (iteration-0 ancestors) survive.
 *
 * @param logEvidence       the estimate of log Z
 * @param relativeVariance  estimated Var(Ẑ)/Z²; NaN when it cannot be estimated
 * @param standardError     estimated standard deviation of log Ẑ, {@code sqrt(log(1 + relativeVariance))}
 * @param distinctEves      number of distinct Eve indices among particles with positive weight
 * @param reliable          false when {@code distinctEves} is below the configured minimum
 * @param warning           why the error is unreliable, or null
 * @param islands           number of islands (0 in global mode)
 * @param islandStandardError in island mode without interaction, the standard error of log Ẑ
 *     from the spread of the islands' own evidence estimates (a second, independent error
 *     estimate); NaN otherwise
 */
public record EvidenceEstimate(double logEvidence, double relativeVariance, double standardError,
        long distinctEves, boolean reliable, String warning, int islands, double islandStandardError) {

    /** This estimate with the island error attached. */
    public EvidenceEstimate withIslands(int count, double error) {
        return new EvidenceEstimate(logEvidence, relativeVariance, standardError, distinctEves, reliable, warning,
                count, error);
    }
}
