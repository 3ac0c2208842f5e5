package org.skerry.engine.resample;

import java.io.Serializable;

/**
 * What a block reports after the first residual pass (Liu &amp; Chen 1998, JASA 93(443)): its
 * number of certain copies and the sum of its residual weights. Immutable.
 */
public final class ResidualTotals implements Serializable {

    private static final long serialVersionUID = 1L;

    private final long floorTotal;
    private final long remainderTotal;

    /**
     * @throws IllegalArgumentException if a total is negative
     */
    public ResidualTotals(long floorTotal, long remainderTotal) {
        if (floorTotal < 0) {
            throw new IllegalArgumentException("floorTotal must be >= 0, was " + floorTotal);
        }
        if (remainderTotal < 0) {
            throw new IllegalArgumentException("remainderTotal must be >= 0, was " + remainderTotal);
        }
        this.floorTotal = floorTotal;
        this.remainderTotal = remainderTotal;
    }

    /** Sum of {@code floor(N q_i / T)} over the block. */
    public long floorTotal() {
        return floorTotal;
    }

    /** Sum of the block's residual fixed-point weights. */
    public long remainderTotal() {
        return remainderTotal;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ResidualTotals && floorTotal == ((ResidualTotals) o).floorTotal
                && remainderTotal == ((ResidualTotals) o).remainderTotal;
    }

    @Override
    public int hashCode() {
        return 31 * Long.hashCode(floorTotal) + Long.hashCode(remainderTotal);
    }

    @Override
    public String toString() {
        return "ResidualTotals[floors=" + floorTotal + ", remainders=" + remainderTotal + "]";
    }
}
