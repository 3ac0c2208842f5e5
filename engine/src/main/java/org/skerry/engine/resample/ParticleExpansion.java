package org.skerry.engine.resample;

import org.skerry.engine.particle.ParticleBlock;

/**
 * Replaces a block's particles by their offspring, on the block side: ancestor {@code i} is
 * copied {@code offspring[i]} times, in ancestor order then copy number, which is the canonical
 * order of the new population, so the copies get the consecutive global indices
 * {@code firstNewIndex, firstNewIndex + 1, ...}. Log-weights restart at 0 (equal weights after
 * resampling, as in Gordon, Salmond &amp; Smith 1993, IEE Proc. F 140(2)); Eve indices are
 * inherited.
 */
public final class ParticleExpansion {

    private ParticleExpansion() {
    }

    /**
     * A new block holding the offspring of {@code source}'s particles.
     *
     * @throws IllegalArgumentException if {@code offspring} is shorter than the block, a count is
     *     negative, or the total exceeds {@link Integer#MAX_VALUE}, or {@code firstNewIndex} is negative
     */
    public static ParticleBlock expand(ParticleBlock source, int[] offspring, long firstNewIndex) {
        int size = source.size();
        if (offspring.length < size) {
            throw new IllegalArgumentException("offspring must hold " + size + " counts, has " + offspring.length);
        }
        if (firstNewIndex < 0) {
            throw new IllegalArgumentException("firstNewIndex must be >= 0, was " + firstNewIndex);
        }
        long total = 0;
        for (int i = 0; i < size; i++) {
            if (offspring[i] < 0) {
                throw new IllegalArgumentException("offspring[" + i + "] must be >= 0, was " + offspring[i]);
            }
            total += offspring[i];
        }
        if (total > Integer.MAX_VALUE) {
            throw new IllegalArgumentException("total offspring must be <= 2^31 - 1, was " + total);
        }
        int d = source.dimension();
        ParticleBlock result = ParticleBlock.shapedLike(source, (int) total);
        result.resize((int) total);
        double[] values = source.values();
        double[] logPrior = source.logPrior();
        double[] logLikelihood = source.logLikelihood();
        long[] eve = source.eve();
        double[] newValues = result.values();
        double[] newLogPrior = result.logPrior();
        double[] newLogLikelihood = result.logLikelihood();
        long[] newIndex = result.index();
        long[] newEve = result.eve();
        int w = source.auxiliaryWidth();
        double[] auxiliary = source.auxiliary();
        double[] newAuxiliary = result.auxiliary();
        int slot = 0;
        for (int i = 0; i < size; i++) {
            for (int c = offspring[i]; c > 0; c--) {
                System.arraycopy(values, i * d, newValues, slot * d, d);
                newLogPrior[slot] = logPrior[i];
                newLogLikelihood[slot] = logLikelihood[i];
                newIndex[slot] = firstNewIndex + slot;
                newEve[slot] = eve[i];
                if (w > 0) {
                    System.arraycopy(auxiliary, i * w, newAuxiliary, slot * w, w);
                }
                slot++;
            }
        }
        // New arrays are zero-filled, which is the wanted log-weight 0.
        return result;
    }

    /** Number of particles among the first {@code size} with at least one offspring. */
    public static int distinctAncestors(int[] offspring, int size) {
        if (size < 0 || size > offspring.length) {
            throw new IllegalArgumentException("size must be in [0, " + offspring.length + "], was " + size);
        }
        int count = 0;
        for (int i = 0; i < size; i++) {
            if (offspring[i] > 0) {
                count++;
            }
        }
        return count;
    }
}
