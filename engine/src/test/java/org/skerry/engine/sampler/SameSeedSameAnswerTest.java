package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.resample.ResamplingScheme;

/** Bit-identical results whatever the thread count and block size. */
class SameSeedSameAnswerTest {

    private static final int[][] LAYOUTS = {{1, 0}, {2, 0}, {7, 0}, {2, 1}, {3, 13}, {2, 1000}};

    /** A stochastic simulator: its log-likelihood adds noise drawn from the stream it is handed. */
    static final class NoisyModel implements Model {
        private final NormalMeanModel inner;

        NoisyModel(NormalMeanModel inner) {
            this.inner = inner;
        }

        @Override
        public ParameterSpace parameters() {
            return inner.parameters();
        }

        @Override
        public Prior prior() {
            return inner.prior();
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            return inner.logLikelihood(parameters, context) + 0.01 * context.random().nextNormal();
        }
    }

    static Model model() {
        double[][] data = SyntheticData.normalRows(21, 12, new double[] {0.5, -0.5}, 1.0);
        return new NoisyModel(NormalMeanModel.of(data, 1.0, 0.0, 2.0));
    }

    static List<String> fingerprint(SamplerResult result) {
        List<String> lines = new ArrayList<>();
        lines.add(Double.toHexString(result.evidence().logEvidence()) + " " + Double.toHexString(result.evidence().relativeVariance()));
        for (ParameterSummary p : result.parameters()) {
            lines.add(new ParameterSummary(p.name(), p.mean(), p.sd(), p.q2_5(), p.q5(), p.q25(), p.q50(),
                    p.q75(), p.q95(), p.q97_5()).toString());
        }
        for (IterationRecord r : result.iterations()) {
            lines.add(new IterationRecord(r.iteration(), r.temperature(), r.ess(), r.resampled(), r.distinctAncestors(),
                    0, r.acceptanceRate(), r.mhSteps(), r.scale(), r.logEvidenceIncrement(), r.logEvidence(),
                    r.evaluations(), r.zeroLikelihood(), r.invalidEvaluations(), r.firstInvalidIndex(),
                    r.firstInvalidReason(), null).toString());
        }
        return lines;
    }

    private static SamplerResult run(SamplerSettings settings, int threads, int blockSize) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(threads, blockSize)) {
            return new SmcSampler(settings).run(model(), backend);
        }
    }

    @ParameterizedTest
    @EnumSource(ResamplingScheme.class)
    @DisplayName("same seed, same answer: 1, 2, 7 threads and block sizes 1 … 1000")
    void identicalAcrossLayouts(ResamplingScheme scheme) {
        SamplerSettings settings = SamplerSettings.builder().particles(300).seed(99).resamplingScheme(scheme).build();
        SamplerResult reference = run(settings, 1, 0);
        for (int[] layout : LAYOUTS) {
            SamplerResult other = run(settings, layout[0], layout[1]);
            String where = scheme + " threads=" + layout[0] + " blockSize=" + layout[1];
            assertEquals(fingerprint(reference), fingerprint(other), where);
            assertArrayEquals(reference.particles().values(), other.particles().values(), where);
            assertArrayEquals(reference.particles().eve(), other.particles().eve(), where);
            assertArrayEquals(reference.normalisedWeights(), other.normalisedWeights(), where);
        }
    }

    @Test
    @DisplayName("independence kernel and every-step resampling are grouping-independent too")
    void independenceKernel() {
        SamplerSettings settings = SamplerSettings.builder().particles(257).seed(5).moveKernel(MoveKernel.INDEPENDENCE)
                .resampleEveryIteration(true).build();
        SamplerResult reference = run(settings, 1, 0);
        SamplerResult other = run(settings, 3, 10);
        assertEquals(fingerprint(reference), fingerprint(other));
        assertArrayEquals(reference.particles().values(), other.particles().values());
    }

    @Test
    @DisplayName("a different seed gives a different answer (the check above can fail)")
    void seedMatters() {
        SamplerSettings a = SamplerSettings.builder().particles(200).seed(1).build();
        SamplerSettings b = SamplerSettings.builder().particles(200).seed(2).build();
        assertNotEquals(fingerprint(run(a, 2, 0)), fingerprint(run(b, 2, 0)));
    }
}
