package org.skerry.engine.model.predictive;

import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Chooses M equally weighted posterior draws from weighted particles by systematic resampling
 * (Kitagawa 1996, "Monte Carlo filter and smoother for non-Gaussian nonlinear state space
 * models", J. Comput. Graph. Statist. 5(1), 1–25): points {@code (u + k)/M}, {@code k = 0..M−1},
 * with one uniform {@code u}, against the cumulative normalised weights summed in particle order.
 * Each particle is chosen {@code ⌊M·wᵢ⌋} or {@code ⌈M·wᵢ⌉} times, so the draws are unbiased
 * and vary less than multinomial ones. Deterministic: {@code u} comes from the stream
 * {@code (seed, PREDICTIVE, iteration 0, particle index 0, step 1)}.
 */
public final class PosteriorDraws {

    /** The step of the {@code PREDICTIVE} stream that holds the resampling uniform. */
    static final int RESAMPLING_STEP = 1;

    private PosteriorDraws() {
    }

    /**
     * The particle index of each of {@code draws} posterior draws, in increasing order.
     *
     * @param weights the particles' normalised weights, {@code weights[0 .. size)}: finite and
     *     {@code >= 0}, with a positive sum (divided out, so rounding in the normalisation does
     *     not matter)
     * @throws IllegalArgumentException if {@code size} or {@code draws} is below 1, the array is
     *     shorter than {@code size}, or a weight is negative or not finite, or all are 0
     */
    public static int[] choose(double[] weights, int size, int draws, long seed) {
        if (weights == null || size < 1 || weights.length < size) {
            throw new IllegalArgumentException("size must be in [1, weights.length], was " + size
                    + (weights == null ? " with weights null" : " with " + weights.length + " weights"));
        }
        if (draws < 1) {
            throw new IllegalArgumentException("draws must be >= 1, was " + draws);
        }
        double total = 0.0;
        for (int i = 0; i < size; i++) {
            double w = weights[i];
            if (!(w >= 0.0 && w < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("weights[" + i + "] must be finite and >= 0, was " + w);
            }
            total += w;
        }
        if (!(total > 0.0)) {
            throw new IllegalArgumentException("weights must not all be 0");
        }
        double u = new RandomStream(seed, StreamPurpose.PREDICTIVE, 0, 0, RESAMPLING_STEP).nextDouble();
        int[] chosen = new int[draws];
        int particle = 0;
        double cumulative = weights[0] / total;
        for (int k = 0; k < draws; k++) {
            double point = (u + k) / draws;
            // The last particle with weight takes any point that rounding leaves beyond the sum.
            while (cumulative <= point && particle < size - 1) {
                particle++;
                cumulative += weights[particle] / total;
            }
            chosen[k] = particle;
        }
        return lastPositive(chosen, weights, size);
    }

    /** Moves draws that rounding put past the last positive weight back onto it. */
    private static int[] lastPositive(int[] chosen, double[] weights, int size) {
        int last = size - 1;
        while (weights[last] == 0.0) {
            last--;
        }
        for (int k = 0; k < chosen.length; k++) {
            if (chosen[k] > last) {
                chosen[k] = last;
            }
        }
        return chosen;
    }
}
