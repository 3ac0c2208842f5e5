package org.skerry.engine.target;

import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.TemperingInputs;

/**
 * A sequence of targets from the first (the prior, or what the initial weights target) to the
 * posterior, walked by the sampler loop (Del Moral, Doucet &amp; Jasra 2006, JRSS-B 68(3)). Each
 * step chooses the next target and brings every particle's weight to it; the moves then keep
 * the new target invariant. Likelihood tempering and data tempering are two implementations; a
 * tolerance sequence for approximate Bayesian computation fits the same steps. Runs on the
 * driver; implementations are immutable.
 */
public interface TargetSequence {

    /** The target the initial draw's weights are for. */
    Target first();

    /** The target a checkpoint saved by its {@link Target#progress()}. */
    Target at(double progress);

    /**
     * What a checkpoint must keep of {@code target} besides its progress, or null when the
     * progress is enough ({@link #at}).
     */
    default double[] state(Target target) {
        return null;
    }

    /** The target a checkpoint saved by its progress and {@link #state(Target)}. */
    default Target restore(double progress, double[] state) {
        return at(progress);
    }

    /** Whether {@code target} is the last one, the posterior. */
    default boolean isLast(Target target) {
        return target.progress() >= 1.0;
    }

    /**
     * Chooses the target after {@code current} and brings every particle's weight to it: its log
     * incremental weight is added to the blocks' log-weights (at once, or held in {@code population}
     * for its next step) and returned in the order of {@code inputs}.
     *
     * @param inputs    every particle's log-weight and log-likelihood under {@code current}
     * @param logTotal  log of the total of the current weights
     * @param iteration the iteration this step starts, which keys any random stream it uses
     */
    Step advance(Target current, TemperingInputs inputs, double logTotal, Population population, int iteration);

    /** A short description for logs and messages, e.g. {@code likelihood tempering}. */
    String description();

    /**
     * One step along the sequence: the next target, every particle's log incremental weight in
     * the order of the inputs, the likelihood evaluations the step made (none for tempering), and
     * for ABC the share of the kept simulations within the new tolerance (NaN otherwise).
     */
    record Step(Target next, double[] logIncrement, EvaluationTally evaluations, double shareWithin) {

        /** A step of a sequence without tolerances. */
        public Step(Target next, double[] logIncrement, EvaluationTally evaluations) {
            this(next, logIncrement, evaluations, Double.NaN);
        }
    }
}
