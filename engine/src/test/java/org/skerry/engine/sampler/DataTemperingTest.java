package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.builtin.GaussianMixtureLikelihoodModel;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.Slow;

/**
 * Data tempering (Chopin 2002, Biometrika 89(3)): observations added in batches, fixed or chosen
 * on the conditional ESS. Checked against the same closed forms as likelihood tempering; every
 * tolerance is four standard errors of the replicated estimate over the seeds of the test.
 */
@Slow
class DataTemperingTest {

    private static final int SEEDS = 24;
    private static final double Z = 4.0;
    private static final double[][] NORMAL_DATA = SyntheticData.normalRows(11, 20, new double[] {1.5}, 2.0);

    private static void assertWithin(double expected, SummaryStatistics replicated, String what) {
        double error = Z * Replicates.standardError(replicated);
        assertEquals(expected, replicated.getMean(), error, what + " (4 standard errors = " + error + ")");
    }

    private static void assertEvidence(double exact, Replicates replicates) {
        double error = Z * Replicates.standardError(replicates.logEvidence());
        assertEquals(exact, replicates.correctedLogEvidence(), error,
                "mean(log Z) + Var/2 against exact (4 standard errors = " + error + ")");
    }

    private static SamplerSettings.Builder base(SequenceSettings targets) {
        return SamplerSettings.builder().particles(1000).targets(targets);
    }

    @Test
    @DisplayName("Normal mean, fixed batches of 3: evidence and posterior against BDA3 §2.5 and PRML eq. 2.115")
    void normalMeanFixedBatches() {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA, 2.0, 0.0, 3.0);
        NormalMeanExact exact = new NormalMeanExact(NORMAL_DATA, 2.0, 0.0, 3.0);
        Replicates replicates = Replicates.run(model, base(SequenceSettings.fixedBatches(3)).build(), SEEDS);
        // 20 observations in batches of 3: seven steps, the last adding two.
        assertEquals(8, replicates.results.get(0).iterations().size());
        assertEvidence(exact.logEvidence(), replicates);
        assertWithin(exact.posteriorMean(0), replicates.mean(0), "posterior mean");
        assertWithin(Math.sqrt(exact.posteriorVariance()), replicates.sd(0), "posterior sd");
    }

    @Test
    @DisplayName("Bayesian linear regression, adaptive batches: evidence and posterior against PRML §3.3 and eq. 3.86")
    void linearRegressionAdaptiveBatches() {
        Replicates replicates = Replicates.run(SamplerAccuracyTest.RegressionCase.MODEL,
                base(SequenceSettings.adaptiveBatches(8, 0.5)).build(), SEEDS);
        SamplerResult first = replicates.results.get(0);
        assertTrue(first.iterations().size() > 4 && first.iterations().size() <= 31,
                "batches of 1 to 8 observations: " + first.iterations().size() + " iterations");
        SamplerAccuracyTest.RegressionCase.check(replicates);
    }

    @Test
    @DisplayName("the same answer, bit for bit, on any number of threads and blocks")
    void sameAnswerOnAnyLayout() {
        NormalMeanModel model = NormalMeanModel.of(NORMAL_DATA, 2.0, 0.0, 3.0);
        SamplerSettings settings = base(SequenceSettings.adaptiveBatches(6, 0.6)).particles(500).seed(77).build();
        SamplerResult reference;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(1, 0)) {
            reference = new SmcSampler(settings).run(model, backend);
        }
        for (int[] layout : new int[][] {{2, 0}, {3, 37}, {2, 500}}) {
            try (ThreadPoolBackend backend = new ThreadPoolBackend(layout[0], layout[1])) {
                SamplerResult other = new SmcSampler(settings).run(model, backend);
                String where = layout[0] + " threads, block size " + layout[1];
                assertEquals(SameSeedSameAnswerTest.fingerprint(reference), SameSeedSameAnswerTest.fingerprint(other),
                        where);
                assertArrayEquals(reference.particles().values(), other.particles().values(), where);
                assertArrayEquals(reference.normalisedWeights(), other.normalisedWeights(), where);
            }
        }
    }

    @Test
    @DisplayName("resumed from any iteration's checkpoint, on other threads and blocks: bit-identical results")
    void resumes() {
        Model model = NormalMeanModel.of(NORMAL_DATA, 2.0, 0.0, 3.0);
        ResumeFromCheckpointTest.resumeFromEvery(SamplerSettings.builder().particles(240).seed(31)
                .targets(SequenceSettings.adaptiveBatches(4, 0.5)).build(), model);
    }

    @Test
    @DisplayName("a model without a likelihood per observation range is refused, by name")
    void refusesModelWithoutRanges() {
        Model model = GaussianMixtureLikelihoodModel.of(2, 0.3, -3.0, 3.0, 0.5, 8.0);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(1, 0)) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> new SmcSampler(
                    base(SequenceSettings.fixedBatches(2)).build()).run(model, backend));
            assertTrue(e.getMessage().contains("data tempering") && e.getMessage().contains("GaussianMixture"),
                    e.getMessage());
        }
    }
}
