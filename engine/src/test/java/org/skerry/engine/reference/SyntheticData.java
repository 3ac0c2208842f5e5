package org.skerry.engine.reference;

import java.util.SplittableRandom;

/**
 * Small seeded data sets for the reference models' tests, drawn with {@link SplittableRandom} so
 * that they do not depend on the engine's own generator.
 */
public final class SyntheticData {

    private SyntheticData() {
    }

    /** n rows of independent {@code N(mean[k], sigma²)} values. */
    public static double[][] normalRows(long seed, int n, double[] mean, double sigma) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] rows = new double[n][mean.length];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < mean.length; k++) {
                rows[i][k] = mean[k] + sigma * random.nextGaussian();
            }
        }
        return rows;
    }

    /** One column of a matrix, as an array. */
    public static double[] column(double[][] rows, int k) {
        double[] out = new double[rows.length];
        for (int i = 0; i < rows.length; i++) {
            out[i] = rows[i][k];
        }
        return out;
    }

    /**
     * An n × p design matrix with entries uniform on [lower, upper); when {@code intercept} the
     * first column is all ones and the remaining p − 1 are random.
     */
    public static double[][] design(long seed, int n, int p, double lower, double upper, boolean intercept) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] x = new double[n][p];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < p; j++) {
                x[i][j] = intercept && j == 0 ? 1.0 : random.nextDouble(lower, upper);
            }
        }
        return x;
    }

    /** Responses {@code y = Xw + N(0, sigma²)}. */
    public static double[] regressionResponse(long seed, double[][] x, double[] w, double sigma) {
        SplittableRandom random = new SplittableRandom(seed);
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            double mean = 0.0;
            for (int j = 0; j < w.length; j++) {
                mean += x[i][j] * w[j];
            }
            y[i] = mean + sigma * random.nextGaussian();
        }
        return y;
    }

    /** A Binomial(n, p) count, as the number of n uniforms below p. */
    public static int binomial(long seed, int n, double p) {
        SplittableRandom random = new SplittableRandom(seed);
        int k = 0;
        for (int i = 0; i < n; i++) {
            if (random.nextDouble() < p) {
                k++;
            }
        }
        return k;
    }

    /** {@code count} points uniform on the box [lower, upper]^d. */
    public static double[][] uniformPoints(long seed, int count, int d, double lower, double upper) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] points = new double[count][d];
        for (int i = 0; i < count; i++) {
            for (int k = 0; k < d; k++) {
                points[i][k] = random.nextDouble(lower, upper);
            }
        }
        return points;
    }
}
