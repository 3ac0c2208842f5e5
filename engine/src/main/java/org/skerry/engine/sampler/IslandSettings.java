package org.skerry.engine.sampler;

/**
 * Island mode: K islands that resample on their own, and when all of them interact (a global
 * resampling). Its own setting, never derived from the cluster size, so an island run keeps its
 * answer across executor counts.
 *
 * @param count                number of islands K, or 0 for global resampling
 * @param interactionEvery     resample globally every this many iterations; 0 never
 * @param interactionThreshold resample globally when the ESS of the island weights falls below
 *                             this fraction of K, in [0, 1]; 0 never
 */
public record IslandSettings(int count, int interactionEvery, double interactionThreshold) {

    /** Global resampling: no islands. */
    public static final IslandSettings NONE = new IslandSettings(0, 0, 0);

    public IslandSettings {
        if (count < 0) {
            throw new IllegalArgumentException("islands must be >= 0, was " + count);
        }
        if (interactionEvery < 0) {
            throw new IllegalArgumentException("islandInteractionEvery must be >= 0, was " + interactionEvery);
        }
        if (!(interactionThreshold >= 0 && interactionThreshold <= 1)) {
            throw new IllegalArgumentException("islandInteractionThreshold must be in [0, 1], was "
                    + interactionThreshold);
        }
    }
}
