package org.skerry.engine.abc;

import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The settings of an ABC-SMC run. Immutable; the constructor checks every value and names the one
 * it refuses.
 *
 * @param finalTolerance  the tolerance to reach, ε* &gt; 0 (in the units of the weighted distance)
 * @param schedule        fixed tolerances, strictly decreasing, ending at ε*; empty to choose them adaptively
 * @param toleranceRule   adaptive tolerances: by the ESS or by the share of simulations within tolerance
 * @param essFactor       adaptive tolerances, ESS rule: each is chosen so that the ESS falls to this fraction of the last, in (0, 1)
 * @param shareFactor     adaptive tolerances, share rule: each keeps this fraction of the simulations within the last, in (0, 1)
 * @param simulations     M, simulations per particle and evaluation, at least 1
 * @param kernel          uniform or Gaussian
 * @param weights         fixed distance weights by summary name, one for every summary; null to scale
 *                        each summary by the inverse of its median absolute deviation, re-estimated
 *                        every iteration
 * @param fixedSteps      MH steps per iteration, or 0 to adapt them from a one-step pilot
 * @param stayProbability adaptive steps: the chance a particle never moves that the count aims at
 * @param maxSteps        adaptive steps: the cap
 * @param acceptanceFloor stop once an iteration's move acceptance falls below this, in [0, 1); 0 never
 * @param simulationBudget stop once this many simulations are spent; 0 for no budget
 * @param observed        the observed summaries by name, or null to take the model's own
 */
public record AbcSettings(double finalTolerance, double[] schedule, ToleranceRule toleranceRule, double essFactor,
        double shareFactor, int simulations, AbcKernel kernel,
        Map<String, Double> weights, int fixedSteps, double stayProbability, int maxSteps, double acceptanceFloor,
        long simulationBudget, Map<String, Double> observed) {

    /** Defaults besides the final tolerance: adaptive by the ESS, factor 0.5 (share factor 0.5 unused), M = 1, uniform kernel, MAD scales,
     * steps from a pilot (stay probability 0.05, at most 10), no floor, no budget. */
    public static AbcSettings of(double finalTolerance) {
        return new AbcSettings(finalTolerance, new double[0], ToleranceRule.ESS, 0.5, 0.5, 1, AbcKernel.UNIFORM, null, 0, 0.05, 10, 0, 0, null);
    }

    public AbcSettings {
        if (!(finalTolerance > 0) || finalTolerance == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("final tolerance must be positive and finite, was " + finalTolerance);
        }
        schedule = schedule == null ? new double[0] : schedule.clone();
        for (int k = 0; k < schedule.length; k++) {
            if (!(schedule[k] > 0) || !Double.isFinite(schedule[k]) || (k > 0 && !(schedule[k] < schedule[k - 1]))) {
                throw new IllegalArgumentException("tolerance schedule must be positive, finite and strictly decreasing, was "
                        + Arrays.toString(schedule));
            }
        }
        if (schedule.length > 0 && schedule[schedule.length - 1] != finalTolerance) {
            throw new IllegalArgumentException("tolerance schedule must end at the final tolerance " + finalTolerance
                    + ", ended at " + schedule[schedule.length - 1]);
        }
        if (toleranceRule == null) {
            throw new IllegalArgumentException("tolerance rule must not be null");
        }
        if (!(essFactor > 0 && essFactor < 1)) {
            throw new IllegalArgumentException("ESS factor must be in (0, 1), was " + essFactor);
        }
        if (!(shareFactor > 0 && shareFactor < 1)) {
            throw new IllegalArgumentException("share factor must be in (0, 1), was " + shareFactor);
        }
        if (simulations < 1 || simulations > 10_000) {
            throw new IllegalArgumentException("simulations per particle must be in [1, 10000], was " + simulations);
        }
        if (kernel == null) {
            throw new IllegalArgumentException("kernel must not be null");
        }
        if (weights != null) {
            weights = Collections.unmodifiableMap(new LinkedHashMap<>(weights));
            for (Map.Entry<String, Double> w : weights.entrySet()) {
                if (w.getValue() == null || !(w.getValue() > 0) || !Double.isFinite(w.getValue())) {
                    throw new IllegalArgumentException("the distance weight of summary '" + w.getKey()
                            + "' must be positive and finite, was " + w.getValue());
                }
            }
        }
        if (fixedSteps < 0) {
            throw new IllegalArgumentException("steps must be >= 1, or 0 to adapt them, was " + fixedSteps);
        }
        if (!(stayProbability > 0 && stayProbability < 1)) {
            throw new IllegalArgumentException("stay probability must be in (0, 1), was " + stayProbability);
        }
        if (maxSteps < 1) {
            throw new IllegalArgumentException("max steps must be >= 1, was " + maxSteps);
        }
        if (!(acceptanceFloor >= 0 && acceptanceFloor < 1)) {
            throw new IllegalArgumentException("acceptance floor must be in [0, 1), was " + acceptanceFloor);
        }
        if (simulationBudget < 0) {
            throw new IllegalArgumentException("simulation budget must be >= 0 (0: none), was " + simulationBudget);
        }
        if (observed != null) {
            observed = Collections.unmodifiableMap(new LinkedHashMap<>(observed));
            for (Map.Entry<String, Double> y : observed.entrySet()) {
                if (y.getValue() == null || !Double.isFinite(y.getValue())) {
                    throw new IllegalArgumentException("observed summary '" + y.getKey() + "' must be finite, was "
                            + y.getValue());
                }
            }
        }
    }

    @Override
    public double[] schedule() {
        return schedule.clone();
    }

    /** These settings with the observed summaries {@code values}. */
    public AbcSettings withObserved(Map<String, Double> values) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, kernel, weights, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, values);
    }

    /** These settings with fixed distance weights (null: MAD scales). */
    public AbcSettings withWeights(Map<String, Double> values) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, kernel, values, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with a fixed tolerance schedule ending at its last entry. */
    public AbcSettings withSchedule(double[] values) {
        return new AbcSettings(values[values.length - 1], values, toleranceRule, essFactor, shareFactor, simulations, kernel, weights, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with adaptive tolerances by {@code rule}, keeping {@code factor} of the ESS or share. */
    public AbcSettings withToleranceRule(ToleranceRule rule, double factor) {
        return new AbcSettings(finalTolerance, schedule, rule, rule == ToleranceRule.ESS ? factor : essFactor,
                rule == ToleranceRule.SHARE ? factor : shareFactor, simulations, kernel, weights, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with M simulations per particle. */
    public AbcSettings withSimulations(int value) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, value, kernel, weights, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with the kernel {@code value}. */
    public AbcSettings withKernel(AbcKernel value) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, value, weights, fixedSteps,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with {@code value} MH steps per iteration (0: adaptive). */
    public AbcSettings withSteps(int value) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, kernel, weights, value,
                stayProbability, maxSteps, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with adaptive MH steps capped at {@code value}. */
    public AbcSettings withMaxSteps(int value) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, kernel,
                weights, fixedSteps, stayProbability, value, acceptanceFloor, simulationBudget, observed);
    }

    /** These settings with the stopping rules {@code floor} and {@code budget}. */
    public AbcSettings withStops(double floor, long budget) {
        return new AbcSettings(finalTolerance, schedule, toleranceRule, essFactor, shareFactor, simulations, kernel, weights, fixedSteps,
                stayProbability, maxSteps, floor, budget, observed);
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof AbcSettings o && toString().equals(o.toString());
    }

    @Override
    public int hashCode() {
        return toString().hashCode();
    }

    @Override
    public String toString() {
        return "ABC(final tolerance " + finalTolerance + ", schedule " + Arrays.toString(schedule) + ", rule " + toleranceRule
                + ", ESS factor " + essFactor + ", share factor " + shareFactor + ", M " + simulations + ", " + kernel + ", weights " + weights + ", steps "
                + fixedSteps + ", stay " + stayProbability + ", max steps " + maxSteps + ", floor " + acceptanceFloor
                + ", budget " + simulationBudget + ", observed " + observed + ")";
    }
}
