package org.skerry.cli.report;

/**
 * A histogram of weighted values: {@code bins} equal bins from the smallest to the largest value
 * of positive weight, each holding the summed weight of its values (the last bin includes its
 * upper edge). With normalised weights the masses sum to 1 and mass / width is a density.
 *
 * @param edges bins + 1 increasing edges
 * @param mass  per bin, the summed weight
 */
record WeightedHistogram(double[] edges, double[] mass) {

    WeightedHistogram {
        if (edges.length != mass.length + 1) {
            throw new IllegalArgumentException("edges must be one more than bins, were " + edges.length + " and "
                    + mass.length);
        }
        edges = edges.clone();
        mass = mass.clone();
    }

    static WeightedHistogram of(double[] values, double[] weights, int bins) {
        if (bins < 1) {
            throw new IllegalArgumentException("bins must be at least 1, was " + bins);
        }
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < values.length; i++) {
            if (weights[i] > 0 && Double.isFinite(values[i])) {
                low = Math.min(low, values[i]);
                high = Math.max(high, values[i]);
            }
        }
        if (low > high) {
            low = 0;
            high = 1;
        } else if (low == high) {
            // One value: a bin around it, wide enough to draw.
            double half = Math.max(Math.abs(low) * 1e-3, 1e-9);
            low -= half;
            high += half;
        }
        double[] edges = new double[bins + 1];
        for (int b = 0; b <= bins; b++) {
            edges[b] = low + (high - low) * b / bins;
        }
        edges[bins] = high;
        double[] mass = new double[bins];
        for (int i = 0; i < values.length; i++) {
            if (weights[i] > 0 && Double.isFinite(values[i])) {
                mass[binOf(values[i], edges)] += weights[i];
            }
        }
        return new WeightedHistogram(edges, mass);
    }

    /** The bin of {@code x} within the edges: the last b with edges[b] ≤ x, the top edge in the last bin. */
    static int binOf(double x, double[] edges) {
        int bins = edges.length - 1;
        int b = (int) ((x - edges[0]) / (edges[bins] - edges[0]) * bins);
        b = Math.max(0, Math.min(bins - 1, b));
        // The division can land one bin off at an edge; settle it against the edges themselves.
        while (b > 0 && x < edges[b]) {
            b--;
        }
        while (b < bins - 1 && x >= edges[b + 1]) {
            b++;
        }
        return b;
    }

    public double[] edges() {
        return edges.clone();
    }

    public double[] mass() {
        return mass.clone();
    }

    int bins() {
        return mass.length;
    }

    /** The density of bin {@code b}: its mass over its width. */
    double density(int b) {
        return mass[b] / (edges[b + 1] - edges[b]);
    }
}
