package org.skerry.engine.model.builtin;

import org.apache.commons.math3.special.Gamma;
import org.skerry.engine.random.RandomStream;

/**
 * One {@code Poisson(λ)} count from one uniform, by inversion searching outward from the mode,
 * alternately up and down (the modal search of Kemp 1986, as {@code BinomialDraw} does for the
 * binomial; for the Poisson: Kemp &amp; Kemp 1991, "Poisson random variate generation", Appl.
 * Statist. 40(1)): about √λ terms, the mode's probability in log space so a large λ does not
 * underflow. Exact up to the rounding of the probabilities; pure Java arithmetic, so the same
 * count on every JVM.
 */
public final class PoissonDraw {

    private PoissonDraw() {
    }

    /**
     * @throws IllegalArgumentException if λ is negative, NaN or above 10⁹
     */
    public static long draw(double mean, RandomStream random) {
        if (!(mean >= 0) || mean > 1e9) {
            throw new IllegalArgumentException("Poisson mean must be in [0, 1e9], was " + mean);
        }
        double u = random.nextDouble();
        if (mean == 0) {
            return 0;
        }
        long mode = (long) StrictMath.floor(mean);
        double pmfMode = StrictMath.exp(-mean + mode * StrictMath.log(mean) - Gamma.logGamma(mode + 1.0));
        u -= pmfMode;
        if (u < 0.0) {
            return mode;
        }
        long up = mode;
        long down = mode;
        double pmfUp = pmfMode;
        double pmfDown = pmfMode;
        while (pmfUp > 0 || down > 0) {
            if (pmfUp > 0) {
                // P(k+1)/P(k) = λ/(k + 1)
                pmfUp *= mean / (up + 1.0);
                up++;
                u -= pmfUp;
                if (u < 0.0) {
                    return up;
                }
            }
            if (down > 0) {
                // P(k−1)/P(k) = k/λ
                pmfDown *= down / mean;
                down--;
                u -= pmfDown;
                if (u < 0.0) {
                    return down;
                }
            }
        }
        // Rounding left a sliver of mass unassigned: give it to the mode.
        return mode;
    }
}
