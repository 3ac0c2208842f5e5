package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The radix order of the weighted quantiles against the JDK's own comparison sort
 * ({@link Arrays#sort(Object[], java.util.Comparator)} with {@link Double#compare}, ties by
 * position), the order the quantiles were defined by, on values chosen to make a radix sort go
 * wrong: both zeros, NaNs of different bit patterns, infinities, subnormals, the extremes, many
 * ties, and arbitrary bit patterns; and the quantiles against the same definition.
 */
class ValueOrderTest {

    private static final double[] AWKWARD = {0.0, -0.0, Double.NaN, Double.longBitsToDouble(0xfff8000000000123L),
        Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.MIN_VALUE, -Double.MIN_VALUE, Double.MAX_VALUE,
        -Double.MAX_VALUE, Double.MIN_NORMAL, -Double.MIN_NORMAL, 1.0, -1.0, 1.0 + Math.ulp(1.0)};

    @Test
    @DisplayName("positions of positive weight in Double.compare order, ties by position, as the JDK's sort")
    void sameOrderAsComparisonSort() {
        SplittableRandom random = new SplittableRandom(2026);
        for (int trial = 0; trial < 200; trial++) {
            int n = 1 + random.nextInt(3000);
            double[] values = new double[n];
            double[] weights = new double[n];
            for (int i = 0; i < n; i++) {
                values[i] = switch (random.nextInt(4)) {
                    case 0 -> AWKWARD[random.nextInt(AWKWARD.length)];
                    case 1 -> Double.longBitsToDouble(random.nextLong());
                    case 2 -> random.nextInt(5) - 2.0;
                    default -> random.nextGaussian();
                };
                weights[i] = random.nextInt(5) == 0 ? 0.0 : random.nextDouble();
            }
            assertArrayEquals(reference(values, weights), ValueOrder.positiveByValue(values, weights, n), "trial " + trial);
        }
    }

    @Test
    @DisplayName("weighted quantiles: the smallest value whose cumulative weight reaches p, on a hand-checked case")
    void quantilesByDefinition() {
        double[] values = {3, 1, 2, 2, 5};
        double[] weights = {0.1, 0.2, 0.3, 0, 0.4};
        // By value: 1 (0.2), 2 (0.3 → 0.5), 3 (0.1 → 0.6), 5 (0.4 → 1.0); the zero-weight 2 does not count.
        double[] q = PosteriorSummaries.weightedQuantiles(values, weights, 5, 1.0, new double[] {0.1, 0.2, 0.5, 0.55, 0.6, 0.61, 1.0});
        assertArrayEquals(new double[] {1, 1, 2, 3, 3, 5, 5}, q);
        assertEquals(Double.NaN, PosteriorSummaries.weightedQuantiles(values, new double[5], 5, 0.0, new double[] {0.5})[0]);
    }

    private static int[] reference(double[] values, double[] weights) {
        return java.util.stream.IntStream.range(0, values.length).filter(i -> weights[i] > 0).boxed()
                .sorted((i, j) -> {
                    int byValue = Double.compare(values[i], values[j]);
                    return byValue != 0 ? byValue : Integer.compare(i, j);
                }).mapToInt(Integer::intValue).toArray();
    }
}
