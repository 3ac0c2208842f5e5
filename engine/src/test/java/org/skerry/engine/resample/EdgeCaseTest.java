package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** Small and extreme inputs, where the answer follows from the definition of each scheme. */
class EdgeCaseTest {

    private static final double NEG_INF = Double.NEGATIVE_INFINITY;

    @Test
    @DisplayName("N = 2 with one zero weight: both copies go to the other particle, every scheme")
    void twoParticlesOneZero() {
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            for (int seed = 0; seed < 50; seed++) {
                assertArrayEquals(new int[] {2, 0}, Resampling.offspring(scheme, new double[] {-3, NEG_INF}, 2, seed, 0));
                assertArrayEquals(new int[] {0, 2}, Resampling.offspring(scheme, new double[] {NEG_INF, 5}, 2, seed, 0));
            }
        }
    }

    @Test
    @DisplayName("equal weights: systematic and residual keep every particle once (N W_i = 1 exactly)")
    void equalWeightsKeepEveryone() {
        double[] logWeights = new double[64];
        java.util.Arrays.fill(logWeights, -2.5);
        int[] ones = new int[64];
        java.util.Arrays.fill(ones, 1);
        for (int seed = 0; seed < 20; seed++) {
            assertArrayEquals(ones, Resampling.offspring(ResamplingScheme.SYSTEMATIC, logWeights, 64, seed, 1));
            assertArrayEquals(ones, Resampling.offspring(ResamplingScheme.RESIDUAL, logWeights, 64, seed, 1));
            assertArrayEquals(new int[] {1, 1},
                    Resampling.offspring(ResamplingScheme.SYSTEMATIC, new double[] {0, 0}, 2, seed, 1));
        }
    }

    @Test
    @DisplayName("N = 1: the single particle is its own offspring")
    void singleParticle() {
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            assertArrayEquals(new int[] {1}, Resampling.offspring(scheme, new double[] {-1e300}, 1, 3, 0));
        }
    }

    @Test
    @DisplayName("huge dynamic range: weights below 2^-62 of the total vanish, counts still sum to N")
    void hugeDynamicRange() {
        double[] logWeights = {1e300, 1e300 - 1e290, -1e300, 700, 1e300 + 1e284 - 1e284, NEG_INF, -745, 1e300};
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            for (int seed = 0; seed < 30; seed++) {
                int[] o = Resampling.offspring(scheme, logWeights, logWeights.length, seed, 4);
                assertEquals(logWeights.length, GroupingIndependenceTest.sum(o));
                for (int i : new int[] {1, 2, 3, 5, 6}) {
                    assertEquals(0, o[i], scheme + " particle " + i);
                }
            }
        }
        // Three equal top weights among N = 8: systematic gives each floor or ceil of 8/3.
        for (int seed = 0; seed < 30; seed++) {
            int[] o = Resampling.offspring(ResamplingScheme.SYSTEMATIC, logWeights, 8, seed, 4);
            for (int i : new int[] {0, 4, 7}) {
                assertTrue(o[i] == 2 || o[i] == 3, "particle " + i + ": " + o[i]);
            }
        }
    }

    @Test
    @DisplayName("all weights zero: IllegalArgumentException naming the cause")
    void allZeroWeights() {
        double[] logWeights = {NEG_INF, NEG_INF, NEG_INF};
        for (ResamplingScheme scheme : ResamplingScheme.values()) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> Resampling.offspring(scheme, logWeights, 3, 1, 0));
            assertTrue(e.getMessage().contains("zero"), e.getMessage());
        }
        // Blocks whose weights all underflow to 0 against the shared normaliser.
        BlockLayout layout = BlockLayout.of(new long[] {0, 2}, new int[] {2, 1});
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ResamplingPlanner.plan(ResamplingScheme.SYSTEMATIC, 1, 0, layout, new long[] {0, 0}));
        assertTrue(e.getMessage().contains("zero"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> ResamplingPlanner.residualSplit(layout, new long[] {0, 0}));
    }

    @Test
    @DisplayName("bad inputs fail fast with IllegalArgumentException")
    void badInputs() {
        assertThrows(IllegalArgumentException.class,
                () -> Resampling.offspring(ResamplingScheme.SYSTEMATIC, new double[] {0, Double.NaN}, 2, 1, 0));
        assertThrows(IllegalArgumentException.class,
                () -> Resampling.offspring(ResamplingScheme.SYSTEMATIC, new double[] {0, 1}, 0, 1, 0));
        assertThrows(IllegalArgumentException.class,
                () -> Resampling.offspring(ResamplingScheme.SYSTEMATIC, new double[] {0, 1}, 2, 1, -1));
        // Runs that leave a gap, or overlap.
        assertThrows(IllegalArgumentException.class, () -> BlockLayout.of(new long[] {0, 3}, new int[] {2, 2}));
        assertThrows(IllegalArgumentException.class, () -> BlockLayout.of(new long[] {0, 1}, new int[] {2, 2}));
        BlockLayout layout = BlockLayout.of(new long[] {2, 0}, new int[] {1, 2});
        assertThrows(IllegalArgumentException.class,
                () -> ResamplingPlanner.plan(ResamplingScheme.RESIDUAL, 1, 0, layout, new long[] {1, 1}));
        assertThrows(IllegalArgumentException.class,
                () -> ResamplingPlanner.plan(ResamplingScheme.STRATIFIED, 1, 0, layout, new long[] {1}));
        // A block whose weights differ from the total it reported is caught on the block side.
        BlockResamplingPlan[] plans = ResamplingPlanner.plan(ResamplingScheme.SYSTEMATIC, 1, 0, layout, new long[] {5, 7});
        assertThrows(IllegalStateException.class,
                () -> OffspringCounter.count(plans[0], new long[] {6}, 1, new int[1]));
        assertThrows(IllegalArgumentException.class,
                () -> OffspringCounter.count(plans[0], new long[] {5, 0}, 2, new int[2]));
    }

    @Test
    @DisplayName("plans survive Java serialisation unchanged")
    void plansAreSerialisableValues() throws Exception {
        BlockLayout layout = BlockLayout.of(new long[] {3, 0}, new int[] {4, 3});
        for (ResamplingScheme scheme : new ResamplingScheme[] {ResamplingScheme.MULTINOMIAL,
                ResamplingScheme.STRATIFIED, ResamplingScheme.SYSTEMATIC}) {
            BlockResamplingPlan[] plans = ResamplingPlanner.plan(scheme, 42, 7, layout, new long[] {1L << 61, 1L << 60});
            for (BlockResamplingPlan plan : plans) {
                assertEquals(plan, roundTrip(plan));
            }
        }
        assertEquals(layout, roundTrip(layout));
        Redistribution r = Redistribution.plan(layout);
        assertEquals(r.movedCount(), ((Redistribution) roundTrip(r)).movedCount());
    }

    private static Object roundTrip(Object o) throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (ObjectOutputStream out = new ObjectOutputStream(bytes)) {
            out.writeObject(o);
        }
        try (ObjectInputStream in = new ObjectInputStream(new ByteArrayInputStream(bytes.toByteArray()))) {
            return in.readObject();
        }
    }
}
