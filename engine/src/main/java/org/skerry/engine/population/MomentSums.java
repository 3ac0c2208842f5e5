package org.skerry.engine.population;

import org.skerry.engine.math.ExactSum;

/**
 * Weighted sums of a population's unconstrained coordinates: {@code Σw}, {@code Σw·z} and
 * {@code Σw·z·zᵀ} (upper triangle), from which the driver fits a move proposal. Every sum is
 * exact, so the fitted proposal — and hence every later draw — does not depend on how particles
 * are grouped into blocks. Executors fill one per block; the driver merges them: O(P·d²) numbers.
 *
 * <p>Mutable accumulator; not thread-safe.
 */
public final class MomentSums {

    private final int dimension;
    private final ExactSum weight = new ExactSum();
    private final ExactSum[] first;
    private final ExactSum[] second;

    public MomentSums(int dimension) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        this.dimension = dimension;
        this.first = newSums(dimension);
        this.second = newSums(dimension * (dimension + 1) / 2);
    }

    private static ExactSum[] newSums(int count) {
        ExactSum[] sums = new ExactSum[count];
        for (int i = 0; i < count; i++) {
            sums[i] = new ExactSum();
        }
        return sums;
    }

    public int dimension() {
        return dimension;
    }

    /** Adds one particle with normalised weight {@code w} at unconstrained point {@code z}. */
    public void add(double w, double[] z) {
        if (w == 0.0) {
            return;
        }
        weight.add(w);
        int k = 0;
        for (int a = 0; a < dimension; a++) {
            double wz = w * z[a];
            first[a].add(wz);
            for (int b = a; b < dimension; b++) {
                second[k++].add(wz * z[b]);
            }
        }
    }

    /** Adds another block's sums (exact, so the order of merging is irrelevant). */
    public void merge(MomentSums other) {
        if (other.dimension != dimension) {
            throw new IllegalArgumentException("dimension mismatch: " + dimension + " vs " + other.dimension);
        }
        weight.add(other.weight);
        for (int i = 0; i < first.length; i++) {
            first[i].add(other.first[i]);
        }
        for (int i = 0; i < second.length; i++) {
            second[i].add(other.second[i]);
        }
    }

    /** Total weight. */
    public double totalWeight() {
        return weight.doubleValue();
    }

    /** Weighted mean of z. */
    public double[] mean() {
        double total = weight.doubleValue();
        double[] mean = new double[dimension];
        for (int a = 0; a < dimension; a++) {
            mean[a] = first[a].doubleValue() / total;
        }
        return mean;
    }

    /** Weighted covariance of z (the biased, weight-normalised form), as a full matrix. */
    public double[][] covariance() {
        double total = weight.doubleValue();
        double[] mean = mean();
        double[][] covariance = new double[dimension][dimension];
        int k = 0;
        for (int a = 0; a < dimension; a++) {
            for (int b = a; b < dimension; b++) {
                double value = second[k++].doubleValue() / total - mean[a] * mean[b];
                covariance[a][b] = value;
                covariance[b][a] = value;
            }
        }
        return covariance;
    }
}
