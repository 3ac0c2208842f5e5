package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/** Zero likelihoods, invalid evaluations and bad input: counted, reported, never a NaN. */
class InvalidEvaluationTest {

    private static final Prior PRIOR = IndependentPrior.of(Normal.of(0.0, 2.0));

    /** Throws above 2.5, NaN below −2.5, a valid zero in (1.8, 2.0); else a standard normal likelihood. */
    static class FragileModel implements Model {
        @Override
        public ParameterSpace parameters() {
            return ParameterSpace.real("theta", 1);
        }

        @Override
        public Prior prior() {
            return PRIOR;
        }

        @Override
        public double logLikelihood(double[] x, LikelihoodContext context) {
            if (x[0] > 2.5) {
                throw new IllegalStateException("solver diverged");
            }
            if (x[0] < -2.5) {
                return Double.NaN;
            }
            if (x[0] > 1.8 && x[0] < 2.0) {
                return Double.NEGATIVE_INFINITY;
            }
            return -0.5 * x[0] * x[0];
        }
    }

    private static SamplerResult run(Model model, SamplerSettings settings) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 50)) {
            return new SmcSampler(settings).run(model, backend);
        }
    }

    @Test
    @DisplayName("invalid evaluations are counted, the lowest index reported, and no result is NaN")
    void countedAndReported() {
        // About 21 % of the prior fails: above the default stop limit of 10 %, so the limit is lifted.
        SamplerSettings settings = SamplerSettings.builder().particles(500).seed(3).maxInvalidFraction(1.0).build();
        SamplerResult result = run(new FragileModel(), settings);
        IterationRecord initial = result.iterations().get(0);
        // Recompute the initial draws independently to find the expected counts and lowest index.
        long invalid = 0;
        long zero = 0;
        long lowest = -1;
        double[] x = new double[1];
        for (int i = 0; i < 500; i++) {
            PRIOR.sample(new RandomStream(3, StreamPurpose.INITIAL_DRAW, 0, i, 0), x);
            if (x[0] > 2.5 || x[0] < -2.5) {
                invalid++;
                lowest = lowest < 0 ? i : lowest;
            } else if (x[0] > 1.8 && x[0] < 2.0) {
                zero++;
            }
        }
        assertTrue(invalid > 0, "the prior N(0, 2²) puts about 21 % beyond ±2.5");
        assertEquals(invalid, initial.invalidEvaluations());
        assertEquals(zero, initial.zeroLikelihood());
        assertEquals(lowest, initial.firstInvalidIndex());
        assertTrue(initial.firstInvalidReason() != null);
        assertTrue(result.evaluations().invalid() >= invalid);
        assertFalse(Double.isNaN(result.evidence().logEvidence()));
        assertFalse(Double.isNaN(result.evidence().standardError()));
        for (ParameterSummary p : result.parameters()) {
            assertFalse(Double.isNaN(p.mean()) || Double.isNaN(p.sd()) || Double.isNaN(p.q97_5()), p.toString());
        }
        for (double w : result.normalisedWeights()) {
            assertFalse(Double.isNaN(w));
        }
        for (int i = 0; i < result.particles().size(); i++) {
            double value = result.particles().value(i, 0);
            assertTrue(result.normalisedWeights()[i] == 0 || (value <= 2.5 && value >= -2.5 && !(value > 1.8 && value < 2.0)));
        }
    }

    @Test
    @DisplayName("every weight zero (invalid-fraction limit lifted): the run stops naming the iteration and the invalid count")
    void everyWeightZero() {
        Model hopeless = new FragileModel() {
            @Override
            public double logLikelihood(double[] x, LikelihoodContext context) {
                return Double.NaN;
            }
        };
        SamplingFailedException e = assertThrows(SamplingFailedException.class,
                () -> run(hopeless, SamplerSettings.builder().particles(100).seed(1).maxInvalidFraction(1.0).build()));
        assertEquals(1, e.iteration());
        assertTrue(e.getMessage().contains("iteration 1") && e.getMessage().contains("100 invalid"), e.getMessage());
    }

    @Test
    @DisplayName("bad settings are refused with a message naming the setting and value")
    void badSettings() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().particles(1))
                .getMessage().contains("particles must be >= 2, was 1"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().resampleThreshold(0))
                .getMessage().contains("resampleThreshold"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> SamplerSettings.builder().resampleThreshold(1.5))
                .getMessage().contains("1.5"));
    }

    @Test
    @DisplayName("a prior of the wrong length, and a prior sample outside its own support, are refused")
    void badModels() {
        Model wrongLength = new FragileModel() {
            @Override
            public ParameterSpace parameters() {
                return ParameterSpace.real("theta", 2);
            }
        };
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> run(wrongLength, SamplerSettings.builder().particles(10).build()));
        assertTrue(e.getMessage().contains("1 dimensions") && e.getMessage().contains("2 parameters"), e.getMessage());

        Model outside = new FragileModel() {
            @Override
            public ParameterSpace parameters() {
                return ParameterSpace.of(List.of("rate"), List.of(Support.positive()));
            }
        };
        e = assertThrows(IllegalArgumentException.class, () -> run(outside, SamplerSettings.builder().particles(50).build()));
        assertTrue(e.getMessage().contains("outside the prior's own support") && e.getMessage().contains("rate="),
                e.getMessage());
    }
}
