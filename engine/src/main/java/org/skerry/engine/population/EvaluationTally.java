package org.skerry.engine.population;

import java.io.Serializable;
import java.util.Arrays;

/**
 * Counts from a batch of likelihood evaluations: how many were made, how many returned a valid
 * zero ({@code -Infinity}) and how many were invalid (NaN, {@code +Infinity} or an exception),
 * with the report of the invalid evaluation of lowest particle index, and how many evaluations
 * needed a retry ({@code retried}) and of those how many still failed on the last retry. Merging
 * keeps the lowest index, so the report does not depend on which block finished first.
 *
 * <p>Immutable; crosses from executors to the driver once per block and phase.
 */
public final class EvaluationTally implements Serializable {

    private static final long serialVersionUID = 1L;

    /** The tally of no evaluations. */
    public static final EvaluationTally NONE = new EvaluationTally(0, 0, 0, -1, null, null);

    private final long evaluations;
    private final long zeroLikelihood;
    private final long invalid;
    private final long firstInvalidIndex;
    private final String firstInvalidReason;
    private final double[] firstInvalidParameters;
    private final long retried;
    private final long failedAfterRetries;

    /** A tally of evaluations made without retries. */
    public EvaluationTally(long evaluations, long zeroLikelihood, long invalid, long firstInvalidIndex,
            String firstInvalidReason, double[] firstInvalidParameters) {
        this(evaluations, zeroLikelihood, invalid, firstInvalidIndex, firstInvalidReason, firstInvalidParameters, 0, 0);
    }

    /**
     * @param retried            evaluations whose first call was invalid and that were retried
     * @param failedAfterRetries of those, evaluations still invalid after the last retry (also
     *                           counted in {@code invalid})
     */
    public EvaluationTally(long evaluations, long zeroLikelihood, long invalid, long firstInvalidIndex,
            String firstInvalidReason, double[] firstInvalidParameters, long retried, long failedAfterRetries) {
        this.retried = retried;
        this.failedAfterRetries = failedAfterRetries;
        this.evaluations = evaluations;
        this.zeroLikelihood = zeroLikelihood;
        this.invalid = invalid;
        this.firstInvalidIndex = firstInvalidIndex;
        this.firstInvalidReason = firstInvalidReason;
        this.firstInvalidParameters = firstInvalidParameters == null ? null : firstInvalidParameters.clone();
    }

    /** Sum of two tallies; the invalid report of lower particle index is kept. */
    public EvaluationTally plus(EvaluationTally other) {
        boolean keepThis = firstInvalidIndex >= 0
                && (other.firstInvalidIndex < 0 || firstInvalidIndex <= other.firstInvalidIndex);
        EvaluationTally report = keepThis ? this : other;
        return new EvaluationTally(evaluations + other.evaluations, zeroLikelihood + other.zeroLikelihood,
                invalid + other.invalid, report.firstInvalidIndex, report.firstInvalidReason,
                report.firstInvalidParameters, retried + other.retried, failedAfterRetries + other.failedAfterRetries);
    }

    /**
     * Sum of this tally and a later one; the invalid report kept is the earliest in time (this
     * tally's, if it has one), since particle indices are renumbered between iterations.
     */
    public EvaluationTally followedBy(EvaluationTally later) {
        EvaluationTally report = firstInvalidIndex >= 0 ? this : later;
        return new EvaluationTally(evaluations + later.evaluations, zeroLikelihood + later.zeroLikelihood,
                invalid + later.invalid, report.firstInvalidIndex, report.firstInvalidReason,
                report.firstInvalidParameters, retried + later.retried, failedAfterRetries + later.failedAfterRetries);
    }

    public long evaluations() {
        return evaluations;
    }

    /** Evaluations that returned {@code -Infinity}: a valid zero likelihood. */
    public long zeroLikelihood() {
        return zeroLikelihood;
    }

    /** Evaluations that returned NaN or {@code +Infinity} or threw. */
    public long invalid() {
        return invalid;
    }

    /** Evaluations whose first call was invalid and that were retried (0 without retries). */
    public long retried() {
        return retried;
    }

    /** Retried evaluations that were still invalid after the last retry (counted in {@link #invalid()} too). */
    public long failedAfterRetries() {
        return failedAfterRetries;
    }

    /** Invalid evaluations as a fraction of all evaluations (0 when there were none). */
    public double invalidFraction() {
        return evaluations == 0 ? 0.0 : (double) invalid / evaluations;
    }

    /** Global index of the lowest-indexed particle with an invalid evaluation, or −1. */
    public long firstInvalidIndex() {
        return firstInvalidIndex;
    }

    /** What went wrong for that particle (exception text, "NaN", "+Infinity"), or null. */
    public String firstInvalidReason() {
        return firstInvalidReason;
    }

    /** The parameter values of that particle, or null. */
    public double[] firstInvalidParameters() {
        return firstInvalidParameters == null ? null : firstInvalidParameters.clone();
    }

    @Override
    public String toString() {
        String text = evaluations + " evaluations, " + zeroLikelihood + " zero likelihood, " + invalid + " invalid";
        if (retried > 0) {
            text += ", " + retried + " retried (" + failedAfterRetries + " still invalid)";
        }
        if (firstInvalidIndex >= 0) {
            text += " (first: particle " + firstInvalidIndex + " at " + Arrays.toString(firstInvalidParameters)
                    + ": " + firstInvalidReason + ")";
        }
        return text;
    }
}
