package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.abc.AbcKernel;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.abc.DistanceScales;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.builtin.NormalMeanSimulator;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.target.SequenceSettings;

/**
 * ABC-SMC on the sampler's loop: the same answer whatever the threads and blocks, resumed from any
 * checkpoint, MAD-scaled distances and the Gaussian kernel included; the early ends (acceptance
 * floor, simulation budget) reported with the result kept; a summary without spread refused,
 * naming it.
 */
@org.skerry.engine.Slow
class AbcLoopTest {

    /** Two summaries on very different scales (mean and 100 × the range), so the MAD scaling matters. */
    static final class TwoSummaries implements SummarySimulator {
        private final ParameterSpace space = ParameterSpace.of(List.of("mu", "sigma"),
                List.of(Support.real(), Support.positive()));
        private final Prior prior = IndependentPrior.of(Normal.of(0, 2), org.skerry.engine.model.prior.Gamma.of(2, 2));
        private final boolean constantSecond;

        TwoSummaries(boolean constantSecond) {
            this.constantSecond = constantSecond;
        }

        @Override
        public ParameterSpace parameters() {
            return space;
        }

        @Override
        public Prior prior() {
            return prior;
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new UnsupportedOperationException();
        }

        @Override
        public List<String> summaryNames() {
            return List.of("mean", "range");
        }

        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            double total = 0;
            double low = Double.POSITIVE_INFINITY;
            double high = Double.NEGATIVE_INFINITY;
            for (int j = 0; j < 8; j++) {
                double y = parameters[0] + parameters[1] * context.random().nextNormal();
                total += y;
                low = Math.min(low, y);
                high = Math.max(high, y);
            }
            summaries[0] = total / 8;
            summaries[1] = constantSecond ? 3.0 : 100 * (high - low);
        }

        @Override
        public double[] observedSummaries() {
            return new double[] {0.7, 250.0};
        }
    }

    /**
     * {@link TwoSummaries} with a batched form that loops over the single calls on each vector's
     * stream, and reports every 7th vector of a batch as failed (its single call then succeeds):
     * the sampler must give the unbatched run's bytes and counts.
     */
    static final class BatchedTwo implements org.skerry.engine.model.BatchedSummarySimulator {
        private final TwoSummaries single = new TwoSummaries(false);
        final java.util.concurrent.atomic.AtomicLong batches = new java.util.concurrent.atomic.AtomicLong();
        final java.util.concurrent.atomic.AtomicLong vectors = new java.util.concurrent.atomic.AtomicLong();

        @Override
        public void simulateAll(double[] parameters, int count, int simulations,
                org.skerry.engine.model.BatchContext context, double[] summaries, String[] errors) {
            batches.incrementAndGet();
            vectors.addAndGet(count);
            int d = parameters().dimension();
            double[] x = new double[d];
            double[] one = new double[2];
            for (int i = 0; i < count; i++) {
                if (i % 7 == 3) {
                    errors[i] = "refused in a batch, to be simulated alone";
                    continue;
                }
                org.skerry.engine.random.RandomStream random = context.random(i);
                LikelihoodContext each = new LikelihoodContext() {
                    @Override
                    public org.skerry.engine.random.RandomStream random() {
                        return random;
                    }

                    @Override
                    public long particleIndex() {
                        return 0;
                    }

                    @Override
                    public int iteration() {
                        return context.iteration();
                    }
                };
                System.arraycopy(parameters, i * d, x, 0, d);
                for (int m = 0; m < simulations; m++) {
                    single.simulate(x, each, one);
                    System.arraycopy(one, 0, summaries, (i * simulations + m) * 2, 2);
                }
                errors[i] = null;
            }
        }

        @Override
        public ParameterSpace parameters() {
            return single.parameters();
        }

        @Override
        public Prior prior() {
            return single.prior();
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new UnsupportedOperationException();
        }

        @Override
        public List<String> summaryNames() {
            return single.summaryNames();
        }

        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            single.simulate(parameters, context, summaries);
        }

        @Override
        public double[] observedSummaries() {
            return single.observedSummaries();
        }
    }

    @Test
    @DisplayName("a batched simulator (one call a block for the draw, one a block and step for the moves; some "
            + "vectors refused in the batch and simulated alone): the unbatched run's bytes and counts, M = 2")
    void batchedSimulator() {
        SamplerResult single = run(settings(ADAPTIVE), 2, 0);
        BatchedTwo batched = new BatchedTwo();
        SamplerResult result;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(3, 40)) {
            result = new SmcSampler(settings(ADAPTIVE)).run(batched, backend);
        }
        assertEquals(toleranceLines(single), toleranceLines(result));
        assertArrayEquals(single.particles().values(), result.particles().values());
        assertArrayEquals(single.normalisedWeights(), result.normalisedWeights());
        assertEquals(single.evaluations().evaluations(), result.evaluations().evaluations());
        assertEquals(0, result.evaluations().invalid(), "a vector refused in a batch is not invalid when alone it works");
        assertTrue(batched.batches.get() > 0, "the batched form was used");
        // Blocks of 40 particles: a batch holds up to 40 vectors, so far fewer calls than vectors.
        assertTrue(batched.vectors.get() > 10 * batched.batches.get(), batched.vectors + " vectors in "
                + batched.batches + " calls");
    }

    private static SamplerSettings settings(AbcSettings abc) {
        return SamplerSettings.builder().particles(300).seed(17).targets(SequenceSettings.abc(abc)).build();
    }

    private static final AbcSettings ADAPTIVE = AbcSettings.of(0.4).withSimulations(2);

    static List<String> toleranceLines(SamplerResult result) {
        List<String> lines = new ArrayList<>(SameSeedSameAnswerTest.fingerprint(result));
        for (IterationRecord r : result.iterations()) {
            lines.add(String.valueOf(r.abc()));
        }
        return lines;
    }

    private static SamplerResult run(SamplerSettings settings, int threads, int blockSize) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(threads, blockSize)) {
            return new SmcSampler(settings).run(new TwoSummaries(false), backend);
        }
    }

    @Test
    @DisplayName("MAD-scaled distances, M = 2, uniform and Gaussian kernels: bit-identical on 1 to 7 threads and "
            + "blocks of 1 to 1000 particles")
    void sameAnswerWhateverTheGrouping() {
        for (AbcSettings abc : List.of(ADAPTIVE, ADAPTIVE.withKernel(AbcKernel.GAUSSIAN).withSteps(3))) {
            SamplerResult reference = run(settings(abc), 1, 0);
            assertEquals(0.4, reference.lastTolerance().tolerance(), "reaches the final tolerance");
            assertNull(reference.endedEarly());
            for (int[] layout : new int[][] {{2, 0}, {7, 0}, {2, 1}, {3, 13}, {2, 1000}}) {
                SamplerResult other = run(settings(abc), layout[0], layout[1]);
                String where = abc.kernel() + " on " + layout[0] + " threads, blocks of " + layout[1];
                assertEquals(toleranceLines(reference), toleranceLines(other), where);
                assertArrayEquals(reference.particles().values(), other.particles().values(), where);
                assertArrayEquals(reference.normalisedWeights(), other.normalisedWeights(), where);
            }
        }
    }

    @Test
    @DisplayName("ABC resumed from any iteration's checkpoint, on other threads and blocks: bit-identical")
    void resumesFromEveryCheckpoint() {
        ResumeFromCheckpointTest.resumeFromEvery(settings(ADAPTIVE), new TwoSummaries(false));
    }

    @Test
    @DisplayName("the ESS falls by the set factor, progress grows, simulations are M per evaluation; with fixed "
            + "weights the tolerances fall strictly")
    void tolerancesFall() {
        SamplerResult fixed = run(settings(ADAPTIVE.withWeights(Map.of("mean", 1.0, "range", 0.01))), 2, 0);
        double last = Double.POSITIVE_INFINITY;
        for (IterationRecord r : fixed.iterations()) {
            assertTrue(r.abc().tolerance() < last || r.iteration() == 0, "iteration " + r.iteration());
            last = r.abc().tolerance();
        }
        SamplerResult result = run(settings(ADAPTIVE), 2, 0);
        double progress = -1;
        double before = 300;
        for (IterationRecord r : result.iterations()) {
            assertTrue(r.temperature() > progress, "progress grows");
            progress = r.temperature();
            assertEquals(2 * r.evaluations(), r.abc().simulations(), "M = 2 simulations per evaluation");
            if (r.iteration() > 0 && r.abc().tolerance() > 0.4) {
                // The ESS falls to the factor (0.5) of the last ESS (N after a resampling), or a little
                // above it when tied distances enter together (M = 2: a particle's weight moves in halves).
                assertTrue(r.ess() >= 0.5 * before - 1e-9 && r.ess() <= 0.5 * before + 30,
                        "ESS " + r.ess() + " after " + before + " at iteration " + r.iteration());
            }
            before = r.resampled() ? 300 : r.ess();
        }
        assertEquals(result.simulations(), 2 * result.evaluations().evaluations());
    }

    @Test
    @DisplayName("share rule, factor 0.3, fixed weights, M = 1: each adaptive tolerance keeps the smallest share of "
            + "at least 0.3 of the living simulations within it (continuous summaries: no ties); the same bytes on "
            + "1 and 3 threads")
    void shareRule() {
        AbcSettings abc = AbcSettings.of(0.05).withWeights(Map.of("mean", 1.0, "range", 0.01))
                .withToleranceRule(org.skerry.engine.abc.ToleranceRule.SHARE, 0.3);
        SamplerResult result = run(settings(abc), 1, 0);
        assertEquals(0.05, result.lastTolerance().tolerance(), "reaches the final tolerance");
        int adaptive = 0;
        for (IterationRecord r : result.iterations()) {
            if (r.iteration() > 0 && r.abc().tolerance() > 0.05) {
                adaptive++;
                // With M = 1 and the uniform kernel every living simulation lies within the last
                // tolerance; the next is the smallest distance keeping at least 0.3 of them, so the
                // share is 0.3 up to one simulation among the living (at least 90 of 300 here).
                double share = r.abc().shareWithin();
                assertTrue(share >= 0.3 && share <= 0.3 + 1.0 / 90, "share " + share + " at iteration " + r.iteration());
            }
        }
        assertTrue(adaptive >= 2, "too few adaptive tolerances to check: " + adaptive);
        SamplerResult other = run(settings(abc), 3, 13);
        assertEquals(toleranceLines(result), toleranceLines(other), "3 threads, blocks of 13");
        assertArrayEquals(result.particles().values(), other.particles().values());
    }

    @Test
    @DisplayName("adaptive ABC steps at sampler.abc.max-steps are counted and warned about, naming that key and no "
            + "evidence; fixed steps are never counted")
    void stepCap() {
        SamplerResult capped = run(settings(ADAPTIVE.withMaxSteps(2)), 2, 0);
        int expected = 0;
        for (IterationRecord r : capped.iterations()) {
            assertTrue(r.mhSteps() <= 2, "steps " + r.mhSteps() + " over the cap");
            if (r.iteration() > 0 && r.mhSteps() == 2) {
                expected++;
            }
        }
        assertTrue(expected > 0, "no iteration reached a cap of 2: the check would be empty");
        assertEquals(expected, capped.stepCap().iterationsAtCap());
        assertEquals(capped.iterations().size() - 1, capped.stepCap().iterations());
        assertEquals(2, capped.stepCap().maxSteps());
        String warning = capped.stepCap().warning();
        assertTrue(warning.contains("sampler.abc.max-steps") && !warning.contains("evidence"), warning);
        SamplerResult fixed = run(settings(ADAPTIVE.withSteps(2).withMaxSteps(2)), 2, 0);
        assertEquals(0, fixed.stepCap().iterationsAtCap(), "fixed steps are not capped");
        assertNull(fixed.stepCap().warning());
    }

    /** A coin: one summary, 0 or 1 (heads with probability Φ(mu)); observed 0.5, so every distance is 0.5. */
    static final class Coin implements SummarySimulator {
        private final ParameterSpace space = ParameterSpace.of(List.of("mu"), List.of(Support.real()));
        private final Prior prior = IndependentPrior.of(Normal.of(0, 1));

        @Override
        public ParameterSpace parameters() {
            return space;
        }

        @Override
        public Prior prior() {
            return prior;
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new UnsupportedOperationException();
        }

        @Override
        public List<String> summaryNames() {
            return List.of("coin");
        }

        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            summaries[0] = parameters[0] + context.random().nextNormal() > 0 ? 1.0 : 0.0;
        }

        @Override
        public double[] observedSummaries() {
            return new double[] {0.5};
        }
    }

    @Test
    @DisplayName("a tolerance that cannot fall (every distance 0.5, final tolerance 0.1): the run ends early at "
            + "tolerance 0.5, says why, and keeps the result")
    void stalledToleranceEndsEarly() {
        SamplerSettings settings = settings(AbcSettings.of(0.1).withWeights(Map.of("coin", 1.0)));
        SamplerResult result;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            result = new SmcSampler(settings).run(new Coin(), backend);
        }
        assertNotNull(result.endedEarly());
        assertTrue(result.endedEarly().contains("cannot fall below 0.5") && result.endedEarly().contains("0.1 was not "
                + "reached"), result.endedEarly());
        assertEquals(0.5, result.lastTolerance().tolerance(), "the last tolerance reached");
        assertEquals(2, result.iterations().size(), "the prior draw, then tolerance 0.5; the next could not start");
        assertEquals(300, result.particles().size(), "the population is kept");
    }

    @Test
    @DisplayName("a simulation budget ends the run early, says why, and keeps the result")
    void budgetEndsEarly() {
        SamplerResult result = run(settings(AbcSettings.of(1e-6).withStops(0, 20_000)), 2, 0);
        assertNotNull(result.endedEarly());
        assertTrue(result.endedEarly().contains("budget of 20000 simulations"), result.endedEarly());
        assertTrue(result.simulations() >= 20_000, "stops once the budget is spent");
        assertTrue(result.lastTolerance().tolerance() > 1e-6, "the final tolerance is not reached");
        assertEquals(300, result.particles().size(), "the population is kept");
    }

    @Test
    @DisplayName("an acceptance floor ends the run early and names the acceptance")
    void acceptanceFloorEndsEarly() {
        SamplerResult result = run(settings(AbcSettings.of(1e-6).withStops(0.2, 0)), 2, 0);
        assertNotNull(result.endedEarly());
        assertTrue(result.endedEarly().contains("under the floor 0.2"), result.endedEarly());
        IterationRecord last = result.iterations().get(result.iterations().size() - 1);
        assertTrue(last.acceptanceRate() < 0.2, "the last acceptance is under the floor: " + last.acceptanceRate());
        for (IterationRecord r : result.iterations().subList(1, result.iterations().size() - 1)) {
            assertTrue(r.acceptanceRate() >= 0.2, "it went on while the acceptance was above the floor");
        }
    }

    @Test
    @DisplayName("a summary without spread is refused at the first scale estimate, named")
    void zeroSpread() {
        SamplerSettings settings = settings(ADAPTIVE);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            DistanceScales.ZeroSpreadException e = assertThrows(DistanceScales.ZeroSpreadException.class,
                    () -> new SmcSampler(settings).run(new TwoSummaries(true), backend));
            assertEquals("range", e.summary());
            assertTrue(e.getMessage().contains("no spread"), e.getMessage());
        }
    }

    @Test
    @DisplayName("observed summaries and weights by name: an unknown or missing name is refused, named")
    void namesChecked() {
        NormalMeanSimulator model = NormalMeanSimulator.of(new double[] {1, 2}, 1, 0, 1);
        IllegalArgumentException unknown = assertThrows(IllegalArgumentException.class, () -> SequenceSettings.abc(
                AbcSettings.of(0.1).withWeights(Map.of("average", 1.0))).create(model, null, 1, 0));
        assertTrue(unknown.getMessage().contains("'average'") && unknown.getMessage().contains("[mean]"),
                unknown.getMessage());
        IllegalArgumentException missing = assertThrows(IllegalArgumentException.class, () -> SequenceSettings.abc(
                AbcSettings.of(0.1).withObserved(Map.of())).create(model, null, 1, 0));
        assertTrue(missing.getMessage().contains("missing for summary 'mean'"), missing.getMessage());
    }
}
