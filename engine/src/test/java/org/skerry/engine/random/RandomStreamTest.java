package org.skerry.engine.random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.function.DoubleSupplier;
import org.apache.commons.math3.distribution.ExponentialDistribution;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.commons.math3.distribution.RealDistribution;
import org.apache.commons.math3.distribution.UniformRealDistribution;
import org.apache.commons.math3.stat.inference.ChiSquareTest;
import org.apache.commons.math3.stat.inference.KolmogorovSmirnovTest;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;

/**
 * Checks {@link RandomStream}: its bits against Apache Commons RNG 1.7's Philox4x32 under the
 * documented address mapping, and its deviates against Apache Commons Math 3.6.1 distributions
 * with Kolmogorov–Smirnov and chi-square goodness-of-fit tests.
 *
 * <p>Statistical checks: {@value #SEEDS} seeds per check, {@value #DRAWS} draws per seed, and a
 * check fails when its p-value is below {@value #ALPHA}. For a correct generator p is uniform, so
 * each check falsely fails with probability 1e-4; this class runs 30 such checks, so the chance
 * that a correct generator fails here for an arbitrary choice of seeds is at most 3e-3
 * (Bonferroni). The seeds are fixed, so the outcome is reproducible.
 */
class RandomStreamTest {

    private static final int SEEDS = 5;
    private static final int DRAWS = 20_000;
    private static final double ALPHA = 1e-4;

    private static RandomStream stream(int replicate) {
        // Spread replicates over every address component.
        return new RandomStream(0x5DEECE66DL * (replicate + 1), StreamPurpose.TESTING, replicate * 7,
                (1L << 33) + replicate * 1_000_003L, replicate);
    }

    private static double[] draw(DoubleSupplier source) {
        double[] values = new double[DRAWS];
        for (int i = 0; i < DRAWS; i++) {
            values[i] = source.getAsDouble();
        }
        return values;
    }

    private static void assertFits(RealDistribution distribution, double[] sample, String what) {
        double p = new KolmogorovSmirnovTest().kolmogorovSmirnovTest(distribution, sample);
        assertTrue(p >= ALPHA, what + ": Kolmogorov-Smirnov p = " + p);
    }

    private static void assertUniformCounts(long[] counts, String what) {
        double[] expected = new double[counts.length];
        long total = 0;
        for (long count : counts) {
            total += count;
        }
        java.util.Arrays.fill(expected, (double) total / counts.length);
        double p = new ChiSquareTest().chiSquareTest(expected, counts);
        assertTrue(p >= ALPHA, what + ": chi-square p = " + p);
    }

    @Test
    @DisplayName("the stream's words are Commons RNG 1.7 Philox4x32 blocks at the documented key and counter")
    void documentedMapping() {
        long seed = 0x0123456789ABCDEFL;
        int iteration = 41;
        long particle = (0x7BL << 32) | 0xCAFEF00DL;
        int step = 513;
        StreamPurpose purpose = StreamPurpose.MOVE_ACCEPT;
        RandomStream stream = new RandomStream(seed, purpose, iteration, particle, step);
        int counter3 = (purpose.code() << 24) | (step << 8) | 0x7B;
        org.apache.commons.rng.core.source32.Philox4x32 reference =
                Philox4x32Test.reference(0, (int) particle, iteration, counter3, (int) seed, (int) (seed >>> 32));
        for (int i = 0; i < 4000; i++) {
            assertEquals(reference.nextInt(), stream.nextInt(), "word " + i);
        }
        // nextLong takes the first word as its high half, as Commons RNG's IntProvider does.
        for (int i = 0; i < 1000; i++) {
            assertEquals(reference.nextLong(), stream.nextLong(), "long " + i);
        }
    }

    @Test
    @DisplayName("nextDouble lies in [0, 1) with 53-bit resolution and fits Uniform(0,1) (KS)")
    void nextDoubleUniform() {
        for (int r = 0; r < SEEDS; r++) {
            RandomStream stream = stream(r);
            double[] sample = draw(stream::nextDouble);
            for (double u : sample) {
                assertTrue(u >= 0.0 && u < 1.0, "out of [0, 1): " + u);
                assertEquals(u, Math.scalb(Math.rint(Math.scalb(u, 53)), -53), "not a multiple of 2^-53: " + u);
            }
            assertFits(new UniformRealDistribution(null, 0.0, 1.0), sample, "nextDouble seed " + r);
            RandomStream open = stream(r);
            for (int i = 0; i < 1000; i++) {
                double u = open.nextOpenDouble();
                assertTrue(u > 0.0 && u < 1.0, "out of (0, 1): " + u);
            }
        }
    }

    @Test
    @DisplayName("the KS check has power: a sample of 0.98 * nextDouble is rejected")
    void ksCheckCanFail() {
        RandomStream stream = stream(0);
        double[] shrunk = draw(() -> 0.98 * stream.nextDouble());
        double p = new KolmogorovSmirnovTest().kolmogorovSmirnovTest(
                new UniformRealDistribution(null, 0.0, 1.0), shrunk);
        assertTrue(p < ALPHA, "a distorted sample passed, p = " + p);
    }

    @Test
    @DisplayName("nextNormal fits N(0,1) and nextExponential fits Exp(1) (KS vs Commons Math)")
    void normalAndExponential() {
        for (int r = 0; r < SEEDS; r++) {
            RandomStream stream = stream(r);
            assertFits(new NormalDistribution(null, 0.0, 1.0), draw(stream::nextNormal), "nextNormal seed " + r);
            RandomStream other = stream(r + SEEDS);
            double[] exponential = draw(other::nextExponential);
            for (double e : exponential) {
                assertTrue(e > 0.0 && Double.isFinite(e), "exponential deviate " + e);
            }
            assertFits(new ExponentialDistribution(null, 1.0), exponential, "nextExponential seed " + r);
        }
    }

    @Test
    @DisplayName("nextInt(bound) is uniform (chi-square vs Commons Math), incl. a bound where bias would show")
    void nextIntBounded() {
        for (int r = 0; r < SEEDS; r++) {
            RandomStream stream = stream(r);
            for (int bound : new int[] {7, 1000}) {
                long[] counts = new long[bound];
                for (int i = 0; i < DRAWS; i++) {
                    counts[stream.nextInt(bound)]++;
                }
                assertUniformCounts(counts, "nextInt(" + bound + ") seed " + r);
            }
            // With bound 3 * 2^29 a multiply-shift without rejection gives values with residue
            // 0, 1, 2 (mod 3) 3, 3 and 2 of every 8 inputs (probabilities 3/8, 3/8, 1/4), a bias
            // the residue counts reveal at this sample size.
            int bound = 3 << 29;
            long[] residues = new long[3];
            for (int i = 0; i < DRAWS; i++) {
                int value = stream.nextInt(bound);
                assertTrue(value >= 0 && value < bound, "out of range: " + value);
                residues[value % 3]++;
            }
            assertUniformCounts(residues, "nextInt(3 * 2^29) mod 3 seed " + r);
        }
        assertEquals(0, stream(0).nextInt(1));
    }

    @Test
    @DisplayName("distinct addresses give different streams")
    void distinctAddresses() {
        long seed = 987654321L;
        List<RandomStream> streams = new ArrayList<>();
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 17, 2));
        streams.add(new RandomStream(seed + 1, StreamPurpose.MOVE_PROPOSAL, 3, 17, 2));
        streams.add(new RandomStream(seed ^ (1L << 40), StreamPurpose.MOVE_PROPOSAL, 3, 17, 2));
        for (StreamPurpose purpose : StreamPurpose.values()) {
            if (purpose != StreamPurpose.MOVE_PROPOSAL) {
                streams.add(new RandomStream(seed, purpose, 3, 17, 2));
            }
        }
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 4, 17, 2));
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 18, 2));
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 17 + (1L << 32), 2));
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 17 + (1L << 39), 2));
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 17, 3));
        streams.add(new RandomStream(seed, StreamPurpose.MOVE_PROPOSAL, 3, 17, 2 + (1 << 15)));
        Set<List<Integer>> prefixes = new HashSet<>();
        for (RandomStream stream : streams) {
            List<Integer> prefix = new ArrayList<>();
            for (int i = 0; i < 8; i++) {
                prefix.add(stream.nextInt());
            }
            prefixes.add(prefix);
        }
        assertEquals(streams.size(), prefixes.size(), "two addresses share their first 8 words");
    }

    @Test
    @DisplayName("reset() rewinds exactly, including a pending spare normal")
    void resetRewinds() {
        RandomStream fresh = new RandomStream(77L, StreamPurpose.SIMULATOR, 5, 123_456_789_012L, 9);
        double[] expected = new double[300];
        for (int i = 0; i < expected.length; i++) {
            expected[i] = mixedDraw(fresh, i);
        }
        RandomStream reused = new RandomStream(1L, StreamPurpose.RESAMPLING, 0, 0);
        reused.nextNormal(); // leaves a spare normal that reset must discard
        reused.nextInt();
        reused.reset(77L, StreamPurpose.SIMULATOR, 5, 123_456_789_012L, 9);
        double[] actual = new double[expected.length];
        for (int i = 0; i < actual.length; i++) {
            actual[i] = mixedDraw(reused, i);
        }
        assertArrayEquals(expected, actual);
    }

    private static double mixedDraw(RandomStream stream, int i) {
        switch (i % 5) {
            case 0:
                return stream.nextNormal();
            case 1:
                return stream.nextDouble();
            case 2:
                return stream.nextInt(1000);
            case 3:
                return stream.nextExponential();
            default:
                return stream.nextLong();
        }
    }

    @Test
    @DisplayName("out-of-range address components are refused with a message naming the argument")
    void refusesBadAddresses() {
        assertRefused("iteration", () -> new RandomStream(1L, StreamPurpose.TESTING, -1, 0));
        assertRefused("particleIndex", () -> new RandomStream(1L, StreamPurpose.TESTING, 0, -1));
        assertRefused("particleIndex", () -> new RandomStream(1L, StreamPurpose.TESTING, 0, RandomStream.MAX_PARTICLE_INDEX));
        assertRefused("step", () -> new RandomStream(1L, StreamPurpose.TESTING, 0, 0, -1));
        assertRefused("step", () -> new RandomStream(1L, StreamPurpose.TESTING, 0, 0, RandomStream.MAX_STEP));
        RandomStream stream = new RandomStream(1L, StreamPurpose.TESTING, 0, RandomStream.MAX_PARTICLE_INDEX - 1,
                RandomStream.MAX_STEP - 1);
        assertRefused("step", () -> stream.reset(1L, StreamPurpose.TESTING, 0, 0, 1 << 16));
        assertRefused("bound", () -> stream.nextInt(0));
    }

    private static void assertRefused(String argument, Executable call) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, call);
        assertTrue(e.getMessage().contains(argument), "message does not name " + argument + ": " + e.getMessage());
    }
}
