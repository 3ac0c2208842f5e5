package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.math.BigInteger;
import java.util.Random;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** The quantiser against the exact floor of exp(x) * 2^62 computed with BigDecimal. */
class WeightQuantiserTest {

    @Test
    @DisplayName("q = floor(StrictMath.exp(logw - L) * 2^62), clamped to [0, 2^62]; total exact (BigDecimal)")
    void matchesExactFloor() {
        Random random = new Random(7);
        double[] logWeights = new double[5000];
        for (int i = 0; i < logWeights.length; i++) {
            logWeights[i] = random.nextGaussian() * 30;
        }
        logWeights[0] = Double.NEGATIVE_INFINITY;
        logWeights[1] = 1e308;
        logWeights[2] = -1e308;
        double logNormaliser = 25.0;
        long[] q = new long[logWeights.length];
        long total;
        try {
            total = WeightQuantiser.quantise(logWeights, logWeights.length, logNormaliser, q);
        } catch (IllegalArgumentException e) {
            // With L = 25 and log-weights up to ~100 the sum may overflow: the documented failure.
            logNormaliser = Resampling.logSumExp(logWeights, logWeights.length);
            total = WeightQuantiser.quantise(logWeights, logWeights.length, logNormaliser, q);
        }
        ExactWeights exact = new ExactWeights(logWeights, logNormaliser);
        for (int i = 0; i < logWeights.length; i++) {
            assertEquals(exact.q[i].longValueExact(), q[i], "particle " + i);
            assertEquals(q[i], WeightQuantiser.quantise(logWeights[i], logNormaliser));
        }
        assertEquals(exact.total, BigInteger.valueOf(total));
        assertEquals(0, q[0]);
        assertEquals(WeightQuantiser.ONE, q[1]);
        assertEquals(0, q[2]);
    }

    @Test
    @DisplayName("a normaliser far below the log-sum overflows the total: IllegalArgumentException")
    void overflowIsReported() {
        double[] logWeights = {0, 0, 0};
        assertThrows(IllegalArgumentException.class,
                () -> WeightQuantiser.quantise(logWeights, 3, -1, new long[3]));
        assertThrows(IllegalArgumentException.class, () -> WeightQuantiser.quantise(0, Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> WeightQuantiser.quantise(Double.POSITIVE_INFINITY, 0));
    }
}
