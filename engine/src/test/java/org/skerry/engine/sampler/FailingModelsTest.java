package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.reference.TruncatedNormalExact;

/**
 * Models that fail for some parameters: the posterior is the one conditional on where the model
 * works, the failures are counted and reported, retries of a flaky model change nothing, and the
 * invalid-fraction limit stops a run at the right iteration. Statistical tolerances are four
 * standard errors of the estimate replicated over seeds, as in {@link SamplerAccuracyTest}.
 */
class FailingModelsTest {

    private static final int SEEDS = 20;
    private static final double Z = 4.0;

    private static final double[][] DATA = SyntheticData.normalRows(11, 20, new double[] {1.5}, 2.0);
    private static final NormalMeanModel NORMAL = NormalMeanModel.of(DATA, 2.0, 0.0, 3.0);
    private static final NormalMeanExact EXACT = new NormalMeanExact(DATA, 2.0, 0.0, 3.0);

    /** How a {@link Fails} model fails outside its working region. */
    enum Failure { THROWS_ABOVE, NAN_BELOW }

    /** A model on the parameters and prior of the normal-mean model. */
    abstract static class OnNormalPrior implements Model {
        @Override
        public ParameterSpace parameters() {
            return NORMAL.parameters();
        }

        @Override
        public Prior prior() {
            return NORMAL.prior();
        }
    }

    /** The normal-mean model that throws above {@code cut} or returns NaN below it. */
    static final class Fails extends OnNormalPrior {
        final Failure failure;
        final double cut;

        Fails(Failure failure, double cut) {
            this.failure = failure;
            this.cut = cut;
        }

        boolean fails(double theta) {
            return failure == Failure.THROWS_ABOVE ? theta > cut : theta < cut;
        }

        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            if (failure == Failure.THROWS_ABOVE && x[0] > cut) {
                throw new IllegalStateException("solver diverged at " + x[0]);
            }
            if (failure == Failure.NAN_BELOW && x[0] < cut) {
                return Double.NaN;
            }
            return NORMAL.logLikelihood(x, context);
        }
    }

    private static SamplerResult run(Model model, SamplerSettings settings, int threads, int blockSize) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(threads, blockSize)) {
            return new SmcSampler(settings).run(model, backend);
        }
    }

    private static void assertWithin(double expected, SummaryStatistics replicated, String what) {
        double error = Z * replicated.getStandardDeviation() / Math.sqrt(replicated.getN());
        assertEquals(expected, replicated.getMean(), error, what + " (4 standard errors = " + error + ")");
    }

    @ParameterizedTest
    @EnumSource(Failure.class)
    @DisplayName("a model failing in part of the prior: the posterior is the truncated normal (JKB 1994 §13.10), "
            + "the evidence the untruncated one times the kept mass")
    void posteriorIsTruncated(Failure failure) {
        double m = EXACT.posteriorMean(0);
        double s = Math.sqrt(EXACT.posteriorVariance());
        // Cut half a posterior sd beside the mean: about 31 % of the untruncated posterior is lost.
        double cut = failure == Failure.THROWS_ABOVE ? m + 0.5 * s : m - 0.5 * s;
        TruncatedNormalExact truncated = failure == Failure.THROWS_ABOVE
                ? new TruncatedNormalExact(m, s, Double.NEGATIVE_INFINITY, cut)
                : new TruncatedNormalExact(m, s, cut, Double.POSITIVE_INFINITY);
        Fails model = new Fails(failure, cut);
        // The prior puts far more than the default 10 % beyond the cut: the limit is lifted here.
        SamplerSettings base = SamplerSettings.builder().particles(1000).maxInvalidFraction(1.0).build();
        SummaryStatistics mean = new SummaryStatistics();
        SummaryStatistics sd = new SummaryStatistics();
        SummaryStatistics logZ = new SummaryStatistics();
        for (int k = 0; k < SEEDS; k++) {
            SamplerResult result = run(model, base.toBuilder().seed(500 + 31L * k).build(), 2, 0);
            mean.addValue(result.parameters().get(0).mean());
            sd.addValue(result.parameters().get(0).sd());
            logZ.addValue(result.evidence().logEvidence());
            assertTrue(result.evaluations().invalid() > 0);
            for (int i = 0; i < result.particles().size(); i++) {
                assertTrue(result.normalisedWeights()[i] == 0 || !model.fails(result.particles().value(i, 0)));
            }
            for (IterationRecord r : result.iterations()) {
                if (r.invalidEvaluations() > 0) {
                    assertTrue(model.fails(r.firstInvalidParameters().get(0)), r.toString());
                    String expected = failure == Failure.THROWS_ABOVE ? "solver diverged" : "NaN";
                    assertTrue(r.firstInvalidReason().contains(expected), r.firstInvalidReason());
                } else {
                    assertEquals(List.of(), r.firstInvalidParameters());
                }
            }
        }
        assertWithin(truncated.mean(), mean, "posterior mean");
        assertWithin(truncated.sd(), sd, "posterior sd");
        double error = Z * logZ.getStandardDeviation() / Math.sqrt(logZ.getN());
        assertEquals(EXACT.logEvidence() + Math.log(truncated.mass()), logZ.getMean() + 0.5 * logZ.getVariance(), error,
                "mean(log Z) + Var/2 against log Z + log(kept mass) (4 standard errors = " + error + ")");
        assertTrue(Math.abs(Math.log(truncated.mass())) > 4 * error, "the truncation must be visible in the evidence");
    }

    @Test
    @DisplayName("the initial draw's invalid count and lowest failing particle match a recount of the prior draws")
    void initialCountsAndFirstFailure() {
        Fails model = new Fails(Failure.THROWS_ABOVE, 2.0);
        long seed = 77;
        SamplerResult result = run(model, SamplerSettings.builder().particles(400).seed(seed).maxInvalidFraction(1.0)
                .build(), 3, 17);
        long invalid = 0;
        long lowest = -1;
        double lowestValue = Double.NaN;
        double[] x = new double[1];
        for (int i = 0; i < 400; i++) {
            model.prior().sample(new RandomStream(seed, StreamPurpose.INITIAL_DRAW, 0, i, 0), x);
            if (x[0] > 2.0) {
                invalid++;
                if (lowest < 0) {
                    lowest = i;
                    lowestValue = x[0];
                }
            }
        }
        IterationRecord initial = result.iterations().get(0);
        assertTrue(invalid > 0);
        assertEquals(invalid, initial.invalidEvaluations());
        assertEquals(lowest, initial.firstInvalidIndex());
        assertEquals(List.of(lowestValue), initial.firstInvalidParameters());
        assertEquals(0, initial.retriedEvaluations());
        assertEquals(lowest, result.evaluations().firstInvalidIndex());
        long total = 0;
        for (IterationRecord r : result.iterations()) {
            total += r.invalidEvaluations();
        }
        assertEquals(total, result.evaluations().invalid());
    }

    @Test
    @DisplayName("a model that fails everywhere stops at the initial draw, naming count, fraction, limit and first failure")
    void failsEverywhere() {
        Model hopeless = new Fails(Failure.THROWS_ABOVE, Double.NEGATIVE_INFINITY);
        InvalidEvaluationsException e = assertThrows(InvalidEvaluationsException.class,
                () -> run(hopeless, SamplerSettings.builder().particles(100).seed(4).build(), 2, 0));
        double[] x = new double[1];
        hopeless.prior().sample(new RandomStream(4, StreamPurpose.INITIAL_DRAW, 0, 0, 0), x);
        assertEquals(0, e.iteration());
        assertEquals(100, e.invalid());
        assertEquals(100, e.evaluations());
        assertEquals(1.0, e.fraction());
        assertEquals(0.1, e.limit());
        assertEquals(0, e.firstInvalidIndex());
        assertEquals(java.util.Map.of("mu", x[0]), e.firstInvalidParameters());
        String message = e.getMessage();
        for (String part : List.of("iteration 0", "100 of 100", "100.0 %", "limit of 0.1", "maxInvalidFraction",
                "particle 0 at mu=" + x[0], "solver diverged")) {
            assertTrue(message.contains(part), "'" + part + "' in: " + message);
        }
        assertTrue(e instanceof SamplingFailedException);
    }

    /** Near the cut the likelihood piles the particles up against it, so moves fail more as φ grows. */
    private static final class Crowding extends OnNormalPrior {
        private final Fails inner = new Fails(Failure.THROWS_ABOVE, 2.6);

        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            inner.logLikelihood(x, context);
            double r = (x[0] - 2.5) / 0.3;
            return -0.5 * r * r;
        }
    }

    @Test
    @DisplayName("the invalid-fraction limit stops the run at the first iteration above it, with that iteration's counts")
    void limitStopsAtTheRightIteration() {
        SamplerSettings unlimited = SamplerSettings.builder().particles(500).seed(12).maxInvalidFraction(1.0).build();
        SamplerResult free = run(new Crowding(), unlimited, 2, 0);
        List<IterationRecord> records = free.iterations();
        double first = fraction(records.get(0));
        double most = 0;
        for (IterationRecord r : records.subList(1, records.size())) {
            most = Math.max(most, fraction(r));
        }
        assertTrue(most > first, "test design: moves must fail more often than the initial draw");
        double limit = (first + most) / 2;
        int expected = -1;
        for (IterationRecord r : records) {
            if (fraction(r) > limit) {
                expected = r.iteration();
                break;
            }
        }
        assertTrue(expected > 0);
        IterationRecord at = records.get(expected);
        InvalidEvaluationsException e = assertThrows(InvalidEvaluationsException.class,
                () -> run(new Crowding(), unlimited.toBuilder().maxInvalidFraction(limit).build(), 3, 7));
        assertEquals(expected, e.iteration());
        assertEquals(at.invalidEvaluations(), e.invalid());
        assertEquals(at.evaluations(), e.evaluations());
        assertEquals(at.firstInvalidIndex(), e.firstInvalidIndex());
        assertEquals(at.firstInvalidParameters(), List.copyOf(e.firstInvalidParameters().values()));
        assertTrue(e.getMessage().startsWith("iteration " + expected + ": "), e.getMessage());
        assertTrue(e.getMessage().contains("limit of " + limit), e.getMessage());
    }

    private static double fraction(IterationRecord r) {
        return (double) r.invalidEvaluations() / r.evaluations();
    }

    /** A stochastic simulator: the normal-mean likelihood plus noise drawn from its stream. */
    static class Noisy extends OnNormalPrior {
        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            double noise = context.random().nextNormal();
            check(noise);
            return NORMAL.logLikelihood(x, context) + 0.05 * noise + 0.01 * context.random().nextNormal();
        }

        void check(double noise) {
        }
    }

    /**
     * Fails on the first call of an evaluation whose first noise draw exceeds 2 in size (about
     * 4.6 % of them), after drawing it, and succeeds when the same draw comes again.
     */
    static final class Flaky extends Noisy {
        private final Set<Long> seen = ConcurrentHashMap.newKeySet();

        @Override
        void check(double noise) {
            if (Math.abs(noise) > 2 && seen.add(Double.doubleToRawLongBits(noise))) {
                throw new IllegalStateException("simulator node busy");
            }
        }
    }

    private static List<String> fingerprint(SamplerResult result) {
        List<String> lines = new ArrayList<>();
        lines.add(Double.toHexString(result.evidence().logEvidence()));
        for (IterationRecord r : result.iterations()) {
            lines.add(r.iteration() + " " + Double.toHexString(r.temperature()) + " " + Double.toHexString(r.ess())
                    + " " + Double.toHexString(r.acceptanceRate()) + " " + r.mhSteps() + " " + r.evaluations());
        }
        return lines;
    }

    @Test
    @DisplayName("a flaky simulator with one retry gives bit for bit the answer of the same simulator that never fails")
    void retriesOfAFlakySimulator() {
        long seed = 21;
        SamplerSettings settings = SamplerSettings.builder().particles(300).seed(seed).maxInvalidFraction(1.0).build();
        SamplerResult steady = run(new Noisy(), settings, 2, 0);
        SamplerResult retried = run(new Flaky(), settings.toBuilder().evaluationRetries(1).build(), 3, 11);
        assertEquals(fingerprint(steady), fingerprint(retried));
        assertArrayEquals(steady.particles().values(), retried.particles().values());
        assertArrayEquals(steady.normalisedWeights(), retried.normalisedWeights());
        assertEquals(0, retried.evaluations().invalid());
        assertEquals(0, retried.evaluations().failedAfterRetries());
        assertTrue(retried.evaluations().retried() > 0);

        // Recount the first calls that fail, from the simulator streams of the initial draw.
        long failing = 0;
        long lowest = -1;
        for (int i = 0; i < 300; i++) {
            if (Math.abs(new RandomStream(seed, StreamPurpose.SIMULATOR, 0, i, 0).nextNormal()) > 2) {
                failing++;
                lowest = lowest < 0 ? i : lowest;
            }
        }
        assertTrue(failing > 0);
        assertEquals(failing, retried.iterations().get(0).retriedEvaluations());
        assertEquals(0, retried.iterations().get(0).failedAfterRetries());

        SamplerResult counted = run(new Flaky(), settings, 2, 0);
        IterationRecord initial = counted.iterations().get(0);
        assertEquals(failing, initial.invalidEvaluations());
        assertEquals(lowest, initial.firstInvalidIndex());
        assertTrue(initial.firstInvalidReason().contains("simulator node busy"), initial.firstInvalidReason());
        assertEquals(0, counted.evaluations().retried());
        assertNotEquals(fingerprint(steady), fingerprint(counted), "without retries the failures change the answer");
    }

    @Test
    @DisplayName("a simulator that fails for the numbers it drew fails again on every retry: counted as still invalid")
    void retriesOfADeterministicFailure() {
        Model model = new Noisy() {
            @Override
            void check(double noise) {
                if (noise > 2.5) {
                    throw new IllegalStateException("unstable for this draw");
                }
            }
        };
        SamplerSettings settings = SamplerSettings.builder().particles(300).seed(8).maxInvalidFraction(1.0).build();
        SamplerResult plain = run(model, settings, 2, 0);
        SamplerResult retried = run(model, settings.toBuilder().evaluationRetries(3).build(), 2, 0);
        assertEquals(fingerprint(plain), fingerprint(retried));
        assertArrayEquals(plain.particles().values(), retried.particles().values());
        assertTrue(plain.evaluations().invalid() > 0);
        assertEquals(plain.evaluations().invalid(), retried.evaluations().invalid());
        assertEquals(plain.evaluations().invalid(), retried.evaluations().retried());
        assertEquals(plain.evaluations().invalid(), retried.evaluations().failedAfterRetries());
        assertTrue(retried.evaluations().firstInvalidReason().endsWith("(and again on 3 retries)"));
    }

    @Test
    @DisplayName("bad retry and limit settings are refused, naming the setting")
    void badSettings() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().evaluationRetries(-1))
                .getMessage().contains("evaluationRetries must be in [0, 100], was -1"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().maxInvalidFraction(1.5))
                .getMessage().contains("maxInvalidFraction must be in [0, 1], was 1.5"));
        assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().maxInvalidFraction(Double.NaN));
    }
}
