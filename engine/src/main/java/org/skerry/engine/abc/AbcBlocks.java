package org.skerry.engine.abc;

import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.block.InitialDraw;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Block side of ABC-SMC: the initial draw with its simulations, the reweighting to a new target
 * from the summaries each particle keeps, and the ABC Metropolis–Hastings moves (Del Moral,
 * Doucet &amp; Jasra 2012, Statistics and Computing 22, §3): propose θ′ on the unconstrained scale,
 * simulate M data sets at θ′, accept with probability
 * {@code min{1, π(θ′)·J(θ′)·q(θ | θ′)·Σₘ K_ε(d′ₘ) ÷ π(θ)·J(θ)·q(θ′ | θ)·Σₘ K_ε(dₘ)}}, J the
 * Jacobian of the move's unconstrained scale, and on acceptance keep θ′'s summaries. Random
 * streams are keyed as the likelihood moves' (iteration, particle index, step), so the answer
 * does not depend on which block or thread a particle is on.
 */
public final class AbcBlocks {

    private AbcBlocks() {
    }

    /**
     * Draws every particle of {@code block} from the prior (or {@code proposal}) and simulates M
     * data sets for each, keeping their summaries; the log-likelihood slot holds the log mean
     * kernel under {@code target}.
     */
    public static EvaluationTally draw(ParticleBlock block, Prior proposal, AbcTarget target, Model model, long seed,
            int retries) {
        block.attachAuxiliary(target.width());
        SimulationTerm term = SimulationTerm.intoBlock(SummarySimulator.of(model), target, block);
        return InitialDraw.draw(block, proposal, new LikelihoodEvaluator(model, seed, retries, term), seed);
    }

    /**
     * Brings every particle's weight from its current target to {@code next}: the log mean kernel
     * under {@code next}, recomputed from the kept summaries, replaces the log-likelihood slot and
     * their difference is added to the log-weight. A particle whose slot was −∞ stays at zero
     * weight.
     *
     * @param increments where each particle's log increment goes, in block order (or null)
     */
    public static void reweight(ParticleBlock block, AbcTarget next, double[] increments) {
        int w = block.auxiliaryWidth();
        double[] summaries = block.auxiliary();
        for (int i = 0; i < block.size(); i++) {
            double old = block.logLikelihood()[i];
            double now = next.logMeanKernel(summaries, i * w);
            double increment = increment(old, now);
            block.logLikelihood()[i] = old == Double.NEGATIVE_INFINITY ? old : now;
            block.logWeight()[i] += increment;
            if (increments != null) {
                increments[i] = increment;
            }
        }
    }

    /** {@code now − old}, and −∞ when {@code old} is −∞ (never NaN). */
    static double increment(double old, double now) {
        return old == Double.NEGATIVE_INFINITY || now == Double.NEGATIVE_INFINITY ? Double.NEGATIVE_INFINITY : now - old;
    }

    /** ABC Metropolis–Hastings steps {@code firstStep … firstStep+steps−1} of every living particle. */
    public static MoveTally move(ParticleBlock block, Proposal proposal, AbcTarget target, int iteration,
            int firstStep, int steps, Model model, long seed, int retries) {
        ParameterSpace space = model.parameters();
        Prior prior = model.prior();
        int n = block.size();
        int d = block.dimension();
        int w = target.width();
        if (block.auxiliaryWidth() != w) {
            throw new IllegalStateException("the block keeps " + block.auxiliaryWidth() + " summaries a particle; the "
                    + "target needs " + w);
        }
        double[] values = block.values();
        double[] logPrior = block.logPrior();
        double[] logKernel = block.logLikelihood();
        double[] summaries = block.auxiliary();
        long[] index = block.index();
        // Step by step over the block, so that a batched simulator gets one call per step for all
        // its proposals. Each particle's chain reads only its own keyed streams, so the order
        // (every particle's step k before any step k+1) gives the bytes of particle by particle.
        double[] candidateSummaries = new double[n * w];
        SimulationTerm term = SimulationTerm.intoBuffer(SummarySimulator.of(model), target, candidateSummaries);
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, seed, retries, term);

        double[] x = new double[d];
        double[] z = new double[d];
        double[] zNew = new double[d];
        double[] noise = new double[d];
        double[] scratch = new double[d];
        double[] position = new double[n * d];
        double[] current = new double[n];
        for (int i = 0; i < n; i++) {
            if (block.logWeight()[i] == Double.NEGATIVE_INFINITY) {
                continue;
            }
            System.arraycopy(values, i * d, x, 0, d);
            space.toUnconstrained(x, z);
            System.arraycopy(z, 0, position, i * d, d);
            current[i] = logPrior[i] + logKernel[i] + space.logJacobian(z);
        }
        int[] slot = new int[n];
        long[] slotIndex = new long[n];
        double[] slotX = new double[n * d];
        double[] slotZ = new double[n * d];
        double[] slotPrior = new double[n];
        double[] slotJacobian = new double[n];
        double[] kernels = new double[n];
        RandomStream random = new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, iteration, 0, 0);
        int rungs = proposal.rungs();
        long[] proposedByRung = rungs > 1 ? new long[rungs] : null;
        long[] acceptedByRung = rungs > 1 ? new long[rungs] : null;
        long proposed = 0;
        long accepted = 0;
        long outsidePrior = 0;
        for (int step = firstStep; step < firstStep + steps; step++) {
            int pending = 0;
            for (int i = 0; i < n; i++) {
                if (block.logWeight()[i] == Double.NEGATIVE_INFINITY) {
                    continue;
                }
                int rung = proposal.rungOf(index[i]);
                proposed++;
                if (proposedByRung != null) {
                    proposedByRung[rung]++;
                }
                System.arraycopy(position, i * d, z, 0, d);
                random.reset(seed, StreamPurpose.MOVE_PROPOSAL, iteration, index[i], step);
                proposal.propose(z, random, noise, zNew, rung);
                double jacobian = space.fromUnconstrained(zNew, x);
                double lp = space.contains(x) ? prior.logDensity(x) : Double.NEGATIVE_INFINITY;
                if (!(lp > Double.NEGATIVE_INFINITY)) {
                    // Outside the prior: rejected without a simulation.
                    outsidePrior++;
                    continue;
                }
                slot[pending] = i;
                slotIndex[pending] = index[i];
                System.arraycopy(x, 0, slotX, pending * d, d);
                System.arraycopy(zNew, 0, slotZ, pending * d, d);
                slotPrior[pending] = lp;
                slotJacobian[pending] = jacobian;
                pending++;
            }
            term.batch(slotIndex, pending);
            evaluator.evaluateAll(slotX, pending, slotIndex, iteration, step, kernels, scratch);
            for (int k = 0; k < pending; k++) {
                int i = slot[k];
                System.arraycopy(position, i * d, z, 0, d);
                System.arraycopy(slotZ, k * d, zNew, 0, d);
                double candidate = slotPrior[k] + kernels[k] + slotJacobian[k];
                double logRatio = candidate - current[i] + proposal.logProposalRatio(z, zNew, scratch);
                random.reset(seed, StreamPurpose.MOVE_ACCEPT, iteration, index[i], step);
                double u = random.nextOpenDouble();
                if (candidate > Double.NEGATIVE_INFINITY && StrictMath.log(u) < logRatio) {
                    accepted++;
                    if (acceptedByRung != null) {
                        acceptedByRung[proposal.rungOf(index[i])]++;
                    }
                    System.arraycopy(zNew, 0, position, i * d, d);
                    System.arraycopy(slotX, k * d, values, i * d, d);
                    System.arraycopy(candidateSummaries, k * w, summaries, i * w, w);
                    logPrior[i] = slotPrior[k];
                    logKernel[i] = kernels[k];
                    current[i] = candidate;
                }
            }
        }
        return new MoveTally(proposed, accepted, outsidePrior, evaluator.drainTally(), proposedByRung, acceptedByRung);
    }
}
