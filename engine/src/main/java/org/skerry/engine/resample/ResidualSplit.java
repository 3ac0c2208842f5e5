package org.skerry.engine.resample;

import java.io.Serializable;

/**
 * The three global numbers a block needs for the first pass of residual resampling (Liu &amp;
 * Chen 1998, JASA 93(443)): with {@code N} the population size and {@code T} the total
 * fixed-point weight, particle {@code i} gets {@code floor(N q_i / T)} certain copies and keeps
 * the remainder {@code (N q_i mod T) >>> shift} as its residual weight. The shift makes the sum
 * of residual weights (below {@code N T}) fit in a {@code long}. Made by
 * {@link ResamplingPlanner#residualSplit}; immutable.
 */
public final class ResidualSplit implements Serializable {

    private static final long serialVersionUID = 1L;

    private final int populationSize;
    private final long weightTotal;
    private final int shift;

    ResidualSplit(int populationSize, long weightTotal, int shift) {
        this.populationSize = populationSize;
        this.weightTotal = weightTotal;
        this.shift = shift;
    }

    /** {@code N}. */
    public int populationSize() {
        return populationSize;
    }

    /** {@code T}, the sum of all fixed-point weights. */
    public long weightTotal() {
        return weightTotal;
    }

    /** Right shift applied to each exact remainder. */
    public int shift() {
        return shift;
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof ResidualSplit)) {
            return false;
        }
        ResidualSplit other = (ResidualSplit) o;
        return populationSize == other.populationSize && weightTotal == other.weightTotal && shift == other.shift;
    }

    @Override
    public int hashCode() {
        return (31 * populationSize + Long.hashCode(weightTotal)) * 31 + shift;
    }

    @Override
    public String toString() {
        return "ResidualSplit[N=" + populationSize + ", T=" + weightTotal + ", shift=" + shift + "]";
    }
}
