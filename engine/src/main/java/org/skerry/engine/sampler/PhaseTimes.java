package org.skerry.engine.sampler;

/**
 * Wall-clock seconds spent in each phase of one iteration. Timing is the only part of a run's
 * output that is not determined by the seed.
 *
 * @param evaluate    initial draws and their likelihood evaluations (iteration 0 only)
 * @param temperature gathering weights and choosing the next temperature
 * @param reweight    updating the weights
 * @param resample    resampling and rebalancing
 * @param fit         moment sums and proposal fit
 * @param move        Metropolis–Hastings steps (where the likelihood calls happen)
 */
public record PhaseTimes(double evaluate, double temperature, double reweight, double resample, double fit,
        double move) {

    /** Sum of all phases. */
    public double total() {
        return evaluate + temperature + reweight + resample + fit + move;
    }
}
