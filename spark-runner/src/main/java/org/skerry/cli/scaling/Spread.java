package org.skerry.cli.scaling;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;

/**
 * Median and range of a few repeated measurements (the median, because one repeat disturbed by
 * another process on a shared machine should not move the figure). Immutable.
 *
 * @param median the median (the mean of the middle two for an even count)
 * @param min    the smallest value
 * @param max    the largest value
 * @param count  how many values
 */
record Spread(double median, double min, double max, int count) {

    static Spread of(List<Double> values) {
        if (values.isEmpty()) {
            throw new IllegalArgumentException("no values");
        }
        List<Double> sorted = new ArrayList<>(values);
        Collections.sort(sorted);
        int n = sorted.size();
        double median = n % 2 == 1 ? sorted.get(n / 2) : 0.5 * (sorted.get(n / 2 - 1) + sorted.get(n / 2));
        return new Spread(median, sorted.get(0), sorted.get(n - 1), n);
    }

    /** {median, min, max}. */
    double[] asArray() {
        return new double[] {median, min, max};
    }
}
