package org.skerry.engine.population;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import java.util.function.UnaryOperator;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.move.ProposalFit;

/**
 * The compact form of {@link MomentSums}: block sums that went through it, by the array or by
 * Java serialisation, merge into the very proposal moments the originals give, bit for bit; the
 * total weight is also checked against the exact sum by {@link BigDecimal} (correctly rounded to
 * a double by {@link BigDecimal#doubleValue()}); damaged arrays are refused naming the position.
 */
class MomentSumsTest {

    /** Block sums of a population spanning many magnitudes, with the particles' weights. */
    private static List<MomentSums> blocks(int d, long seed, List<Double> weights) {
        SplittableRandom random = new SplittableRandom(seed);
        List<MomentSums> blocks = new ArrayList<>();
        double[] z = new double[d];
        for (int b = 0; b < 7; b++) {
            MomentSums sums = new MomentSums(d);
            int size = random.nextInt(0, 300);
            for (int i = 0; i < size; i++) {
                for (int k = 0; k < d; k++) {
                    z[k] = StrictMath.scalb(random.nextGaussian(), random.nextInt(-30, 30)) + k;
                }
                double w = StrictMath.exp(3.0 * random.nextGaussian()) / 1000.0;
                weights.add(w);
                sums.add(w, z);
            }
            blocks.add(sums);
        }
        return blocks;
    }

    private static MomentSums merged(List<MomentSums> blocks, UnaryOperator<MomentSums> transport, int d) {
        MomentSums total = new MomentSums(d);
        for (MomentSums block : blocks) {
            total.merge(transport.apply(block));
        }
        return total;
    }

    private static MomentSums javaRoundTrip(MomentSums sums) {
        try {
            ByteArrayOutputStream bytes = new ByteArrayOutputStream();
            try (ObjectOutputStream out = new ObjectOutputStream(bytes)) {
                out.writeObject(sums);
            }
            try (ObjectInputStream in = new ObjectInputStream(new ByteArrayInputStream(bytes.toByteArray()))) {
                return (MomentSums) in.readObject();
            }
        } catch (IOException | ClassNotFoundException e) {
            throw new AssertionError(e);
        }
    }

    private static void assertSameMoments(MomentSums expected, MomentSums actual, String what) {
        assertEquals(Double.doubleToRawLongBits(expected.totalWeight()), Double.doubleToRawLongBits(actual.totalWeight()),
                what + ": total weight");
        assertArrayEquals(expected.mean(), actual.mean(), what + ": mean");
        assertArrayEquals(expected.covariance(), actual.covariance(), what + ": covariance");
        for (MoveKernel kernel : MoveKernel.values()) {
            Proposal a = ProposalFit.fit(kernel, expected, 0.8);
            Proposal b = ProposalFit.fit(kernel, actual, 0.8);
            assertArrayEquals(a.mean(), b.mean(), what + ": " + kernel + " proposal mean");
            assertArrayEquals(a.cholesky(), b.cholesky(), what + ": " + kernel + " proposal Cholesky factor");
        }
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 10})
    @DisplayName("merged sums after a compact or Java round trip give the very proposal moments")
    void roundTripsKeepEveryBit(int d) {
        List<Double> weights = new ArrayList<>();
        List<MomentSums> blocks = blocks(d, 40L + d, weights);
        MomentSums direct = merged(blocks, UnaryOperator.identity(), d);
        assertSameMoments(direct, merged(blocks, b -> MomentSums.fromCompactArray(b.toCompactArray()), d), "compact array");
        assertSameMoments(direct, merged(blocks, MomentSumsTest::javaRoundTrip, d), "Java serialisation");
        // The merged total itself travels too (island and global reductions do both).
        assertSameMoments(direct, javaRoundTrip(direct), "merged total, Java serialisation");

        BigDecimal exact = BigDecimal.ZERO;
        for (double w : weights) {
            exact = exact.add(new BigDecimal(w));
        }
        assertEquals(exact.doubleValue(), javaRoundTrip(direct).totalWeight(),
                "total weight against BigDecimal's exact sum");
    }

    @Test
    @DisplayName("a round-tripped accumulator keeps adding and merging exactly, also beside special values")
    void roundTrippedSumsKeepAccumulating() {
        MomentSums a = new MomentSums(2);
        a.add(0.25, new double[] {1e300, -1e-300});
        a.add(0.5, new double[] {-1e300, 3.0});
        MomentSums b = MomentSums.fromCompactArray(a.toCompactArray());
        a.add(1e-20, new double[] {7.0, 1e-10});
        b.add(1e-20, new double[] {7.0, 1e-10});
        assertSameMoments(a, b, "after further adds");

        MomentSums infinite = new MomentSums(2);
        infinite.add(1.0, new double[] {Double.POSITIVE_INFINITY, 1.0});
        MomentSums copy = javaRoundTrip(infinite);
        assertEquals(Arrays.toString(infinite.mean()), Arrays.toString(copy.mean()));
        assertEquals(Arrays.deepToString(infinite.covariance()), Arrays.deepToString(copy.covariance()));
    }

    @Test
    @DisplayName("the compact form is a small fraction of the accumulators' 67 chunks each")
    void compactFormIsSmall() {
        List<MomentSums> blocks = blocks(10, 50L, new ArrayList<>());
        MomentSums total = merged(blocks, UnaryOperator.identity(), 10);
        int sums = 1 + 10 + 55;
        // 67 chunks per exact sum is what the accumulators hold; a sum spanning ~100 binades
        // needs a header, about four 64-bit words of chunks and its length.
        assertTrue(total.toCompactArray().length < sums * 10,
                "compact length " + total.toCompactArray().length + " for " + sums + " sums");
        assertEquals(1 + 2 * sums, new MomentSums(10).toCompactArray().length, "zero sums: a header and a length each");
    }

    @Test
    @DisplayName("damaged compact arrays are refused, naming what and where")
    void damagedArraysAreRefused() {
        MomentSums sums = new MomentSums(2);
        sums.add(0.5, new double[] {1.0, 2.0});
        long[] good = sums.toCompactArray();

        assertEquals("compact moment sums must be a non-empty array from toCompactArray()",
                assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(new long[0])).getMessage());
        long[] zeroDimension = good.clone();
        zeroDimension[0] = 0;
        assertEquals("compact moment sums: dimension at index 0 must lie in [1, 46340], was 0",
                assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(zeroDimension)).getMessage());
        long[] truncated = Arrays.copyOf(good, good.length - 1);
        assertTrue(assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(truncated))
                .getMessage().startsWith("compact moment sums"));
        long[] trailing = Arrays.copyOf(good, good.length + 1);
        assertEquals("compact moment sums of dimension 2 hold 1 longs after the last sum",
                assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(trailing)).getMessage());
        long[] badLength = good.clone();
        badLength[1] = 0;
        assertEquals("compact moment sums: length of sum 0 at index 1 must lie in [1, " + (good.length - 2) + "], was 0",
                assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(badLength)).getMessage());
        long[] badHeader = good.clone();
        badHeader[2] = 12345L;
        assertTrue(assertThrows(IllegalArgumentException.class, () -> MomentSums.fromCompactArray(badHeader))
                .getMessage().startsWith("compact moment sums: sum 0 at index 1: compact is not an array"));
    }
}
