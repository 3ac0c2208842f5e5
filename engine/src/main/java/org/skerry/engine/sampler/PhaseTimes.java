package org.skerry.engine.sampler;

/**
 * Wall-clock seconds spent in each phase of one iteration. Timing is the only part of a run's
 * output that is not determined by the seed.
 *
 * @param evaluate    initial draws and their likelihood evaluations (iteration 0 only)
 * @param temperature gathering weights and choosing the next temperature
 * @param reweight    updating the weights
 * @param resample    resampling: offspring counts and expansion of the survivors
 * @param redistribute moving surplus copies between blocks to rebalance them (on Spark the one job
 *                     that expands the survivors, rebalances and sums their moments)
 * @param fit         moment sums and proposal fit
 * @param move        Metropolis–Hastings steps (where the likelihood calls happen)
 * @param checkpoint  writing the checkpoint, when one was written
 */
public record PhaseTimes(double evaluate, double temperature, double reweight, double resample,
        double redistribute, double fit, double move, double checkpoint) {

    /** No time in any phase. */
    public static final PhaseTimes ZERO = new PhaseTimes(0, 0, 0, 0, 0, 0, 0, 0);

    /** Sum of all phases. */
    public double total() {
        return evaluate + temperature + reweight + resample + redistribute + fit + move + checkpoint;
    }

    /** Phase by phase, these times plus {@code other}'s (for totals over iterations). */
    public PhaseTimes plus(PhaseTimes other) {
        return new PhaseTimes(evaluate + other.evaluate, temperature + other.temperature, reweight + other.reweight,
                resample + other.resample, redistribute + other.redistribute, fit + other.fit, move + other.move,
                checkpoint + other.checkpoint);
    }

    /** The same times with the checkpoint phase set to {@code seconds}. */
    public PhaseTimes withCheckpoint(double seconds) {
        return new PhaseTimes(evaluate, temperature, reweight, resample, redistribute, fit, move, seconds);
    }
}
