package org.skerry.engine.population.block;

import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.MomentSums;

/**
 * Executor side: the weighted moment sums of one block on the unconstrained scale, for fitting
 * the next move proposal.
 */
public final class MomentCollector {

    private MomentCollector() {
    }

    /** Sums with normalised weights {@code exp(log w − logTotal)}. */
    public static MomentSums collect(ParticleBlock block, ParameterSpace space, double logTotal) {
        int d = block.dimension();
        MomentSums sums = new MomentSums(d);
        double[] x = new double[d];
        double[] z = new double[d];
        double[] values = block.values();
        for (int i = 0; i < block.size(); i++) {
            double w = StrictMath.exp(block.logWeight()[i] - logTotal);
            if (w == 0.0) {
                continue;
            }
            System.arraycopy(values, i * d, x, 0, d);
            space.toUnconstrained(x, z);
            sums.add(w, z);
        }
        return sums;
    }
}
