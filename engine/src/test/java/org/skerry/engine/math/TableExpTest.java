package org.skerry.engine.math;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.math.BigDecimal;
import java.math.MathContext;
import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

class TableExpTest {

    private static long ulpDistance(double a, double b) {
        return Math.abs(Double.doubleToRawLongBits(a) - Double.doubleToRawLongBits(b));
    }

    @Test
    @DisplayName("within 2 ulp of StrictMath.exp (the JDK's fdlibm, < 1 ulp from exact) over the whole range")
    void closeToStrictMath() {
        SplittableRandom random = new SplittableRandom(17);
        long worst = 0;
        for (int i = 0; i < 2_000_000; i++) {
            double x = i % 2 == 0 ? -50 * random.nextDouble() : -745 + 1454 * random.nextDouble();
            double expected = StrictMath.exp(x);
            long distance = ulpDistance(expected, TableExp.exp(x));
            if (expected > Double.MIN_NORMAL) {
                worst = Math.max(worst, distance);
            } else {
                // subnormal results: compare absolutely, a few units of the smallest subnormal
                assertTrue(distance <= 2, "x=" + x);
            }
        }
        assertTrue(worst <= 2, "worst distance " + worst + " ulp");
    }

    @Test
    @DisplayName("against exp computed to 40 digits with BigDecimal's Taylor series (independent of any JDK exp)")
    void againstHighPrecision() {
        MathContext context = new MathContext(40);
        for (double x : new double[] {-44.0, -20.5, -1.0, -1e-10, 0.0, 0.3, 1.0, 10.0, 700.0}) {
            // e^x = (e^(x/2^m))^(2^m), series for the small argument
            int m = 12;
            BigDecimal small = new BigDecimal(x).divide(BigDecimal.valueOf(1L << m), context);
            BigDecimal term = BigDecimal.ONE;
            BigDecimal sum = BigDecimal.ONE;
            for (int n = 1; n < 40; n++) {
                term = term.multiply(small, context).divide(BigDecimal.valueOf(n), context);
                sum = sum.add(term, context);
            }
            for (int s = 0; s < m; s++) {
                sum = sum.multiply(sum, context);
            }
            double exact = sum.doubleValue();
            assertTrue(ulpDistance(exact, TableExp.exp(x)) <= 2, "x=" + x + " exact " + exact + " got " + TableExp.exp(x));
        }
    }

    @Test
    void specialValues() {
        assertEquals(1.0, TableExp.exp(0.0));
        assertEquals(0.0, TableExp.exp(Double.NEGATIVE_INFINITY));
        assertEquals(0.0, TableExp.exp(-800));
        assertEquals(Double.POSITIVE_INFINITY, TableExp.exp(710));
        assertEquals(Double.POSITIVE_INFINITY, TableExp.exp(Double.POSITIVE_INFINITY));
        assertTrue(Double.isNaN(TableExp.exp(Double.NaN)));
    }
}
