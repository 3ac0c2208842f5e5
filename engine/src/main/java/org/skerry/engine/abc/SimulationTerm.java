package org.skerry.engine.abc;

import java.util.List;
import org.skerry.engine.model.BatchContext;
import org.skerry.engine.model.BatchedSummarySimulator;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.target.LikelihoodTerm;

/**
 * Block side: what an ABC evaluation is to the engine's likelihood evaluator (which keys the
 * simulator's stream, retries, and counts invalid calls): M simulations at a parameter vector,
 * their summaries written where the caller says, and the log mean kernel under the target
 * returned. A non-finite summary is an invalid simulation (an exception naming the summary, so
 * the evaluator reports why). Made on the block, never sent anywhere; not thread-safe.
 */
final class SimulationTerm implements LikelihoodTerm {

    private static final long serialVersionUID = 1L;

    private final transient SummarySimulator simulator;
    private final AbcTarget target;
    private final int count;
    private final transient ParticleBlock block;
    private final transient double[] buffer;
    private final transient double[] one;
    /** Buffer mode: the particle indices of the batch in progress, whose positions are the buffer's slots. */
    private transient long[] batch;
    private transient int batchSize;

    /** Writes each particle's summaries into its own slot of {@code block}'s auxiliary values. */
    static SimulationTerm intoBlock(SummarySimulator simulator, AbcTarget target, ParticleBlock block) {
        return new SimulationTerm(simulator, target, block, null);
    }

    /**
     * Writes the summaries into {@code buffer}: at {@code [0 .. M·s)} for a single call outside a
     * batch, at the particle's position in the batch ({@link #batch}) otherwise.
     */
    static SimulationTerm intoBuffer(SummarySimulator simulator, AbcTarget target, double[] buffer) {
        return new SimulationTerm(simulator, target, null, buffer);
    }

    private SimulationTerm(SummarySimulator simulator, AbcTarget target, ParticleBlock block, double[] buffer) {
        this.simulator = simulator;
        this.target = target;
        this.count = target.observed().length;
        this.block = block;
        this.buffer = buffer;
        this.one = new double[count];
    }

    /** Buffer mode: the next evaluations are of the particles {@code indices[0 .. size)}, slot k for indices[k]. */
    void batch(long[] indices, int size) {
        this.batch = indices;
        this.batchSize = size;
    }

    /** Where the summaries of the particle with global index {@code index} go. */
    private int offset(long index) {
        if (block != null) {
            // Blocks hold contiguous runs of global indices, so the index gives the slot.
            return (int) (index - block.index()[0]) * target.width();
        }
        for (int k = 0; batch != null && k < batchSize; k++) {
            if (batch[k] == index) {
                return k * target.width();
            }
        }
        return 0;
    }

    private double[] out() {
        return block != null ? block.auxiliary() : buffer;
    }

    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        double[] out = out();
        int offset = offset(context.particleIndex());
        simulate(simulator, parameters, context, out, offset, target.simulations(), one);
        return target.logMeanKernel(out, offset);
    }

    /**
     * A batched simulator's one call for {@code n} vectors; a vector it reports failed, or whose
     * summaries are not all finite, gets NaN, so the evaluator simulates it again alone (which
     * names the summary or reason).
     */
    @Override
    public boolean logLikelihoods(Model model, double[] parameters, int n, BatchContext context, double[] kernels) {
        if (!(simulator instanceof BatchedSummarySimulator batched)) {
            return false;
        }
        int width = target.width();
        double[] all = new double[n * width];
        String[] errors = new String[n];
        java.util.Arrays.fill(all, Double.NaN);
        batched.simulateAll(parameters, n, target.simulations(), context, all, errors);
        double[] out = out();
        for (int i = 0; i < n; i++) {
            boolean valid = errors[i] == null;
            for (int k = i * width; valid && k < (i + 1) * width; k++) {
                valid = Double.isFinite(all[k]);
            }
            if (!valid) {
                kernels[i] = Double.NaN;
                continue;
            }
            int offset = block != null ? offset(context.particleIndex(i)) : i * width;
            System.arraycopy(all, i * width, out, offset, width);
            kernels[i] = target.logMeanKernel(out, offset);
        }
        return true;
    }

    /**
     * Runs {@code simulations} simulations one after the other on the context's stream, writing
     * their summaries from {@code out[offset]}; {@code one} is scratch of the summaries' length.
     *
     * @throws IllegalStateException naming the summary when one is not finite (an invalid simulation)
     */
    static void simulate(SummarySimulator simulator, double[] parameters, LikelihoodContext context, double[] out,
            int offset, int simulations, double[] one) {
        int count = one.length;
        for (int m = 0; m < simulations; m++) {
            // NaN first, so a summary the simulator forgot to write is caught, not taken from the last call.
            java.util.Arrays.fill(one, Double.NaN);
            simulator.simulate(parameters, context, one);
            for (int k = 0; k < count; k++) {
                if (!Double.isFinite(one[k])) {
                    List<String> names = simulator.summaryNames();
                    throw new IllegalStateException("simulated summary '" + (k < names.size() ? names.get(k) : "#" + k)
                            + "' was " + (Double.isNaN(one[k]) ? "NaN (or not written)" : one[k]));
                }
            }
            System.arraycopy(one, 0, out, offset + m * count, count);
        }
    }

    @Override
    public boolean wholeLikelihood() {
        return false;
    }
}
