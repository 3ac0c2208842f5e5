package org.skerry.engine.population.block;

import org.skerry.engine.model.BatchContext;
import org.skerry.engine.model.BatchedModel;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.target.LikelihoodTerm;
import org.skerry.engine.target.Target;

/**
 * Executor side: calls a model's log-likelihood for one particle at a time, turning NaN,
 * {@code +Infinity} and exceptions into {@code -Infinity} and counting them, so an invalid
 * evaluation never reaches a sum. Hands stochastic simulators their keyed random stream.
 *
 * <p>With {@code retries > 0} an invalid call is repeated up to that many times before it counts
 * as invalid, for models that fail for reasons of their own (a solver that gives up on a busy node,
 * a simulator service that drops a request). Every retry sees the same random stream from its
 * start, so a stochastic simulator that failed because of the numbers it drew fails again the
 * same way, and a retry never changes the answer of a model that did not fail.
 *
 * <p>One instance per worker thread (it reuses its context and stream); not thread-safe.
 */
public final class LikelihoodEvaluator implements LikelihoodContext, BatchContext {

    private final Model model;
    private final long seed;
    private final RandomStream simulatorStream;
    private final int retries;
    private final LikelihoodTerm term;
    private long particleIndex;
    private int iteration;
    private int step;
    private boolean streamReady;
    /** The particle indices of the batch in progress ({@link BatchContext}). */
    private long[] batchIndices;

    private long evaluations;
    private long zeroLikelihood;
    private long invalid;
    private long firstInvalidIndex = -1;
    private String firstInvalidReason;
    private double[] firstInvalidParameters;
    private long retried;
    private long failedAfterRetries;

    /** An evaluator that never retries. */
    public LikelihoodEvaluator(Model model, long seed) {
        this(model, seed, 0);
    }

    /** An evaluator of the whole likelihood that repeats an invalid call up to {@code retries} times. */
    public LikelihoodEvaluator(Model model, long seed, int retries) {
        this(model, seed, retries, null);
    }

    /**
     * An evaluator of {@code term} (the whole likelihood when null) that repeats an invalid call
     * up to {@code retries} times.
     */
    public LikelihoodEvaluator(Model model, long seed, int retries, LikelihoodTerm term) {
        if (retries < 0) {
            throw new IllegalArgumentException("retries must be >= 0, was " + retries);
        }
        this.model = model;
        this.seed = seed;
        this.retries = retries;
        this.term = term;
        this.simulatorStream = new RandomStream(seed, StreamPurpose.SIMULATOR, 0, 0, 0);
    }

    public Model model() {
        return model;
    }

    /** Whether the evaluations are of a target that does not use the likelihood yet (nothing observed). */
    public boolean nothingToEvaluate() {
        return term instanceof Target target && !target.usesLikelihood();
    }

    /**
     * The log-likelihood at {@code parameters} for the particle with global index
     * {@code particleIndex}, or {@code -Infinity} if the evaluation is invalid (counted).
     */
    public double evaluate(double[] parameters, long particleIndex, int iteration, int step) {
        this.particleIndex = particleIndex;
        this.iteration = iteration;
        this.step = step;
        evaluations++;
        String reason = null;
        for (int attempt = 0; attempt <= retries; attempt++) {
            // Each attempt restarts the simulator stream, so a retry sees the numbers the first call saw.
            this.streamReady = false;
            try {
                double value = term == null || term.wholeLikelihood() ? model.logLikelihood(parameters, this)
                        : term.logLikelihood(model, parameters, this);
                if (!Double.isNaN(value) && value != Double.POSITIVE_INFINITY) {
                    if (attempt > 0) {
                        retried++;
                    }
                    if (value == Double.NEGATIVE_INFINITY) {
                        zeroLikelihood++;
                    }
                    return value;
                }
                reason = Double.isNaN(value) ? "log-likelihood was NaN" : "log-likelihood was +Infinity";
            } catch (RuntimeException | StackOverflowError e) {
                reason = e.getClass().getName() + (e.getMessage() == null ? "" : ": " + e.getMessage());
            }
        }
        if (retries > 0) {
            retried++;
            failedAfterRetries++;
            reason += " (and again on " + retries + (retries == 1 ? " retry)" : " retries)");
        }
        recordInvalid(parameters, particleIndex, reason);
        return Double.NEGATIVE_INFINITY;
    }

    /**
     * Evaluates a block of parameter vectors with the model's batched form when it has one, else
     * one by one; {@code indices} gives each vector's global particle index. When a batch call
     * returns invalid values, only those vectors are evaluated again one by one (with retries, and
     * reported); when it throws, every vector is. A batched model is deterministic, so its valid
     * values equal the single calls' and the counts do not depend on how particles are grouped.
     * It receives this evaluator as its {@link BatchContext}: vector {@code i}'s stream is the one
     * its single call would get.
     */
    public void evaluateAll(double[] parameters, int count, long[] indices, int iteration, int step,
            double[] out, double[] scratch) {
        int d = model.dimension();
        boolean batched = false;
        if ((term == null || term.wholeLikelihood()) && model instanceof BatchedModel && count > 0) {
            try {
                this.iteration = iteration;
                this.step = step;
                this.batchIndices = indices;
                ((BatchedModel) model).logLikelihoods(parameters, count, (BatchContext) this, out);
                batched = true;
            } catch (RuntimeException e) {
                // fall through: single calls find and report the failing particles
            } finally {
                batchIndices = null;
            }
        } else if (term != null && !term.wholeLikelihood() && count > 0) {
            try {
                this.iteration = iteration;
                this.step = step;
                this.batchIndices = indices;
                batched = term.logLikelihoods(model, parameters, count, this, out);
            } catch (RuntimeException e) {
                batched = false;
            } finally {
                batchIndices = null;
            }
        }
        for (int i = 0; i < count; i++) {
            if (batched && !Double.isNaN(out[i]) && out[i] != Double.POSITIVE_INFINITY) {
                evaluations++;
                if (out[i] == Double.NEGATIVE_INFINITY) {
                    zeroLikelihood++;
                }
                continue;
            }
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
                firstInvalidReason, firstInvalidParameters, retried, failedAfterRetries);
        retried = 0;
        failedAfterRetries = 0;
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
    public long particleIndex(int i) {
        return batchIndex(i);
    }

    @Override
    public RandomStream random(int i) {
        streamReady = false;
        return simulatorStream.reset(seed, StreamPurpose.SIMULATOR, iteration, batchIndex(i), step);
    }

    private long batchIndex(int i) {
        if (batchIndices == null) {
            throw new IllegalStateException("no batch is being evaluated");
        }
        return batchIndices[i];
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
