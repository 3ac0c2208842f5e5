package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * The plankton model's replicates, on the invented Lake Quellmar scenario's synthetic data:
 * their mean at the true parameters against the log-normal mean, and their agreement with the
 * scenario's generator.
 */
class PlanktonPredictiveTest {

    private static final QuellmarBuoy BUOY = QuellmarScenario.demoBuoy();
    private static final double[][] ROWS = QuellmarData.generate(BUOY, 2026);
    private static final PlanktonModel MODEL = QuellmarScenario.model(BUOY, ROWS, QuellmarScenario.TRUE_GRAZING);

    @Test
    @DisplayName("replicates at the true parameters have the log-normal mean ratio·P(t)·exp(σ²/2) per day")
    void meanAtTruth() {
        double[] theta = BUOY.trueParameters();
        int replicates = 400;
        int n = MODEL.observedCount();
        SummaryStatistics[] stats = new SummaryStatistics[n];
        for (int j = 0; j < n; j++) {
            stats[j] = new SummaryStatistics();
        }
        double[] out = new double[n];
        RandomStream random = new RandomStream(0, StreamPurpose.PREDICTIVE, 0, 0);
        for (int k = 0; k < replicates; k++) {
            MODEL.replicate(theta, random.reset(11, StreamPurpose.PREDICTIVE, 0, k, 0), out);
            for (int j = 0; j < n; j++) {
                stats[j].addValue(out[j]);
            }
        }
        double[][] states = MODEL.dynamics().integratedStates(theta);
        double logRatio = StrictMath.log(BUOY.constants().chlorophyllPerNitrogen());
        for (int j = 0; j < n; j++) {
            // Commons Math's LogNormalDistribution(scale = log(ratio·P), shape = σ) has mean
            // exp(scale + σ²/2); the replicates are independent, so the standard error of their
            // mean is their sd over √400.
            double expected = new LogNormalDistribution(logRatio + states[j][1], theta[PlanktonModel.SIGMA])
                    .getNumericalMean();
            double error = stats[j].getStandardDeviation() / StrictMath.sqrt(replicates);
            assertTrue(StrictMath.abs(stats[j].getMean() - expected) <= 4 * error, "day " + ROWS[j][0]
                    + ": mean " + stats[j].getMean() + " ± " + error + ", expected " + expected);
        }
    }

    @Test
    @DisplayName("a replicate at the true parameters with the generator's stream is the synthetic data, bit for bit")
    void sameAsGenerator() {
        double[] out = new double[MODEL.observedCount()];
        MODEL.replicate(BUOY.trueParameters(), new RandomStream(2026, StreamPurpose.DATA_GENERATION, 0,
                BUOY.number()), out);
        assertArrayEquals(MODEL.observedValues(), out, 0.0);
    }

    @Test
    @DisplayName("observed values are the chlorophyll series, positioned at its days")
    void axes() {
        assertEquals(PlanktonModel.DAY, MODEL.positionQuantity());
        assertEquals(PlanktonModel.CHLOROPHYLL, MODEL.observedQuantity());
        for (int j = 0; j < ROWS.length; j++) {
            assertEquals(ROWS[j][0], MODEL.positions()[j], 0.0);
            assertEquals(ROWS[j][1], MODEL.observedValues()[j], 0.0);
        }
        assertEquals(MODEL, PredictiveModel.of(MODEL));
    }
}
