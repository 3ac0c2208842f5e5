package org.skerry.engine.abc;

import java.util.Arrays;
import java.util.List;

/**
 * Driver side: the weight of each summary in the distance, the inverse of a robust spread of the
 * population's simulated values of that summary, the median absolute deviation (MAD), estimated
 * again every iteration from the simulations the particles keep (Prangle 2017, Bayesian Analysis
 * 12(1): distances scaled by the spread of the current simulations). When over half of the values
 * tie, the MAD is 0 and the mean absolute deviation from the median is taken instead; when that
 * is 0 too, the summary has no spread: at the first estimate that is an error (the scale cannot be
 * estimated), later the last weight is kept.
 */
public final class DistanceScales {

    private DistanceScales() {
    }

    /**
     * The weights from the summaries of the particles {@code alive} marks.
     *
     * @param summaries  M summary vectors of s values per particle, back to back
     * @param previous   the last weights, or null at the first estimate
     * @throws ZeroSpreadException naming the summary when one has no spread at the first estimate
     */
    public static double[] weights(double[] summaries, boolean[] alive, int simulations, List<String> names,
            double[] previous) {
        int s = names.size();
        int n = alive.length;
        int width = simulations * s;
        int count = 0;
        for (boolean a : alive) {
            count += a ? simulations : 0;
        }
        double[] weights = new double[s];
        double[] values = new double[count];
        for (int k = 0; k < s; k++) {
            int at = 0;
            for (int i = 0; i < n; i++) {
                if (!alive[i]) {
                    continue;
                }
                for (int m = 0; m < simulations; m++) {
                    values[at++] = summaries[i * width + m * s + k];
                }
            }
            double spread = spread(values);
            if (spread > 0 && Double.isFinite(spread)) {
                weights[k] = 1.0 / spread;
            } else if (previous != null) {
                weights[k] = previous[k];
            } else {
                throw new ZeroSpreadException(names.get(k), count, count == 0 ? Double.NaN : values[0]);
            }
        }
        return weights;
    }

    /** The MAD of {@code values} (sorted in place), or the mean absolute deviation from the median when the MAD is 0. */
    static double spread(double[] values) {
        int n = values.length;
        if (n == 0) {
            return 0.0;
        }
        Arrays.sort(values);
        double median = median(values);
        double[] deviations = new double[n];
        double total = 0.0;
        for (int i = 0; i < n; i++) {
            deviations[i] = Math.abs(values[i] - median);
            total += deviations[i];
        }
        Arrays.sort(deviations);
        double mad = median(deviations);
        return mad > 0 ? mad : total / n;
    }

    private static double median(double[] sorted) {
        int n = sorted.length;
        return n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
    }

    /** A summary whose simulated values do not vary, so its scale cannot be estimated. */
    public static final class ZeroSpreadException extends IllegalArgumentException {
        private static final long serialVersionUID = 1L;
        private final String summary;

        ZeroSpreadException(String summary, int count, double value) {
            super("summary '" + summary + "' has no spread: all " + count + " simulations from the prior gave "
                    + value + ", so its scale in the distance cannot be estimated; drop it, or give fixed distance "
                    + "weights");
            this.summary = summary;
        }

        /** The summary's name. */
        public String summary() {
            return summary;
        }
    }
}
