package org.skerry.engine.calibration;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * The single-run evidence error printed with default settings is calibrated: over 100 seeds fixed
 * in advance, the mean reported variance of log Ẑ matches the observed variance ("calibration of a
 * reported error": reported ÷ observed sd within the 99 % chi-square band for 99 degrees of
 * freedom; standard). The model is the 1-D normal mean with a Normal prior, whose exact evidence
 * (BDA3 §2.5, PRML eq. 2.115) also checks the runs themselves.
 */
class EvidenceErrorCalibrationTest {

    private static final int SEEDS = 100;

    @Test
    @DisplayName("default settings: reported evidence error ÷ spread of log Ẑ over 100 seeds within the 99 % chi-square band")
    void calibratedWithDefaults() {
        CalibrationCase c = CalibrationCase.normalMeanSmall(200);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            ErrorCalibrationStudy.Row row = ErrorCalibrationStudy.run(c, SamplerSettings.builder().build(), SEEDS, 5000,
                    backend);
            double[] band = ErrorCalibrationStudy.band(SEEDS - 1, 0.99);
            assertTrue(row.ratio() > band[0] && row.ratio() < band[1], "reported ÷ observed sd = " + row.ratio()
                    + ", 99 % band [" + band[0] + ", " + band[1] + "]: " + ErrorCalibrationStudy.format(row));
            assertEquals(0, row.unreliable(), "no run at N = 200 should flag its error");
            // The runs are right as well: mean log Ẑ within 4 standard errors of the exact value
            // (plus the −Var/2 bias of log Ẑ; Del Moral 2004).
            double bias = -0.5 * row.observedVariance();
            double standardError = Math.sqrt(row.observedVariance() / SEEDS);
            assertEquals(bias, row.meanLogEvidenceError(), 4 * standardError, "mean log Ẑ − exact");
        }
    }

    @Test
    @DisplayName("island mode, 8 independent islands: the islands' spread of log Ẑ is calibrated over 60 seeds (99 % band)")
    void islandSpreadCalibrated() {
        CalibrationCase c = CalibrationCase.normalMean(1000);
        int seeds = 60;
        org.apache.commons.math3.stat.descriptive.SummaryStatistics logZ =
                new org.apache.commons.math3.stat.descriptive.SummaryStatistics();
        org.apache.commons.math3.stat.descriptive.SummaryStatistics reported =
                new org.apache.commons.math3.stat.descriptive.SummaryStatistics();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < seeds; s++) {
                SamplerResult result = new SmcSampler(SamplerSettings.builder().particles(c.particles()).islands(8)
                        .seed(900 + s).build()).run(c.model(), backend);
                logZ.addValue(result.evidence().logEvidence());
                double e = result.evidence().islandStandardError();
                reported.addValue(e * e);
            }
        }
        double ratio = Math.sqrt(reported.getMean() / logZ.getVariance());
        double[] band = ErrorCalibrationStudy.band(seeds - 1, 0.99);
        assertTrue(ratio > band[0] && ratio < band[1], "island error ÷ observed sd = " + ratio + ", 99 % band ["
                + band[0] + ", " + band[1] + "]");
    }

    @Test
    @DisplayName("systematic resampling: the error is flagged unreliable once the population was resampled")
    void otherSchemesFlagged() {
        CalibrationCase c = CalibrationCase.normalMeanSmall(200);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            SamplerResult result = new SmcSampler(SamplerSettings.builder().particles(200).seed(3)
                    .resamplingScheme(ResamplingScheme.SYSTEMATIC).build()).run(c.model(), backend);
            assertTrue(result.iterations().stream().anyMatch(r -> r.resampled()), "the run resampled");
            assertFalse(result.evidence().reliable());
            assertTrue(result.evidence().warning().contains("multinomial"), result.evidence().warning());
        }
    }
}
