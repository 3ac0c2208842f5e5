package org.skerry.engine.move;

import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.target.Target;

/**
 * Executor side: Metropolis–Hastings steps for every living particle of a block, leaving the
 * current target of the sequence (e.g. {@code prior × likelihood^φ}) invariant (Del Moral, Doucet &amp; Jasra 2006,
 * JRSS-B 68(3)). Moves happen on the unconstrained scale, with the log-Jacobian in the
 * acceptance ratio, so they never leave the support. A proposal the prior rules out is rejected
 * without a likelihood call; an invalid evaluation counts as a zero likelihood there (rejected)
 * and is reported.
 *
 * <p>The block advances one step at a time for all its particles, so a {@link
 * org.skerry.engine.model.BatchedModel} sees one batch per step. Each particle's proposal and
 * accept draws come from streams keyed by (iteration, particle index, step).
 */
public final class MetropolisHastingsMover {

    private MetropolisHastingsMover() {
    }

    /** Runs steps {@code firstStep … firstStep+steps−1}, invariant for {@code target}. */
    public static MoveTally move(ParticleBlock block, Proposal proposal, Target target, int iteration,
            int firstStep, int steps, LikelihoodEvaluator evaluator, long seed) {
        Model model = evaluator.model();
        ParameterSpace space = model.parameters();
        Prior prior = model.prior();
        int n = block.size();
        int d = block.dimension();
        double[] values = block.values();
        double[] logPrior = block.logPrior();
        double[] logLikelihood = block.logLikelihood();
        long[] index = block.index();

        double[] z = new double[n * d];
        double[] currentTarget = new double[n];
        boolean[] alive = new boolean[n];
        double[] x = new double[d];
        double[] zi = new double[d];
        for (int i = 0; i < n; i++) {
            alive[i] = block.logWeight()[i] != Double.NEGATIVE_INFINITY;
            if (!alive[i]) {
                continue;
            }
            System.arraycopy(values, i * d, x, 0, d);
            space.toUnconstrained(x, zi);
            System.arraycopy(zi, 0, z, i * d, d);
            currentTarget[i] = target.logDensity(logPrior[i], logLikelihood[i])
                    + space.logJacobian(zi);
        }

        double[] candidateZ = new double[n * d];
        double[] candidateX = new double[n * d];
        double[] candidatePrior = new double[n];
        double[] candidateJacobian = new double[n];
        double[] candidateLikelihood = new double[n];
        int[] pending = new int[n];
        long[] pendingIndex = new long[n];
        double[] pendingX = new double[n * d];
        double[] pendingOut = new double[n];
        double[] noise = new double[d];
        double[] zNew = new double[d];
        double[] scratch = new double[d];
        RandomStream random = new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, iteration, 0, 0);

        int rungs = proposal.rungs();
        long[] proposedByRung = rungs > 1 ? new long[rungs] : null;
        long[] acceptedByRung = rungs > 1 ? new long[rungs] : null;
        long proposed = 0;
        long accepted = 0;
        long outsidePrior = 0;
        for (int step = firstStep; step < firstStep + steps; step++) {
            int pendingCount = 0;
            for (int i = 0; i < n; i++) {
                if (!alive[i]) {
                    continue;
                }
                proposed++;
                System.arraycopy(z, i * d, zi, 0, d);
                random.reset(seed, StreamPurpose.MOVE_PROPOSAL, iteration, index[i], step);
                int rung = proposal.rungOf(index[i]);
                if (proposedByRung != null) {
                    proposedByRung[rung]++;
                }
                proposal.propose(zi, random, noise, zNew, rung);
                System.arraycopy(zNew, 0, candidateZ, i * d, d);
                candidateJacobian[i] = space.fromUnconstrained(zNew, x);
                System.arraycopy(x, 0, candidateX, i * d, d);
                double lp = space.contains(x) ? prior.logDensity(x) : Double.NEGATIVE_INFINITY;
                candidatePrior[i] = Double.isNaN(lp) ? Double.NEGATIVE_INFINITY : lp;
                if (candidatePrior[i] == Double.NEGATIVE_INFINITY) {
                    outsidePrior++;
                    candidateLikelihood[i] = Double.NEGATIVE_INFINITY;
                    continue;
                }
                pending[pendingCount] = i;
                pendingIndex[pendingCount] = index[i];
                System.arraycopy(x, 0, pendingX, pendingCount * d, d);
                pendingCount++;
            }
            evaluator.evaluateAll(pendingX, pendingCount, pendingIndex, iteration, step, pendingOut, scratch);
            for (int k = 0; k < pendingCount; k++) {
                candidateLikelihood[pending[k]] = pendingOut[k];
            }
            for (int i = 0; i < n; i++) {
                if (!alive[i] || candidatePrior[i] == Double.NEGATIVE_INFINITY) {
                    continue;
                }
                double candidateTarget = target.logDensity(candidatePrior[i], candidateLikelihood[i])
                        + candidateJacobian[i];
                System.arraycopy(z, i * d, zi, 0, d);
                System.arraycopy(candidateZ, i * d, zNew, 0, d);
                double logRatio = candidateTarget - currentTarget[i] + proposal.logProposalRatio(zi, zNew, scratch);
                random.reset(seed, StreamPurpose.MOVE_ACCEPT, iteration, index[i], step);
                double u = random.nextOpenDouble();
                if (candidateTarget > Double.NEGATIVE_INFINITY && StrictMath.log(u) < logRatio) {
                    accepted++;
                    if (acceptedByRung != null) {
                        acceptedByRung[proposal.rungOf(index[i])]++;
                    }
                    System.arraycopy(candidateZ, i * d, z, i * d, d);
                    System.arraycopy(candidateX, i * d, values, i * d, d);
                    logPrior[i] = candidatePrior[i];
                    logLikelihood[i] = candidateLikelihood[i];
                    currentTarget[i] = candidateTarget;
                }
            }
        }
        return new MoveTally(proposed, accepted, outsidePrior, evaluator.drainTally(), proposedByRung,
                acceptedByRung);
    }
}
