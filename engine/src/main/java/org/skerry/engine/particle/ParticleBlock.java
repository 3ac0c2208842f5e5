package org.skerry.engine.particle;

import java.util.Arrays;

/**
 * A block of particles in structure-of-arrays form: one {@code double[]} holds the parameter
 * vectors of all particles back to back (particle {@code i} at {@code values[i*d .. i*d+d)}, on
 * the model's own scale), and one array each holds the log-prior, log-likelihood, log-weight,
 * global particle index and Eve index (the particle's ancestor at iteration 0, which the
 * single-run variance estimate of the evidence needs). A target may attach a fixed number of
 * auxiliary values to every particle (approximate Bayesian computation keeps each particle's
 * simulated summaries there, so that its weight can be recomputed when the distance changes);
 * they travel with the particle through resampling, exchange and checkpoints.
 *
 * <p>Blocks are the unit of parallel work: a thread or a Spark partition owns a block while it
 * works on it. The arrays are exposed directly so hot loops run over primitives; the block is
 * mutable and not thread-safe. Arrays may be longer than {@link #size()}.
 */
public final class ParticleBlock {

    private final int dimension;
    private int auxiliaryWidth;
    private double[] auxiliary = new double[0];
    private int size;
    private double[] values;
    private double[] logPrior;
    private double[] logLikelihood;
    private double[] logWeight;
    private long[] index;
    private long[] eve;

    /** An empty block with room for {@code capacity} particles of {@code dimension} parameters. */
    public ParticleBlock(int dimension, int capacity) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        if (capacity < 0) {
            throw new IllegalArgumentException("capacity must be >= 0, was " + capacity);
        }
        this.dimension = dimension;
        this.values = new double[Math.multiplyExact(capacity, dimension)];
        this.logPrior = new double[capacity];
        this.logLikelihood = new double[capacity];
        this.logWeight = new double[capacity];
        this.index = new long[capacity];
        this.eve = new long[capacity];
    }

    /** Wraps existing arrays (used when a block is read back from a checkpoint or the network). */
    public ParticleBlock(int dimension, int size, double[] values, double[] logPrior,
            double[] logLikelihood, double[] logWeight, long[] index, long[] eve) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        if (size < 0 || values.length < (long) size * dimension || logPrior.length < size
                || logLikelihood.length < size || logWeight.length < size || index.length < size
                || eve.length < size) {
            throw new IllegalArgumentException("arrays too short for " + size + " particles of dimension " + dimension);
        }
        this.dimension = dimension;
        this.size = size;
        this.values = values;
        this.logPrior = logPrior;
        this.logLikelihood = logLikelihood;
        this.logWeight = logWeight;
        this.index = index;
        this.eve = eve;
    }

    /**
     * Wraps existing arrays with {@code auxiliaryWidth} auxiliary values per particle, back to
     * back in {@code auxiliary}.
     */
    public ParticleBlock(int dimension, int size, double[] values, double[] logPrior,
            double[] logLikelihood, double[] logWeight, long[] index, long[] eve, int auxiliaryWidth,
            double[] auxiliary) {
        this(dimension, size, values, logPrior, logLikelihood, logWeight, index, eve);
        if (auxiliaryWidth < 0 || auxiliary.length < (long) size * auxiliaryWidth) {
            throw new IllegalArgumentException("auxiliary array too short for " + size + " particles of "
                    + auxiliaryWidth + " values (width must be >= 0)");
        }
        this.auxiliaryWidth = auxiliaryWidth;
        this.auxiliary = auxiliary;
    }

    /** An empty block shaped like {@code shape} (dimension, auxiliary width) with room for {@code capacity}. */
    public static ParticleBlock shapedLike(ParticleBlock shape, int capacity) {
        ParticleBlock block = new ParticleBlock(shape.dimension, capacity);
        block.attachAuxiliary(shape.auxiliaryWidth);
        return block;
    }

    /**
     * A block of {@code count} particles with global indices {@code firstIndex …
     * firstIndex+count−1} and every other value zero, ready for an initial draw.
     */
    public static ParticleBlock indexed(int dimension, long firstIndex, int count) {
        ParticleBlock block = new ParticleBlock(dimension, count);
        block.resize(count);
        for (int i = 0; i < count; i++) {
            block.index[i] = firstIndex + i;
        }
        return block;
    }

    public int dimension() {
        return dimension;
    }

    /** Auxiliary values per particle (0 for a likelihood run). */
    public int auxiliaryWidth() {
        return auxiliaryWidth;
    }

    /** Auxiliary values, particle {@code i} at {@code [i*w, i*w+w)} for width w. */
    public double[] auxiliary() {
        return auxiliary;
    }

    /**
     * Gives every particle {@code width} auxiliary values (zero), dropping any it had; a no-op when
     * the width is already {@code width}.
     */
    public void attachAuxiliary(int width) {
        if (width < 0) {
            throw new IllegalArgumentException("width must be >= 0, was " + width);
        }
        if (width == auxiliaryWidth) {
            return;
        }
        auxiliaryWidth = width;
        auxiliary = new double[Math.multiplyExact(capacity(), width)];
    }

    /** Number of particles in the block. */
    public int size() {
        return size;
    }

    /** Room for particles before the arrays must grow. */
    public int capacity() {
        return logPrior.length;
    }

    /** Sets the number of particles, growing the arrays if needed (contents kept). */
    public void resize(int newSize) {
        if (newSize < 0) {
            throw new IllegalArgumentException("size must be >= 0, was " + newSize);
        }
        if (newSize > capacity()) {
            values = Arrays.copyOf(values, Math.multiplyExact(newSize, dimension));
            logPrior = Arrays.copyOf(logPrior, newSize);
            logLikelihood = Arrays.copyOf(logLikelihood, newSize);
            logWeight = Arrays.copyOf(logWeight, newSize);
            index = Arrays.copyOf(index, newSize);
            eve = Arrays.copyOf(eve, newSize);
            auxiliary = Arrays.copyOf(auxiliary, Math.multiplyExact(newSize, auxiliaryWidth));
        }
        size = newSize;
    }

    /** Parameter vectors, back to back. */
    public double[] values() {
        return values;
    }

    public double[] logPrior() {
        return logPrior;
    }

    public double[] logLikelihood() {
        return logLikelihood;
    }

    /** Unnormalised log-weights. */
    public double[] logWeight() {
        return logWeight;
    }

    /** Global particle index: the key of every random stream the particle uses. */
    public long[] index() {
        return index;
    }

    /** Global index of each particle's ancestor at iteration 0. */
    public long[] eve() {
        return eve;
    }

    /** Copies particle {@code from} of {@code source} into slot {@code to} of this block. */
    public void copyParticle(ParticleBlock source, int from, int to) {
        System.arraycopy(source.values, from * dimension, values, to * dimension, dimension);
        logPrior[to] = source.logPrior[from];
        logLikelihood[to] = source.logLikelihood[from];
        logWeight[to] = source.logWeight[from];
        index[to] = source.index[from];
        eve[to] = source.eve[from];
        if (auxiliaryWidth > 0 || source.auxiliaryWidth > 0) {
            if (source.auxiliaryWidth != auxiliaryWidth) {
                throw new IllegalArgumentException("auxiliary widths differ: " + source.auxiliaryWidth + " and "
                        + auxiliaryWidth);
            }
            System.arraycopy(source.auxiliary, from * auxiliaryWidth, auxiliary, to * auxiliaryWidth, auxiliaryWidth);
        }
    }

    /** A deep copy holding exactly {@link #size()} particles. */
    public ParticleBlock copy() {
        return new ParticleBlock(dimension, size,
                Arrays.copyOf(values, size * dimension), Arrays.copyOf(logPrior, size),
                Arrays.copyOf(logLikelihood, size), Arrays.copyOf(logWeight, size),
                Arrays.copyOf(index, size), Arrays.copyOf(eve, size), auxiliaryWidth,
                Arrays.copyOf(auxiliary, size * auxiliaryWidth));
    }
}
