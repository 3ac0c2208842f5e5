package org.skerry.engine.population.block;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.BatchedModel;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/** Retries with a restarted random stream, and the batched path's fall-back to single calls. */
class LikelihoodEvaluatorTest {

    /** A one-parameter model with a standard normal prior. */
    private abstract static class OneParameter implements Model {
        @Override
        public ParameterSpace parameters() {
            return ParameterSpace.real("x", 1);
        }

        @Override
        public Prior prior() {
            return IndependentPrior.of(Normal.of(0, 1));
        }
    }

    /** Records the first simulator number each call sees; fails the first {@code failures} calls. */
    private static class Recording extends OneParameter {
        final List<Double> seen = new ArrayList<>();
        int failures;
        int calls;

        Recording(int failures) {
            this.failures = failures;
        }

        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            calls++;
            seen.add(context.random().nextDouble());
            context.random().nextDouble();
            if (calls <= failures) {
                if (calls % 2 == 0) {
                    return Double.NaN;
                }
                throw new IllegalStateException("call " + calls);
            }
            return -x[0] * x[0];
        }
    }

    @Test
    @DisplayName("each retry sees the simulator stream from its start; a success after retries is counted as retried")
    void retrySeesTheSameStream() {
        Recording model = new Recording(2);
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 5, 2);
        assertEquals(-4.0, evaluator.evaluate(new double[] {2}, 9, 3, 1));
        double expected = new RandomStream(5, StreamPurpose.SIMULATOR, 3, 9, 1).nextDouble();
        assertEquals(List.of(expected, expected, expected), model.seen);
        EvaluationTally tally = evaluator.drainTally();
        assertEquals(1, tally.evaluations());
        assertEquals(0, tally.invalid());
        assertEquals(1, tally.retried());
        assertEquals(0, tally.failedAfterRetries());
        assertEquals(0, evaluator.drainTally().retried(), "draining resets the counts");
    }

    @Test
    @DisplayName("an evaluation still failing after its retries is invalid, with the last reason and the retry count")
    void failingAfterRetries() {
        Recording model = new Recording(Integer.MAX_VALUE);
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 5, 2);
        assertEquals(Double.NEGATIVE_INFINITY, evaluator.evaluate(new double[] {0.5}, 4, 1, 0));
        assertEquals(3, model.calls);
        EvaluationTally tally = evaluator.drainTally();
        assertEquals(1, tally.invalid());
        assertEquals(1, tally.retried());
        assertEquals(1, tally.failedAfterRetries());
        assertEquals(4, tally.firstInvalidIndex());
        assertEquals("java.lang.IllegalStateException: call 3 (and again on 2 retries)", tally.firstInvalidReason());
        assertArrayEquals(new double[] {0.5}, tally.firstInvalidParameters());

        Recording once = new Recording(Integer.MAX_VALUE);
        LikelihoodEvaluator plain = new LikelihoodEvaluator(once, 5);
        plain.evaluate(new double[] {0.5}, 4, 1, 0);
        assertEquals(1, once.calls, "no retries by default");
        EvaluationTally counted = plain.drainTally();
        assertEquals(1, counted.invalid());
        assertEquals(0, counted.retried());
        assertEquals("java.lang.IllegalStateException: call 1", counted.firstInvalidReason());
        assertThrows(IllegalArgumentException.class, () -> new LikelihoodEvaluator(once, 5, -1));
    }

    /** A batched model that returns NaN for x < 0 in a batch and throws for a batch holding x > 10. */
    private static final class Batched extends OneParameter implements BatchedModel {
        int singleCalls;

        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            singleCalls++;
            return x[0] < 0 ? Double.NaN : x[0] == 0 ? Double.NEGATIVE_INFINITY : -x[0];
        }

        @Override
        public void logLikelihoods(double[] parameters, int count, double[] out) {
            for (int i = 0; i < count; i++) {
                if (parameters[i] > 10) {
                    throw new IllegalStateException("batch solver failed");
                }
                out[i] = parameters[i] < 0 ? Double.NaN : parameters[i] == 0 ? Double.NEGATIVE_INFINITY : -parameters[i];
            }
        }
    }

    @Test
    @DisplayName("batched model: only the vectors a batch returned invalid are called again singly; a throwing batch falls back whole")
    void batchedFallBack() {
        Batched model = new Batched();
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 1, 1);
        double[] out = new double[4];
        evaluator.evaluateAll(new double[] {1, -2, 0, -3}, 4, new long[] {10, 11, 12, 13}, 1, 0, out, new double[1]);
        assertArrayEquals(new double[] {-1, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY},
                out);
        assertEquals(4, model.singleCalls, "two invalid vectors, each called once and retried once");
        EvaluationTally tally = evaluator.drainTally();
        assertEquals(4, tally.evaluations());
        assertEquals(1, tally.zeroLikelihood());
        assertEquals(2, tally.invalid());
        assertEquals(2, tally.retried());
        assertEquals(2, tally.failedAfterRetries());
        assertEquals(11, tally.firstInvalidIndex());

        model.singleCalls = 0;
        evaluator.evaluateAll(new double[] {11, 2}, 2, new long[] {0, 1}, 1, 0, out, new double[1]);
        assertEquals(2, model.singleCalls);
        assertEquals(-11, out[0]);
        assertEquals(-2, out[1]);
        EvaluationTally fallBack = evaluator.drainTally();
        assertEquals(2, fallBack.evaluations());
        assertEquals(0, fallBack.invalid());
        assertEquals(0, fallBack.retried(), "a single call after a failed batch is a first attempt");
    }
}
