package org.skerry.engine.math;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Checks {@link ExactSum} against exact arithmetic in {@link java.math.BigDecimal}.
 *
 * <p>Every double is exactly a BigDecimal ({@code new BigDecimal(double)}) and BigDecimal addition
 * is exact, so the reference sum is exact. It is turned into the expected double in two
 * independent ways, and both must agree with the accumulator: (1) {@code BigDecimal.doubleValue()}:
 * Java 17's javadoc only says the conversion is "similar to" the narrowing conversion of JLS 5.1.3,
 * but its implementation (read with javap from the JDK 17 class file) uses single IEEE operations
 * on exact operands or else {@code Double.parseDouble(toString())}, whose javadoc promises the IEEE
 * 754 round-to-nearest rule; (2) the definition of round-half-to-even, checked directly with
 * BigDecimal arithmetic against the two neighbouring doubles.
 */
class ExactSumTest {

    /** 2^1024 - 2^970 = MAX_VALUE + ulp(MAX_VALUE)/2: the least magnitude that rounds to infinity. */
    private static final BigDecimal OVERFLOW_THRESHOLD = new BigDecimal(Double.MAX_VALUE)
            .add(new BigDecimal(Math.ulp(Double.MAX_VALUE) / 2));
    /** 2^1024, the value IEEE 754 round-to-nearest gives the neighbour above MAX_VALUE. */
    private static final BigDecimal TWO_POW_1024 = new BigDecimal(Double.MAX_VALUE)
            .add(new BigDecimal(Math.ulp(Double.MAX_VALUE)));

    private static BigDecimal exactSum(double[] values) {
        BigDecimal sum = BigDecimal.ZERO;
        for (double value : values) {
            sum = sum.add(new BigDecimal(value));
        }
        return sum;
    }

    private static BigDecimal exact(double finiteOrInfinite) {
        if (finiteOrInfinite == Double.POSITIVE_INFINITY) {
            return TWO_POW_1024;
        }
        if (finiteOrInfinite == Double.NEGATIVE_INFINITY) {
            return TWO_POW_1024.negate();
        }
        return new BigDecimal(finiteOrInfinite);
    }

    /** Asserts that {@code actual} is the round-half-even double of {@code exact}, bit for bit. */
    private static void assertCorrectlyRounded(BigDecimal exact, double actual, String what) {
        // "+ 0.0" turns a -0.0 into +0.0: ExactSum documents +0.0 for an exact zero.
        double reference = exact.doubleValue() + 0.0;
        assertEquals(Double.doubleToRawLongBits(reference), Double.doubleToRawLongBits(actual),
                () -> what + ": expected " + reference + " (BigDecimal.doubleValue), was " + actual);
        if (Double.isInfinite(actual)) {
            assertTrue(exact.abs().compareTo(OVERFLOW_THRESHOLD) >= 0, what + ": overflowed below threshold");
            assertEquals(exact.signum(), (int) Math.signum(actual), what);
            return;
        }
        BigDecimal error = exact.subtract(new BigDecimal(actual)).abs();
        for (double neighbour : new double[] {Math.nextUp(actual), Math.nextDown(actual)}) {
            int comparison = error.compareTo(exact.subtract(exact(neighbour)).abs());
            assertTrue(comparison <= 0, () -> what + ": " + neighbour + " is nearer than " + actual);
            if (comparison == 0) {
                assertEquals(0, Double.doubleToRawLongBits(actual) & 1, what + ": tie not rounded to even");
            }
        }
    }

    private static ExactSum accumulate(double[] values) {
        ExactSum sum = new ExactSum();
        for (double value : values) {
            sum.add(value);
        }
        return sum;
    }

    private static void checkAgainstBigDecimal(double[] values, String what) {
        double oneByOne = accumulate(values).doubleValue();
        assertCorrectlyRounded(exactSum(values), oneByOne, what);
        assertEquals(Double.doubleToRawLongBits(oneByOne),
                Double.doubleToRawLongBits(ExactSum.sum(values, 0, values.length)), what + " (array add)");
    }

    /** Any finite double, uniform over bit patterns: every exponent, subnormals, both signs. */
    private static double anyFinite(SplittableRandom random) {
        while (true) {
            double x = Double.longBitsToDouble(random.nextLong());
            if (Double.isFinite(x)) {
                return x;
            }
        }
    }

    /** A double of random sign whose binary exponent lies within [low, high] (may be subnormal). */
    private static double inBand(SplittableRandom random, int low, int high) {
        int exponent = low + random.nextInt(high - low + 1);
        double x = (1.0 + random.nextDouble()) * Math.scalb(1.0, exponent);
        return random.nextBoolean() ? x : -x;
    }

    private static void shuffle(double[] values, SplittableRandom random) {
        for (int i = values.length - 1; i > 0; i--) {
            int j = random.nextInt(i + 1);
            double swap = values[i];
            values[i] = values[j];
            values[j] = swap;
        }
    }

    @Test
    @DisplayName("random doubles over the whole exponent range vs BigDecimal (20 seeds x 1000 values)")
    void wholeRange() {
        for (int seed = 0; seed < 20; seed++) {
            SplittableRandom random = new SplittableRandom(seed);
            double[] values = new double[1000];
            for (int i = 0; i < values.length; i++) {
                values[i] = anyFinite(random);
            }
            checkAgainstBigDecimal(values, "whole range seed " + seed);
        }
    }

    @Test
    @DisplayName("mixed signs within narrow exponent bands, from subnormal to overflow, vs BigDecimal")
    void narrowBands() {
        SplittableRandom random = new SplittableRandom(42);
        // Narrow bands make cancellation and rounding-boundary cases common; bands near 2^1023
        // make overflow to infinity possible, bands near 2^-1074 exercise subnormals.
        int[] centres = {-1074, -1060, -1022, -540, -60, -1, 0, 1, 52, 500, 1000, 1022};
        int overflows = 0;
        for (int centre : centres) {
            for (int width : new int[] {0, 2, 60}) {
                for (int n : new int[] {1, 2, 3, 10, 300}) {
                    double[] values = new double[n];
                    for (int i = 0; i < n; i++) {
                        values[i] = inBand(random, Math.max(-1074, centre - width), Math.min(1023, centre + width));
                    }
                    checkAgainstBigDecimal(values, "band " + centre + "±" + width + " n=" + n);
                    if (Double.isInfinite(ExactSum.sum(values, 0, n))) {
                        overflows++;
                    }
                }
            }
        }
        assertTrue(overflows > 0, "no band case reached overflow; the test lost its coverage");
    }

    @Test
    @DisplayName("subnormals only, both signs, vs BigDecimal")
    void subnormals() {
        SplittableRandom random = new SplittableRandom(7);
        double[] values = new double[5000];
        for (int i = 0; i < values.length; i++) {
            values[i] = Double.longBitsToDouble(random.nextLong() & 0x800FFFFFFFFFFFFFL);
        }
        checkAgainstBigDecimal(values, "subnormals");
    }

    @Test
    @DisplayName("catastrophic cancellation: 1e308 + 1 - 1e308 = 1 in every order (closed form)")
    void cancellation() {
        double[][] orders = {{1e308, 1.0, -1e308}, {1.0, 1e308, -1e308}, {-1e308, 1e308, 1.0},
            {1e308, -1e308, 1.0}};
        for (double[] order : orders) {
            assertEquals(1.0, ExactSum.sum(order, 0, 3));
        }
        assertEquals(Double.MIN_VALUE,
                ExactSum.sum(new double[] {0x1p1023, Double.MIN_VALUE, -0x1p1023}, 0, 3));
        assertEquals(0.1, ExactSum.sum(new double[] {Double.MAX_VALUE, 0.1, -Double.MAX_VALUE}, 0, 3));
    }

    @Test
    @DisplayName("many equal tiny values: 10^6 x MIN_VALUE = 10^6 x 2^-1074 exactly; 10^6 x 0.1 vs BigDecimal")
    void manyEqualTinyValues() {
        int n = 1_000_000;
        ExactSum sum = new ExactSum();
        for (int i = 0; i < n; i++) {
            sum.add(Double.MIN_VALUE);
        }
        // 10^6 < 2^52, so 10^6 units of 2^-1074 is a subnormal with that bit pattern.
        assertEquals(Double.longBitsToDouble(n), sum.doubleValue());
        double[] tenths = new double[n];
        java.util.Arrays.fill(tenths, 0.1);
        assertCorrectlyRounded(new BigDecimal(0.1).multiply(BigDecimal.valueOf(n)),
                ExactSum.sum(tenths, 0, n), "10^6 x 0.1");
    }

    @Test
    @DisplayName("ties round half to even (IEEE 754 roundTiesToEven, closed forms)")
    void tiesToEven() {
        // 1 + 2^-53 lies halfway between 1 (even) and 1 + 2^-52 (odd).
        assertEquals(1.0, ExactSum.sum(new double[] {1.0, 0x1p-53}, 0, 2));
        // 1 + 2^-52 + 2^-53 lies halfway between 1 + 2^-52 (odd) and 1 + 2^-51 (even).
        assertEquals(1.0 + 0x1p-51, ExactSum.sum(new double[] {1.0, 0x1p-52, 0x1p-53}, 0, 3));
        // A sticky bit far below the halfway point breaks the tie upwards, or downwards.
        assertEquals(1.0 + 0x1p-52, ExactSum.sum(new double[] {1.0, 0x1p-53, Double.MIN_VALUE}, 0, 3));
        assertEquals(1.0, ExactSum.sum(new double[] {1.0, 0x1p-53, -Double.MIN_VALUE}, 0, 3));
        assertEquals(Math.nextDown(1.0), ExactSum.sum(new double[] {1.0, -0x1p-54, -Double.MIN_VALUE}, 0, 3));
        // Negative ties mirror positive ones.
        assertEquals(-1.0, ExactSum.sum(new double[] {-1.0, -0x1p-53}, 0, 2));
        // Sums below 2^-1021 are exact multiples of 2^-1074 and need no rounding; from 2^-1021 up
        // the spacing is 2^-1073, so 2^-1021 + 2^-1074 ties to 2^-1021 (even) and
        // 2^-1021 + 3 * 2^-1074 ties to 2^-1021 + 2^-1072 (even).
        assertEquals(0x1p-1021, ExactSum.sum(new double[] {0x1p-1021, Double.MIN_VALUE}, 0, 2));
        assertEquals(0x1p-1021 + 0x1p-1072,
                ExactSum.sum(new double[] {0x1p-1021, Double.MIN_VALUE, 2 * Double.MIN_VALUE}, 0, 3));
        assertEquals(0x1p-1022 - Double.MIN_VALUE + Double.MIN_VALUE * 3,
                ExactSum.sum(new double[] {0x1p-1022, Double.MIN_VALUE, -Double.MIN_VALUE, 3 * Double.MIN_VALUE,
                    -Double.MIN_VALUE}, 0, 5));
    }

    @Test
    @DisplayName("10^6 adds into the same chunks force many carry propagations (vs BigDecimal)")
    void carryPropagation() {
        SplittableRandom random = new SplittableRandom(2024);
        int n = 1_000_000;
        double[] positive = new double[n];
        double[] negative = new double[n];
        for (int i = 0; i < n; i++) {
            // Significands near 2^53 - 1 at one exponent put the largest possible part into one chunk.
            positive[i] = Math.nextDown(2.0) - random.nextInt(1000) * Math.ulp(1.0);
            // Scaled by 2^40 to keep the BigDecimal reference cheap (few fractional digits).
            negative[i] = -positive[i] * 0x1p40;
        }
        checkAgainstBigDecimal(positive, "10^6 positive");
        checkAgainstBigDecimal(negative, "10^6 negative");
    }

    @Test
    @DisplayName("a sum beyond the double range stays exact and reads as infinity of its sign")
    void overflow() {
        assertEquals(Double.POSITIVE_INFINITY, ExactSum.sum(new double[] {Double.MAX_VALUE, Double.MAX_VALUE}, 0, 2));
        assertEquals(Double.NEGATIVE_INFINITY, ExactSum.sum(new double[] {-Double.MAX_VALUE, -Double.MAX_VALUE}, 0, 2));
        double halfUlp = Math.ulp(Double.MAX_VALUE) / 2;
        // MAX + ulp/2 is a tie between MAX (odd significand) and 2^1024 (even): rounds to infinity.
        assertEquals(Double.POSITIVE_INFINITY, ExactSum.sum(new double[] {Double.MAX_VALUE, halfUlp}, 0, 2));
        assertEquals(Double.MAX_VALUE,
                ExactSum.sum(new double[] {Double.MAX_VALUE, halfUlp, -Double.MIN_VALUE}, 0, 3));
        // 20000 x MAX exceeds 2^1038, the weight of the top chunk; it must come back exactly.
        ExactSum sum = new ExactSum();
        for (int i = 0; i < 20000; i++) {
            sum.add(Double.MAX_VALUE);
        }
        assertEquals(Double.POSITIVE_INFINITY, sum.doubleValue());
        ExactSum restored = ExactSum.fromCompactArray(sum.toCompactArray());
        for (int i = 0; i < 19999; i++) {
            sum.add(-Double.MAX_VALUE);
            restored.add(-Double.MAX_VALUE);
        }
        sum.add(1.0);
        restored.add(1.0);
        assertEquals(Double.MAX_VALUE, sum.doubleValue());
        assertEquals(Double.MAX_VALUE, restored.doubleValue());
        sum.add(-Double.MAX_VALUE);
        assertEquals(1.0, sum.doubleValue());
    }

    @Test
    @DisplayName("special values: NaN anywhere, both infinities -> NaN; one infinity -> itself (IEEE 754)")
    void specialValues() {
        double inf = Double.POSITIVE_INFINITY;
        assertTrue(Double.isNaN(ExactSum.sum(new double[] {1.0, Double.NaN, 2.0}, 0, 3)));
        assertTrue(Double.isNaN(ExactSum.sum(new double[] {inf, Double.NaN}, 0, 2)));
        assertTrue(Double.isNaN(ExactSum.sum(new double[] {inf, 5.0, -inf}, 0, 3)));
        assertEquals(inf, ExactSum.sum(new double[] {1.0, inf, -Double.MAX_VALUE, inf}, 0, 4));
        assertEquals(-inf, ExactSum.sum(new double[] {-inf, Double.MAX_VALUE, Double.MAX_VALUE}, 0, 3));
        ExactSum plus = accumulate(new double[] {inf, 1.0});
        ExactSum minus = accumulate(new double[] {-inf, 1.0});
        ExactSum merged = plus.copy();
        merged.add(minus);
        assertTrue(Double.isNaN(merged.doubleValue()));
        ExactSum fromNaN = accumulate(new double[] {Double.NaN});
        assertEquals(merged, fromNaN, "both ways of reaching NaN hold the same state");
        merged.reset();
        merged.add(2.5);
        assertEquals(2.5, merged.doubleValue());
        assertEquals(0.0, new ExactSum().doubleValue());
        assertEquals(Double.doubleToRawLongBits(0.0),
                Double.doubleToRawLongBits(ExactSum.sum(new double[] {-0.0, -0.0}, 0, 2)),
                "an exact zero reads as +0.0 (documented)");
    }

    @Test
    @DisplayName("merging partials in random groupings and orders gives bit-identical results")
    void groupingIndependence() {
        SplittableRandom random = new SplittableRandom(99);
        double[] values = new double[4000];
        for (int i = 0; i < values.length; i++) {
            values[i] = random.nextInt(4) == 0 ? anyFinite(random) * 0x1p-900 : inBand(random, -30, 30);
        }
        BigDecimal exact = exactSum(values);
        ExactSum whole = accumulate(values);
        long expected = Double.doubleToRawLongBits(whole.doubleValue());
        assertCorrectlyRounded(exact, whole.doubleValue(), "whole");
        for (int trial = 0; trial < 40; trial++) {
            double[] shuffled = values.clone();
            shuffle(shuffled, random);
            List<ExactSum> partials = new ArrayList<>();
            int start = 0;
            while (start < shuffled.length) {
                int end = Math.min(shuffled.length, start + 1 + random.nextInt(3000));
                ExactSum partial = new ExactSum();
                if (random.nextBoolean()) {
                    partial.add(shuffled, start, end);
                } else {
                    for (int i = start; i < end; i++) {
                        partial.add(shuffled[i]);
                    }
                }
                // Half of the partials travel through the compact form, as over the network.
                partials.add(random.nextBoolean() ? partial : ExactSum.fromCompactArray(partial.toCompactArray()));
                start = end;
            }
            // Merge in a random tree: repeatedly merge two random partials.
            while (partials.size() > 1) {
                ExactSum a = partials.remove(random.nextInt(partials.size()));
                ExactSum b = partials.remove(random.nextInt(partials.size()));
                a.add(b);
                partials.add(a);
            }
            ExactSum result = partials.get(0);
            assertEquals(expected, Double.doubleToRawLongBits(result.doubleValue()), "trial " + trial);
            assertEquals(whole, result, "trial " + trial + " exact value");
            assertEquals(whole.hashCode(), result.hashCode());
        }
    }

    @Test
    @DisplayName("compact form: round trip keeps value, equality and merge behaviour; small size")
    void compactRoundTrip() {
        SplittableRandom random = new SplittableRandom(5);
        List<double[]> cases = new ArrayList<>();
        cases.add(new double[] {});
        cases.add(new double[] {1.0});
        cases.add(new double[] {-1.0});
        cases.add(new double[] {Double.MIN_VALUE});
        cases.add(new double[] {-Double.MAX_VALUE, -Double.MAX_VALUE});
        cases.add(new double[] {Double.NaN});
        cases.add(new double[] {Double.NEGATIVE_INFINITY, 3.0});
        cases.add(new double[] {0.1, 0.2, -0.3});
        for (int k = 0; k < 30; k++) {
            double[] values = new double[1 + random.nextInt(50)];
            for (int i = 0; i < values.length; i++) {
                values[i] = random.nextBoolean() ? anyFinite(random) : inBand(random, -5, 5);
            }
            cases.add(values);
        }
        double[] other = {Math.PI, -1e-300, 7e200};
        for (double[] values : cases) {
            ExactSum original = accumulate(values);
            long[] compact = original.toCompactArray();
            ExactSum restored = ExactSum.fromCompactArray(compact);
            assertEquals(Double.doubleToRawLongBits(original.doubleValue()),
                    Double.doubleToRawLongBits(restored.doubleValue()));
            assertEquals(original, restored);
            ExactSum mergedOriginal = accumulate(other);
            mergedOriginal.add(original);
            ExactSum mergedRestored = accumulate(other);
            mergedRestored.add(restored);
            assertEquals(mergedOriginal, mergedRestored);
            assertEquals(Double.doubleToRawLongBits(mergedOriginal.doubleValue()),
                    Double.doubleToRawLongBits(mergedRestored.doubleValue()));
            assertTrue(java.util.Arrays.equals(compact, restored.toCompactArray()), "compact form is canonical");
        }
        assertEquals(1, new ExactSum().toCompactArray().length, "zero");
        assertEquals(1, accumulate(new double[] {Double.NaN}).toCompactArray().length, "NaN");
        assertTrue(accumulate(new double[] {1.0}).toCompactArray().length <= 2, "one");
        assertTrue(accumulate(new double[] {-Math.PI}).toCompactArray().length <= 3, "minus pi");
        double[] fewBinades = new double[1000];
        for (int i = 0; i < fewBinades.length; i++) {
            fewBinades[i] = inBand(random, -3, 3);
        }
        assertTrue(accumulate(fewBinades).toCompactArray().length <= 4, "terms within a few binades");
    }

    @Test
    @DisplayName("malformed compact arrays are refused with a message naming the argument")
    void malformedCompact() {
        long[] good = accumulate(new double[] {Math.E, 1e10}).toCompactArray();
        long[] truncated = java.util.Arrays.copyOf(good, good.length - 1);
        long[] badTag = good.clone();
        badTag[0] ^= 1L << 60;
        for (long[] bad : new long[][] {null, {}, truncated, badTag, {0L}}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> ExactSum.fromCompactArray(bad));
            assertTrue(e.getMessage().contains("compact"), e.getMessage());
        }
    }

    @Test
    @DisplayName("equality is by exact value, whatever the internal carries")
    void equalityByValue() {
        ExactSum manyOnes = new ExactSum();
        for (int i = 0; i < 3000; i++) {
            manyOnes.add(1.0); // leaves carries pending (propagation every 2047 adds)
        }
        ExactSum once = accumulate(new double[] {3000.0});
        assertEquals(once, manyOnes);
        assertEquals(once.hashCode(), manyOnes.hashCode());
        // 0.1 + 0.2 and 0.3 differ exactly (their BigDecimal expansions differ) and as doubles.
        assertNotEquals(new BigDecimal(0.1).add(new BigDecimal(0.2)), new BigDecimal(0.3));
        assertNotEquals(accumulate(new double[] {0.3}), accumulate(new double[] {0.1, 0.2}));
        ExactSum a = accumulate(new double[] {1.0, -1.0});
        assertEquals(new ExactSum(), a);
        assertNotEquals(accumulate(new double[] {1.0}), accumulate(new double[] {-1.0}));
    }

    @Test
    @DisplayName("copy is independent; merge with itself doubles; array ranges are checked")
    void copyMergeAndRanges() {
        ExactSum sum = accumulate(new double[] {1.5, 2.25});
        ExactSum copy = sum.copy();
        copy.add(10.0);
        assertEquals(3.75, sum.doubleValue());
        assertEquals(13.75, copy.doubleValue());
        sum.add(sum);
        assertEquals(7.5, sum.doubleValue());
        double[] values = {1.0, 2.0, 4.0, 8.0};
        assertEquals(6.0, ExactSum.sum(values, 1, 3));
        assertEquals(0.0, ExactSum.sum(values, 2, 2));
        for (int[] range : new int[][] {{-1, 2}, {3, 2}, {0, 5}}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> ExactSum.sum(values, range[0], range[1]));
            assertTrue(e.getMessage().contains("from") && e.getMessage().contains("to"), e.getMessage());
        }
        try {
            new ExactSum().add((double[]) null, 0, 0);
            fail("null array accepted");
        } catch (NullPointerException expected) {
            // the array is required
        }
    }
}
