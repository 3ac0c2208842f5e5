package org.skerry.engine.sampler;

import java.util.List;

/**
 * How many iterations' adaptive Metropolis–Hastings step count reached the cap
 * ({@code sampler.moves.max-steps}). At the cap the stay rule is not met: more particles than the
 * chosen stay probability were never moved in that iteration, so the population may not have
 * mixed and both the posterior and the evidence can carry the prior's or the last target's
 * shape. A run with fixed steps never reports any. An ABC run counts against its own cap
 * ({@code sampler.abc.max-steps}), and has no evidence to be off.
 *
 * @param iterationsAtCap tempering iterations whose step count equals the cap
 * @param iterations      tempering iterations of the run (the initial draw not counted)
 * @param maxSteps        the cap; 0 when the steps were fixed
 * @param abc             whether the run is an ABC run (its cap is sampler.abc.max-steps)
 */
public record StepCapReport(int iterationsAtCap, int iterations, int maxSteps, boolean abc) {

    /** A likelihood run's report. */
    public StepCapReport(int iterationsAtCap, int iterations, int maxSteps) {
        this(iterationsAtCap, iterations, maxSteps, false);
    }

    /** Counts the iterations of {@code records} at the cap of {@code settings}. */
    public static StepCapReport of(List<IterationRecord> records, SamplerSettings settings) {
        return count(records, settings.moves().fixedSteps() == 0, settings.moves().maxSteps(), false);
    }

    /** Counts the iterations of an ABC run's {@code records} at the cap of its ABC settings. */
    public static StepCapReport ofAbc(List<IterationRecord> records, org.skerry.engine.abc.AbcSettings settings) {
        return count(records, settings.fixedSteps() == 0, settings.maxSteps(), true);
    }

    private static StepCapReport count(List<IterationRecord> records, boolean adaptive, int cap, boolean abc) {
        int iterations = 0;
        int atCap = 0;
        for (IterationRecord record : records) {
            if (record.iteration() == 0) {
                continue;
            }
            iterations++;
            if (adaptive && record.mhSteps() >= cap) {
                atCap++;
            }
        }
        return new StepCapReport(atCap, iterations, adaptive ? cap : 0, abc);
    }

    /** A line for the user when any iteration reached the cap, naming the setting to change; null otherwise. */
    public String warning() {
        if (iterationsAtCap == 0) {
            return null;
        }
        if (abc) {
            return iterationsAtCap + " of " + iterations + " iterations made the maximum of " + maxSteps
                    + " Metropolis-Hastings steps: there the ABC moves accepted too little for most particles to move,"
                    + " and the posterior may be off. Raise sampler.abc.max-steps (cost grows with it), stop at a"
                    + " larger tolerance (sampler.abc.acceptance-floor), or use more particles; see \"Reading the"
                    + " diagnostics\" in the README";
        }
        return iterationsAtCap + " of " + iterations + " iterations made the maximum of " + maxSteps
                + " Metropolis-Hastings steps: there the moves accepted too little for most particles to move,"
                + " and the posterior and evidence may be off. Raise sampler.moves.max-steps (cost grows with it),"
                + " use more particles, or reparameterise the model; see \"Reading the diagnostics\" in the README";
    }
}
