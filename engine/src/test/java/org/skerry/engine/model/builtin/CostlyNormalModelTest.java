package org.skerry.engine.model.builtin;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.NormalDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.ModelCatalog;
import org.skerry.engine.random.RandomStream;

/**
 * The synthetic costly model: its value is the normal log-density whatever the cost (checked with
 * Commons Math 3.6.1), its slow evaluations make up the asked fraction (binomial error), and its
 * busy work is proportional to the cost asked for.
 */
class CostlyNormalModelTest {

    private static LikelihoodContext at(long index, int iteration) {
        return new LikelihoodContext() {
            @Override
            public RandomStream random() {
                throw new UnsupportedOperationException("the model is deterministic");
            }

            @Override
            public long particleIndex() {
                return index;
            }

            @Override
            public int iteration() {
                return iteration;
            }
        };
    }

    @Test
    @DisplayName("log-likelihood is the sum of Commons Math normal log-densities, with or without stragglers")
    void valueIgnoresCost() {
        CostlyNormalModel plain = CostlyNormalModel.of(3, 0, 0, 1, 1.5, 0.7, 0, 3);
        CostlyNormalModel slow = CostlyNormalModel.of(3, 2, 0.5, 4, 1.5, 0.7, 0, 3);
        NormalDistribution noise = new NormalDistribution(null, 0, 0.7);
        double[] mu = {0.2, 1.1, -0.4};
        double expected = 0;
        for (double m : mu) {
            expected += noise.logDensity(1.5 - m);
        }
        for (int i = 0; i < 20; i++) {
            assertEquals(expected, plain.logLikelihood(mu, at(i, 3)), 1e-12);
            assertEquals(plain.logLikelihood(mu, at(i, 3)), slow.logLikelihood(mu, at(i, 3)));
        }
    }

    @Test
    @DisplayName("the share of slow evaluations is slow-fraction within four binomial standard errors")
    void slowShare() {
        CostlyNormalModel model = CostlyNormalModel.of(1, 0, 0.1, 10, 1, 1, 0, 3);
        int n = 200_000;
        int slow = 0;
        for (int i = 0; i < n; i++) {
            slow += model.isSlow(i, i % 7) ? 1 : 0;
        }
        double share = (double) slow / n;
        double standardError = Math.sqrt(0.1 * 0.9 / n);
        assertEquals(0.1, share, 4 * standardError);
        assertEquals(model.isSlow(12345, 3), model.isSlow(12345, 3));
        assertEquals(1000 * (0.9 + 0.1 * 10), CostlyNormalModel.of(1, 1000, 0.1, 10, 1, 1, 0, 3).meanCostMicros(), 1e-9);
    }

    @Test
    @DisplayName("busy work grows with the cost asked for and the calibration is positive")
    void workUnits() {
        assertTrue(BusyWork.unitsPerMicrosecond() > 0);
        assertEquals(0, BusyWork.unitsFor(0));
        long ten = BusyWork.unitsFor(10);
        long thousand = BusyWork.unitsFor(1000);
        assertEquals(100.0, (double) thousand / ten, 100.0 * 0.1);
        assertThrows(IllegalArgumentException.class, () -> BusyWork.unitsFor(-1));
    }

    @Test
    @DisplayName("factory defaults are the values listed by `skerry models`; bad settings name their key")
    void factory() {
        CostlyNormalModel model = (CostlyNormalModel) ModelCatalog.load().get("costly-normal")
                .create(ModelSettings.empty());
        assertEquals(2, model.parameters().dimension());
        assertEquals(1000, model.meanCostMicros(), 1e-12);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ModelCatalog.load()
                .get("costly-normal").create(ModelSettings.builder().origin("run.conf").set("slow-fraction", 1).build()));
        assertTrue(e.getMessage().contains("slow-fraction"), e.getMessage());
    }
}
