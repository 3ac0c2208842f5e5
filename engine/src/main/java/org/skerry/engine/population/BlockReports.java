package org.skerry.engine.population;

import java.io.Serializable;
import java.util.Arrays;
import org.skerry.engine.particle.ParticleBlock;

/**
 * The typed results blocks send to the driver, one per block and step: a few scalars per particle
 * or sums per block, never parameter vectors. Plain final classes rather than records so that
 * Spark's Kryo can copy them field by field.
 */
public final class BlockReports {

    private BlockReports() {
    }

    /** A block's log-weights and log-likelihoods, in block order: what tempering needs. */
    public static final class Weights implements Serializable {
        private static final long serialVersionUID = 1L;
        private final double[] logWeight;
        private final double[] logLikelihood;

        public Weights(double[] logWeight, double[] logLikelihood) {
            this.logWeight = logWeight;
            this.logLikelihood = logLikelihood;
        }

        /** Copies of the block's current log-weights and log-likelihoods. */
        public static Weights of(ParticleBlock block) {
            return new Weights(Arrays.copyOf(block.logWeight(), block.size()),
                    Arrays.copyOf(block.logLikelihood(), block.size()));
        }

        public double[] logWeight() {
            return logWeight;
        }

        public double[] logLikelihood() {
            return logLikelihood;
        }
    }

    /** The initial draw of a block: its evaluation counts and its weights. */
    public static final class Drawn implements Serializable {
        private static final long serialVersionUID = 1L;
        private final EvaluationTally tally;
        private final Weights weights;

        public Drawn(EvaluationTally tally, Weights weights) {
            this.tally = tally;
            this.weights = weights;
        }

        public EvaluationTally tally() {
            return tally;
        }

        public Weights weights() {
            return weights;
        }
    }

    /** Moves of a block: counts, and the weights afterwards when the next target's choice needs them (else null). */
    public static final class Moved implements Serializable {
        private static final long serialVersionUID = 1L;
        private final MoveTally tally;
        private final Weights weights;

        public Moved(MoveTally tally, Weights weights) {
            this.tally = tally;
            this.weights = weights;
        }

        public MoveTally tally() {
            return tally;
        }

        /** The weights after the moves, or null. */
        public Weights weights() {
            return weights;
        }
    }

    /** A block's place and its quantised weight total, for the resampling plan. */
    public static final class Totals implements Serializable {
        private static final long serialVersionUID = 1L;
        private final long firstIndex;
        private final int size;
        private final long weightTotal;

        public Totals(long firstIndex, int size, long weightTotal) {
            this.firstIndex = firstIndex;
            this.size = size;
            this.weightTotal = weightTotal;
        }

        /** Global index of the block's first particle (meaningless when the block is empty). */
        public long firstIndex() {
            return firstIndex;
        }

        public int size() {
            return size;
        }

        public long weightTotal() {
            return weightTotal;
        }
    }

    /** A block after resampling: how many distinct ancestors it kept, and the moment sums of its survivors. */
    public static final class Resampled implements Serializable {
        private static final long serialVersionUID = 1L;
        private final long distinctAncestors;
        private final MomentSums moments;

        public Resampled(long distinctAncestors, MomentSums moments) {
            this.distinctAncestors = distinctAncestors;
            this.moments = moments;
        }

        public long distinctAncestors() {
            return distinctAncestors;
        }

        public MomentSums moments() {
            return moments;
        }
    }

    /** A block's log-likelihood increments towards the next target, and the evaluations they took. */
    public static final class Increments implements Serializable {
        private static final long serialVersionUID = 1L;
        private final double[] logIncrement;
        private final EvaluationTally tally;

        public Increments(double[] logIncrement, EvaluationTally tally) {
            this.logIncrement = logIncrement;
            this.tally = tally;
        }

        public double[] logIncrement() {
            return logIncrement;
        }

        public EvaluationTally tally() {
            return tally;
        }
    }

    /**
     * A block's log-weights, log-likelihoods and auxiliary values (ABC: the kept summaries), in
     * block order: what the choice of the next ABC tolerance and distance needs.
     */
    public static final class Auxiliary implements Serializable {
        private static final long serialVersionUID = 1L;
        private final Weights weights;
        private final double[] values;

        public Auxiliary(Weights weights, double[] values) {
            this.weights = weights;
            this.values = values;
        }

        /** Copies of the block's current values. */
        public static Auxiliary of(ParticleBlock block) {
            return new Auxiliary(Weights.of(block),
                    Arrays.copyOf(block.auxiliary(), block.size() * block.auxiliaryWidth()));
        }

        public Weights weights() {
            return weights;
        }

        /** Auxiliary values, particle by particle. */
        public double[] values() {
            return values;
        }
    }
}
