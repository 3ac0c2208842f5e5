package org.skerry.engine.population;

import java.io.InvalidObjectException;
import java.io.ObjectInputStream;
import java.io.Serializable;
import java.util.Arrays;
import org.skerry.engine.math.ExactSum;

/**
 * Weighted sums of a population's unconstrained coordinates: {@code Σw}, {@code Σw·z} and
 * {@code Σw·z·zᵀ} (upper triangle), from which the driver fits a move proposal. Every sum is
 * exact, so the fitted proposal — and hence every later draw — does not depend on how particles
 * are grouped into blocks. Executors fill one per block; the driver merges them: O(P·d²) numbers.
 *
 * <p>Travels in its compact form ({@link #toCompactArray()}: only the chunks of each exact sum
 * that are in use), by Java serialisation and by the Kryo serialiser the Spark backend registers;
 * a round trip keeps every sum exactly.
 *
 * <p>Mutable accumulator; not thread-safe.
 */
public final class MomentSums implements Serializable {

    private static final long serialVersionUID = 1L;

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

    /**
     * These sums as one array: the dimension, then for Σw, each Σw·z and each Σw·z·zᵀ entry (in
     * the order {@link #add} fills them) the length of its {@link ExactSum#toCompactArray()} and
     * that array. About four longs per sum, against 67 chunks for the accumulator itself.
     */
    public long[] toCompactArray() {
        long[][] parts = new long[1 + first.length + second.length][];
        parts[0] = weight.toCompactArray();
        for (int i = 0; i < first.length; i++) {
            parts[1 + i] = first[i].toCompactArray();
        }
        for (int i = 0; i < second.length; i++) {
            parts[1 + first.length + i] = second[i].toCompactArray();
        }
        int length = 1;
        for (long[] part : parts) {
            length += 1 + part.length;
        }
        long[] compact = new long[length];
        compact[0] = dimension;
        int at = 1;
        for (long[] part : parts) {
            compact[at++] = part.length;
            System.arraycopy(part, 0, compact, at, part.length);
            at += part.length;
        }
        return compact;
    }

    /**
     * Rebuilds sums from {@link #toCompactArray()}: they read and merge exactly as the originals.
     *
     * @throws IllegalArgumentException naming the position if {@code compact} is not such an array
     */
    public static MomentSums fromCompactArray(long[] compact) {
        if (compact == null || compact.length == 0) {
            throw new IllegalArgumentException("compact moment sums must be a non-empty array from toCompactArray()");
        }
        // Past this the triangle's size overflows an int; no move proposal is fitted in such a space.
        if (compact[0] < 1 || compact[0] > 46_340) {
            throw new IllegalArgumentException("compact moment sums: dimension at index 0 must lie in [1, 46340], was "
                    + compact[0]);
        }
        MomentSums sums = new MomentSums((int) compact[0]);
        int at = 1;
        int count = 1 + sums.first.length + sums.second.length;
        for (int i = 0; i < count; i++) {
            if (at >= compact.length) {
                throw new IllegalArgumentException("compact moment sums of dimension " + sums.dimension + " end after "
                        + i + " of " + count + " sums");
            }
            long length = compact[at];
            if (length < 1 || length > compact.length - at - 1) {
                throw new IllegalArgumentException("compact moment sums: length of sum " + i + " at index " + at
                        + " must lie in [1, " + (compact.length - at - 1) + "], was " + length);
            }
            long[] part = Arrays.copyOfRange(compact, at + 1, at + 1 + (int) length);
            ExactSum sum;
            try {
                sum = ExactSum.fromCompactArray(part);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("compact moment sums: sum " + i + " at index " + at + ": "
                        + e.getMessage(), e);
            }
            sums.sum(i).add(sum);
            at += 1 + (int) length;
        }
        if (at != compact.length) {
            throw new IllegalArgumentException("compact moment sums of dimension " + sums.dimension + " hold "
                    + (compact.length - at) + " longs after the last sum");
        }
        return sums;
    }

    /** Sum {@code i} in the compact order: Σw, then Σw·z, then the triangle of Σw·z·zᵀ. */
    private ExactSum sum(int i) {
        if (i == 0) {
            return weight;
        }
        return i <= first.length ? first[i - 1] : second[i - 1 - first.length];
    }

    private Object writeReplace() {
        return new SerialForm(toCompactArray());
    }

    private void readObject(ObjectInputStream in) throws InvalidObjectException {
        throw new InvalidObjectException("moment sums are read through their compact serial form");
    }

    /** The Java serial form: the compact array only. */
    private static final class SerialForm implements Serializable {

        private static final long serialVersionUID = 1L;

        private final long[] compact;

        SerialForm(long[] compact) {
            this.compact = compact;
        }

        private Object readResolve() throws InvalidObjectException {
            try {
                return fromCompactArray(compact);
            } catch (IllegalArgumentException e) {
                InvalidObjectException invalid = new InvalidObjectException(e.getMessage());
                invalid.initCause(e);
                throw invalid;
            }
        }
    }
}
