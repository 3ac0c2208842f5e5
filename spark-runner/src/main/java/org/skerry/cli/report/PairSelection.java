package org.skerry.cli.report;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.stream.IntStream;

/**
 * Which parameters the pair plot shows, and their weighted correlations: all of them up to
 * {@link #MAX}; beyond, the {@link #MAX} with the strongest correlation (largest |r| with any other
 * parameter) — the pairs a reader most needs to see — kept in the model's order. Ties go to the
 * earlier parameter, so the choice is the same every time.
 *
 * @param chosen      indices into the model's parameters, increasing
 * @param correlation the weighted correlation matrix of all parameters
 */
record PairSelection(List<Integer> chosen, double[][] correlation) {

    static final int MAX = 8;

    PairSelection {
        chosen = List.copyOf(chosen);
    }

    static PairSelection of(List<double[]> values, double[] weights) {
        int d = values.size();
        double[][] r = correlation(values, weights);
        List<Integer> chosen;
        if (d <= MAX) {
            chosen = IntStream.range(0, d).boxed().toList();
        } else {
            double[] score = new double[d];
            for (int i = 0; i < d; i++) {
                for (int j = 0; j < d; j++) {
                    if (i != j && Math.abs(r[i][j]) > score[i]) {
                        score[i] = Math.abs(r[i][j]);
                    }
                }
            }
            List<Integer> order = new ArrayList<>(IntStream.range(0, d).boxed().toList());
            order.sort(Comparator.<Integer>comparingDouble(i -> -score[i]).thenComparing(i -> i));
            chosen = new ArrayList<>(order.subList(0, MAX));
            chosen.sort(null);
        }
        return new PairSelection(chosen, r);
    }

    /** Weighted Pearson correlations; NaN where a parameter does not vary. */
    static double[][] correlation(List<double[]> values, double[] weights) {
        int d = values.size();
        double total = 0;
        double[] mean = new double[d];
        for (int n = 0; n < weights.length; n++) {
            total += weights[n];
        }
        for (int i = 0; i < d; i++) {
            double s = 0;
            double[] v = values.get(i);
            for (int n = 0; n < weights.length; n++) {
                if (weights[n] > 0) {
                    s += weights[n] * v[n];
                }
            }
            mean[i] = s / total;
        }
        double[][] cov = new double[d][d];
        for (int i = 0; i < d; i++) {
            double[] a = values.get(i);
            for (int j = i; j < d; j++) {
                double[] b = values.get(j);
                double s = 0;
                for (int n = 0; n < weights.length; n++) {
                    if (weights[n] > 0) {
                        s += weights[n] * (a[n] - mean[i]) * (b[n] - mean[j]);
                    }
                }
                cov[i][j] = s / total;
                cov[j][i] = cov[i][j];
            }
        }
        double[][] r = new double[d][d];
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                double denominator = Math.sqrt(cov[i][i] * cov[j][j]);
                r[i][j] = denominator > 0 ? cov[i][j] / denominator : Double.NaN;
            }
        }
        return r;
    }
}
