package org.skerry.engine.abc;

import java.util.Arrays;

/**
 * Driver side: the next tolerance of adaptive ABC-SMC, the one at which the ESS of the reweighted
 * particles falls to a set fraction of the current ESS (Del Moral, Doucet &amp; Jasra 2012,
 * Statistics and Computing 22, §3.2). With the uniform kernel the ESS is a step function of ε
 * that changes only at the particles' distances: every distinct distance below the current
 * tolerance is tried, in one sweep over the sorted distances, and the smallest whose ESS reaches
 * the target is taken; tied distances enter together, so ties cannot hold the tolerance where it
 * is (when none reaches the target, the largest distance below the current tolerance is taken,
 * the smallest step down there is). With the Gaussian kernel the ESS is continuous in ε and found
 * by bisection on log ε.
 */
public final class ToleranceChoice {

    private static final int BISECTIONS = 200;

    private ToleranceChoice() {
    }

    /**
     * The next tolerance, or NaN when no distance lies below {@code current} (the uniform kernel
     * cannot step down without losing every particle).
     *
     * @param logWeight   every particle's current log-weight
     * @param oldKernel   every particle's current log mean kernel (−∞: zero weight)
     * @param distances   M distances per particle under the new weights (ignored for particles of zero weight)
     * @param current     the current tolerance (+∞ at the start)
     * @param factor      the fraction of the current ESS to keep, in (0, 1)
     */
    public static double next(double[] logWeight, double[] oldKernel, double[] distances, int simulations,
            double current, double factor, AbcKernel kernel) {
        int n = logWeight.length;
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (oldKernel[i] > Double.NEGATIVE_INFINITY) {
                max = Math.max(max, logWeight[i]);
            }
        }
        // a[i]: the particle's weight over its current mean kernel, so its new weight is a[i]·(new mean kernel).
        double[] a = new double[n];
        double first = 0.0;
        double second = 0.0;
        for (int i = 0; i < n; i++) {
            if (oldKernel[i] > Double.NEGATIVE_INFINITY && logWeight[i] > Double.NEGATIVE_INFINITY) {
                a[i] = StrictMath.exp(logWeight[i] - max - oldKernel[i]) / simulations;
                double w = StrictMath.exp(logWeight[i] - max);
                first += w;
                second += w * w;
            }
        }
        if (!(second > 0)) {
            return Double.NaN;
        }
        double target = factor * first * first / second;
        return kernel == AbcKernel.UNIFORM ? uniform(a, distances, simulations, current, target)
                : gaussian(a, distances, simulations, current, target);
    }

    private static double uniform(double[] a, double[] distances, int simulations, double current, double target) {
        int n = a.length;
        int count = 0;
        for (int i = 0; i < n; i++) {
            if (a[i] > 0) {
                for (int m = 0; m < simulations; m++) {
                    if (distances[i * simulations + m] < current) {
                        count++;
                    }
                }
            }
        }
        if (count == 0) {
            return Double.NaN;
        }
        // Sort (distance, simulation position) pairs: the order, and so every rounding, is canonical.
        long[] order = new long[count];
        int at = 0;
        for (int i = 0; i < n; i++) {
            if (a[i] > 0) {
                for (int m = 0; m < simulations; m++) {
                    int j = i * simulations + m;
                    if (distances[j] < current) {
                        order[at++] = j;
                    }
                }
            }
        }
        Long[] boxed = new Long[count];
        for (int k = 0; k < count; k++) {
            boxed[k] = order[k];
        }
        Arrays.sort(boxed, (x, y) -> {
            int c = Double.compare(distances[(int) (long) x], distances[(int) (long) y]);
            return c != 0 ? c : Long.compare(x, y);
        });
        int[] within = new int[n];
        double first = 0.0;
        double second = 0.0;
        double largest = Double.NaN;
        for (int k = 0; k < count; k++) {
            int j = (int) (long) boxed[k];
            int i = j / simulations;
            within[i]++;
            first += a[i];
            second += a[i] * a[i] * (2.0 * within[i] - 1.0);
            boolean lastOfTie = k == count - 1 || distances[(int) (long) boxed[k + 1]] != distances[j];
            if (lastOfTie) {
                largest = distances[j];
                if (first * first / second >= target) {
                    return distances[j];
                }
            }
        }
        return largest;
    }

    /**
     * The next tolerance by the share rule: the smallest distance at which at least {@code factor}
     * of the living particles' simulations within {@code current} stay within, counted without
     * weights. Only distances strictly below {@code current} are candidates, and tied distances
     * enter together, so ties cannot hold the tolerance still: when a tie overshoots the share, the
     * tolerance still falls to the tied distance. NaN when no distance lies below {@code current}.
     *
     * @param alive     whether each particle lives (weight and kernel above zero); the dead's simulations are not counted
     * @param distances M distances per particle under the new weights
     */
    public static double byShare(boolean[] alive, double[] distances, int simulations, double current,
            double factor) {
        int n = alive.length;
        int within = 0;
        int below = 0;
        for (int i = 0; i < n; i++) {
            if (alive[i]) {
                for (int m = 0; m < simulations; m++) {
                    double d = distances[i * simulations + m];
                    if (d <= current) {
                        within++;
                    }
                    if (d < current) {
                        below++;
                    }
                }
            }
        }
        if (below == 0) {
            return Double.NaN;
        }
        double[] sorted = new double[below];
        int at = 0;
        for (int i = 0; i < n; i++) {
            if (alive[i]) {
                for (int m = 0; m < simulations; m++) {
                    double d = distances[i * simulations + m];
                    if (d < current) {
                        sorted[at++] = d;
                    }
                }
            }
        }
        Arrays.sort(sorted);
        double target = factor * within;
        for (int k = 0; k < below; k++) {
            boolean lastOfTie = k == below - 1 || sorted[k + 1] != sorted[k];
            if (lastOfTie && k + 1 >= target) {
                return sorted[k];
            }
        }
        return sorted[below - 1];
    }

    private static double gaussian(double[] a, double[] distances, int simulations, double current, double target) {
        double smallest = Double.POSITIVE_INFINITY;
        double largest = 0.0;
        for (int i = 0; i < a.length; i++) {
            if (a[i] > 0) {
                for (int m = 0; m < simulations; m++) {
                    double d = distances[i * simulations + m];
                    if (d > 0) {
                        smallest = Math.min(smallest, d);
                    }
                    largest = Math.max(largest, d);
                }
            }
        }
        if (!(largest > 0)) {
            return Double.NaN;
        }
        double high = StrictMath.log(Math.min(current, 1e3 * largest));
        double low = StrictMath.log(1e-3 * smallest);
        if (gaussianEss(a, distances, simulations, StrictMath.exp(low)) >= target) {
            return StrictMath.exp(low);
        }
        for (int k = 0; k < BISECTIONS && high - low > 1e-12; k++) {
            double middle = 0.5 * (low + high);
            if (gaussianEss(a, distances, simulations, StrictMath.exp(middle)) >= target) {
                high = middle;
            } else {
                low = middle;
            }
        }
        return StrictMath.exp(high);
    }

    private static double gaussianEss(double[] a, double[] distances, int simulations, double tolerance) {
        double first = 0.0;
        double second = 0.0;
        for (int i = 0; i < a.length; i++) {
            if (a[i] > 0) {
                double kernel = 0.0;
                for (int m = 0; m < simulations; m++) {
                    kernel += StrictMath.exp(AbcKernel.GAUSSIAN.logKernel(distances[i * simulations + m], tolerance));
                }
                double w = a[i] * kernel;
                first += w;
                second += w * w;
            }
        }
        return second > 0 ? first * first / second : 0.0;
    }
}
