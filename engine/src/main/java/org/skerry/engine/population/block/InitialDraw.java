package org.skerry.engine.population.block;

import java.util.Arrays;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Executor side: fills a block with its particles' initial values, drawn from the prior or from a
 * user proposal q, and evaluates their log-likelihoods. With a proposal, the log-weight is
 * {@code log prior − log q} (importance sampling of the prior, the target at temperature 0);
 * from the prior it is 0. Each particle draws from the stream keyed by its own global index.
 */
public final class InitialDraw {

    private InitialDraw() {
    }

    /**
     * Draws and evaluates every particle of {@code block}, whose {@code index} array must already
     * hold the global indices.
     *
     * @param proposal the start distribution q, or {@code null} to start from the prior
     * @throws IllegalArgumentException if a prior draw lies outside the model's support
     */
    public static EvaluationTally draw(ParticleBlock block, Prior proposal, LikelihoodEvaluator evaluator,
            long seed) {
        boolean usesLikelihood = !evaluator.nothingToEvaluate();
        Model model = evaluator.model();
        Prior prior = model.prior();
        ParameterSpace space = model.parameters();
        Prior start = proposal == null ? prior : proposal;
        int d = block.dimension();
        double[] x = new double[d];
        RandomStream random = new RandomStream(seed, StreamPurpose.INITIAL_DRAW, 0, 0, 0);
        double[] values = block.values();
        int n = block.size();
        // Draw every particle first, then evaluate the living ones together, so a batched model
        // (a worker program answering many particles per request) gets one batch per block.
        int[] pending = new int[n];
        long[] pendingIndex = new long[n];
        double[] pendingX = new double[n * d];
        int pendingCount = 0;
        for (int i = 0; i < n; i++) {
            long index = block.index()[i];
            random.reset(seed, StreamPurpose.INITIAL_DRAW, 0, index, 0);
            start.sample(random, x);
            double logPrior = space.contains(x) ? prior.logDensity(x) : Double.NEGATIVE_INFINITY;
            if (proposal == null && !(logPrior > Double.NEGATIVE_INFINITY)) {
                throw new IllegalArgumentException("prior sample for particle " + index + " lies outside the prior's "
                        + "own support: " + describe(space, x) + (Double.isNaN(logPrior) ? " (log-density NaN)" : ""));
            }
            System.arraycopy(x, 0, values, i * d, d);
            block.eve()[i] = index;
            block.logPrior()[i] = logPrior;
            if (logPrior == Double.NEGATIVE_INFINITY || Double.isNaN(logPrior)) {
                block.logPrior()[i] = Double.NEGATIVE_INFINITY;
                block.logLikelihood()[i] = Double.NEGATIVE_INFINITY;
                block.logWeight()[i] = Double.NEGATIVE_INFINITY;
                continue;
            }
            // An invalid evaluation counts as a zero likelihood: the weight stays that of the
            // prior target at φ = 0 and drops to zero at the first reweighting, as for any zero.
            double logWeight = proposal == null ? 0.0 : logPrior - proposal.logDensity(x);
            block.logWeight()[i] = Double.isNaN(logWeight) ? Double.NEGATIVE_INFINITY : logWeight;
            // Before the first observation is added (data tempering) there is nothing to evaluate.
            block.logLikelihood()[i] = 0.0;
            if (usesLikelihood) {
                pending[pendingCount] = i;
                pendingIndex[pendingCount] = index;
                System.arraycopy(x, 0, pendingX, pendingCount * d, d);
                pendingCount++;
            }
        }
        if (pendingCount > 0) {
            double[] out = new double[pendingCount];
            evaluator.evaluateAll(pendingX, pendingCount, pendingIndex, 0, 0, out, x);
            for (int k = 0; k < pendingCount; k++) {
                block.logLikelihood()[pending[k]] = out[k];
            }
        }
        return evaluator.drainTally();
    }

    static String describe(ParameterSpace space, double[] x) {
        StringBuilder text = new StringBuilder();
        for (int i = 0; i < x.length; i++) {
            text.append(i == 0 ? "" : ", ").append(space.name(i)).append('=').append(x[i]);
        }
        return x.length == space.dimension() ? text.toString() : Arrays.toString(x);
    }
}
