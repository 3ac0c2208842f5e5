package org.skerry.engine.sampler;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.population.EvaluationTally;

/**
 * The run stopped because more than {@link SamplerSettings#maxInvalidFraction()} of one
 * iteration's likelihood evaluations were invalid (NaN, {@code +Infinity} or an exception). A
 * model that fails over much of where the particles are would otherwise leave a posterior that is
 * silently conditional on where it works. The message names the iteration, the count, the
 * fraction and the limit, and the lowest-indexed failing particle with its parameter values and
 * reason.
 */
public final class InvalidEvaluationsException extends SamplingFailedException {

    private static final long serialVersionUID = 1L;

    private final long invalid;
    private final long evaluations;
    private final double limit;
    private final long firstInvalidIndex;
    private final String firstInvalidReason;
    private final Map<String, Double> firstInvalidParameters;

    private InvalidEvaluationsException(int iteration, EvaluationTally tally, double limit,
            Map<String, Double> parameters) {
        super(iteration, explain(tally.invalid(), tally.evaluations(), limit, "maxInvalidFraction",
                tally.firstInvalidIndex(), parameters, tally.firstInvalidReason()));
        this.invalid = tally.invalid();
        this.evaluations = tally.evaluations();
        this.limit = limit;
        this.firstInvalidIndex = tally.firstInvalidIndex();
        this.firstInvalidReason = tally.firstInvalidReason();
        this.firstInvalidParameters = Collections.unmodifiableMap(parameters);
    }

    /**
     * Throws if {@code tally}, the evaluations of iteration {@code iteration}, has more than the
     * settings' fraction of invalid evaluations.
     */
    static void check(SamplerSettings settings, int iteration, EvaluationTally tally, ParameterSpace space) {
        double limit = settings.evaluation().maxInvalidFraction();
        if (tally.invalid() == 0 || !(tally.invalidFraction() > limit)) {
            return;
        }
        Map<String, Double> parameters = new LinkedHashMap<>();
        double[] values = tally.firstInvalidParameters();
        for (int k = 0; values != null && k < values.length; k++) {
            parameters.put(k < space.dimension() ? space.name(k) : "x" + k, values[k]);
        }
        throw new InvalidEvaluationsException(iteration, tally, limit, parameters);
    }

    /**
     * The message without its iteration, naming the limit as {@code limitSetting} (a program
     * names its own key for it).
     */
    public String explain(String limitSetting) {
        return explain(invalid, evaluations, limit, limitSetting, firstInvalidIndex, firstInvalidParameters,
                firstInvalidReason);
    }

    private static String explain(long invalid, long evaluations, double limit, String limitSetting, long first,
            Map<String, Double> parameters, String reason) {
        StringBuilder at = new StringBuilder();
        parameters.forEach((name, value) -> at.append(at.length() == 0 ? "" : ", ").append(name).append('=')
                .append(value));
        return String.format(Locale.ROOT,
                "%d of %d likelihood evaluations were invalid (%.1f %%), more than the limit of %s (%s); "
                        + "the first, particle %d at %s: %s",
                invalid, evaluations, 100.0 * invalid / evaluations, limit, limitSetting, first, at, reason);
    }

    /** Invalid evaluations in the iteration. */
    public long invalid() {
        return invalid;
    }

    /** All evaluations in the iteration. */
    public long evaluations() {
        return evaluations;
    }

    /** {@link #invalid()} / {@link #evaluations()}. */
    public double fraction() {
        return (double) invalid / evaluations;
    }

    /** The limit that was exceeded ({@link SamplerSettings#maxInvalidFraction()}). */
    public double limit() {
        return limit;
    }

    /** The lowest global index of a particle whose evaluation was invalid. */
    public long firstInvalidIndex() {
        return firstInvalidIndex;
    }

    /** Why that evaluation was invalid. */
    public String firstInvalidReason() {
        return firstInvalidReason;
    }

    /** That particle's parameter values, by name, in parameter order. */
    public Map<String, Double> firstInvalidParameters() {
        return firstInvalidParameters;
    }
}
