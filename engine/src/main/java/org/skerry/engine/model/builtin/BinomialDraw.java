package org.skerry.engine.model.builtin;

import org.apache.commons.math3.util.CombinatoricsUtils;
import org.skerry.engine.random.RandomStream;

/**
 * One {@code Binomial(n, p)} count from one uniform, by inversion searching outward from the
 * mode, alternately up and down (the chop-down search of Kemp 1986, "A modal method for
 * generating binomial variables", Commun. Statist. Theory Meth. 15(3), 805–813): the expected
 * number of terms is of order {@code √(np(1−p))}, and the mode's probability is computed in log
 * space so that large n does not underflow. Exact up to the rounding of the probabilities.
 */
final class BinomialDraw {

    private BinomialDraw() {
    }

    /**
     * @throws IllegalArgumentException if {@code n < 0} or p is not in [0, 1]
     */
    static int draw(int n, double p, RandomStream random) {
        if (n < 0) {
            throw new IllegalArgumentException("n must be >= 0, was " + n);
        }
        if (!(p >= 0.0 && p <= 1.0)) {
            throw new IllegalArgumentException("p must be in [0, 1], was " + p);
        }
        double u = random.nextDouble();
        if (n == 0 || p == 0.0) {
            return 0;
        }
        if (p == 1.0) {
            return n;
        }
        int mode = (int) StrictMath.min(n, StrictMath.floor((n + 1) * p));
        double logMode = CombinatoricsUtils.binomialCoefficientLog(n, mode) + mode * StrictMath.log(p)
                + (n - mode) * StrictMath.log1p(-p);
        double pmfMode = StrictMath.exp(logMode);
        u -= pmfMode;
        if (u < 0.0) {
            return mode;
        }
        double odds = p / (1.0 - p);
        int up = mode;
        int down = mode;
        double pmfUp = pmfMode;
        double pmfDown = pmfMode;
        while (up < n || down > 0) {
            if (up < n) {
                // P(k+1)/P(k) = (n − k)/(k + 1) · p/(1 − p)
                pmfUp *= (n - up) / (up + 1.0) * odds;
                up++;
                u -= pmfUp;
                if (u < 0.0) {
                    return up;
                }
            }
            if (down > 0) {
                pmfDown *= down / ((n - down + 1.0) * odds);
                down--;
                u -= pmfDown;
                if (u < 0.0) {
                    return down;
                }
            }
        }
        // Rounding left a sliver of mass (of order n·ε) unassigned: give it to the mode.
        return mode;
    }
}
