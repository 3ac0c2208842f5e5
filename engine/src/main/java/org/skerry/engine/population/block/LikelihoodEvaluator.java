package org.skerry.engine.population.block;

import org.skerry.engine.model.BatchedModel;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Executor side: calls a model's log-likelihood for one particle at a time, turning NaN,
 * {@code +Infinity} and exceptions into {@code -Infinity} and counting them, so an invalid
 * evaluation never reaches a sum. Hands stochastic simulators their keyed random stream.
 *
 * <p>One instance per worker thread (it reuses its context and stream); not thread-safe.
 */
public final class LikelihoodEvaluator implements LikelihoodContext {

    private final Model model;
    private final long seed;
    private final RandomStream simulatorStream;
    private long particleIndex;
    private int iteration;
    private int step;
    private boolean streamReady;

    private long evaluations;
    private long zeroLikelihood;
    private long invalid;
    private long firstInvalidIndex = -1;
    private String firstInvalidReason;
    private double[] firstInvalidParameters;

    public LikelihoodEvaluator(Model model, long seed) {
        this.model = model;
        this.seed = seed;
        this.simulatorStream = new RandomStream(seed, StreamPurpose.SIMULATOR, 0, 0, 0);
    }

    public Model model() {
        return model;
    }

    /**
     * The log-likelihood at {@code parameters} for the particle with global index
     * {@code particleIndex}, or {@code -Infinity} if the evaluation is invalid (counted).
     */
    public double evaluate(double[] parameters, long particleIndex, int iteration, int step) {
        this.particleIndex = particleIndex;
        this.iteration = iteration;
        this.step = step;
        this.streamReady = false;
        evaluations++;
        double value;
        String reason;
        try {
            value = model.logLikelihood(parameters, this);
            if (value == Double.NEGATIVE_INFINITY) {
                zeroLikelihood++;
                return value;
            }
            if (!Double.isNaN(value) && value != Double.POSITIVE_INFINITY) {
                return value;
            }
            reason = Double.isNaN(value) ? "log-likelihood was NaN" : "log-likelihood was +Infinity";
        } catch (RuntimeException | StackOverflowError e) {
            reason = e.getClass().getName() + (e.getMessage() == null ? "" : ": " + e.getMessage());
        }
        recordInvalid(parameters, particleIndex, reason);
        return Double.NEGATIVE_INFINITY;
    }

    /**
     * Evaluates a block of parameter vectors with the model's batched form when it has one, else
     * one by one; {@code indices} gives each vector's global particle index.
     */
    public void evaluateAll(double[] parameters, int count, long[] indices, int iteration, int step,
            double[] out, double[] scratch) {
        if (model instanceof BatchedModel && count > 0) {
            try {
                ((BatchedModel) model).logLikelihoods(parameters, count, out);
                boolean allValid = true;
                for (int i = 0; i < count; i++) {
                    allValid &= !Double.isNaN(out[i]) && out[i] != Double.POSITIVE_INFINITY;
                }
                if (allValid) {
                    evaluations += count;
                    for (int i = 0; i < count; i++) {
                        if (out[i] == Double.NEGATIVE_INFINITY) {
                            zeroLikelihood++;
                        }
                    }
                    return;
                }
            } catch (RuntimeException e) {
                // fall through: single calls find and report the failing particles
            }
        }
        int d = model.dimension();
        for (int i = 0; i < count; i++) {
            System.arraycopy(parameters, i * d, scratch, 0, d);
            out[i] = evaluate(scratch, indices[i], iteration, step);
        }
    }

    private void recordInvalid(double[] parameters, long index, String reason) {
        invalid++;
        if (firstInvalidIndex < 0 || index < firstInvalidIndex) {
            firstInvalidIndex = index;
            firstInvalidReason = reason;
            firstInvalidParameters = parameters.clone();
        }
    }

    /** Counts since construction or the last call, then resets them. */
    public EvaluationTally drainTally() {
        EvaluationTally tally = new EvaluationTally(evaluations, zeroLikelihood, invalid, firstInvalidIndex,
                firstInvalidReason, firstInvalidParameters);
        evaluations = 0;
        zeroLikelihood = 0;
        invalid = 0;
        firstInvalidIndex = -1;
        firstInvalidReason = null;
        firstInvalidParameters = null;
        return tally;
    }

    @Override
    public RandomStream random() {
        if (!streamReady) {
            simulatorStream.reset(seed, StreamPurpose.SIMULATOR, iteration, particleIndex, step);
            streamReady = true;
        }
        return simulatorStream;
    }

    @Override
    public long particleIndex() {
        return particleIndex;
    }

    @Override
    public int iteration() {
        return iteration;
    }
}
