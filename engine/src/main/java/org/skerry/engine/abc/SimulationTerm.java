package org.skerry.engine.abc;

import java.util.List;
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

    /** Writes each particle's summaries into its own slot of {@code block}'s auxiliary values. */
    static SimulationTerm intoBlock(SummarySimulator simulator, AbcTarget target, ParticleBlock block) {
        return new SimulationTerm(simulator, target, block, null);
    }

    /** Writes the summaries into {@code buffer[0 .. M·s)}. */
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

    @Override
    public double logLikelihood(Model model, double[] parameters, LikelihoodContext context) {
        double[] out;
        int offset;
        if (block != null) {
            // Blocks hold contiguous runs of global indices, so the index gives the slot.
            out = block.auxiliary();
            offset = (int) (context.particleIndex() - block.index()[0]) * target.width();
        } else {
            out = buffer;
            offset = 0;
        }
        simulate(simulator, parameters, context, out, offset, target.simulations(), one);
        return target.logMeanKernel(out, offset);
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
