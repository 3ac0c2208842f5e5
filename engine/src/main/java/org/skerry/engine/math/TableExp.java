package org.skerry.engine.math;

/**
 * A fast exponential in pure Java for hot loops whose results feed the answer (quantising
 * weights for resampling): {@code exp(x) = 2^e · 2^(j/64) · p(r)} with {@code k = round(64x/ln 2)},
 * {@code j = k mod 64}, {@code e = ⌊k/64⌋}, {@code r = x − k·ln2/64} (|r| ≤ ln2/128, reduced with a
 * two-part constant) and {@code p} the degree-5 Taylor polynomial of {@code e^r}, whose truncation
 * error is below 4·10⁻¹⁷ relative. Tang's table-driven method (P. T. P. Tang 1989, "Table-driven
 * implementation of the exponential function in IEEE floating-point arithmetic", ACM TOMS 15(2)),
 * with a smaller table and no claim of correct rounding: results are within a few ulp of
 * {@link StrictMath#exp}.
 *
 * <p>Java 17 evaluates every floating-point operation strictly (IEEE 754 binary64, round to
 * nearest), and the table is computed once from {@link StrictMath}, so the result is the same
 * bit pattern on every JVM and processor — the property skerry needs — at about a third of the
 * cost of {@link StrictMath#exp}.
 */
public final class TableExp {

    private static final int TABLE_BITS = 6;
    private static final int TABLE_SIZE = 1 << TABLE_BITS;
    private static final double[] TABLE = new double[TABLE_SIZE];
    private static final double SCALE = TABLE_SIZE / 0.6931471805599453;
    /**
     * ln2/64 as HIGH + LOW: HIGH keeps 24 significant bits, so k·HIGH is exact for every k the
     * range allows (|k| < 2^17); LOW carries the rest, including the error of the double ln 2.
     */
    private static final double LN2_OVER_64_HIGH;
    private static final double LN2_OVER_64_LOW;
    private static final double OVERFLOW = 709.782712893384;
    private static final double UNDERFLOW = -745.1332191019412;

    static {
        for (int j = 0; j < TABLE_SIZE; j++) {
            TABLE[j] = StrictMath.pow(2.0, (double) j / TABLE_SIZE);
        }
        double ln2Over64 = StrictMath.log(2.0) / TABLE_SIZE;
        LN2_OVER_64_HIGH = Double.longBitsToDouble(Double.doubleToRawLongBits(ln2Over64) & 0xFFFFFFFFE0000000L);
        // ln 2 − (double) ln 2 = 2.3190468138462996e-17 (ln 2 to 30 digits: 0.693147180559945309417232121458).
        LN2_OVER_64_LOW = (ln2Over64 - LN2_OVER_64_HIGH) + 2.3190468138462996e-17 / TABLE_SIZE;
    }

    private TableExp() {
    }

    /** {@code e^x}; NaN for NaN, {@code +Infinity} above about 709.78, 0 below about −745.13. */
    public static double exp(double x) {
        if (!(x > UNDERFLOW)) {
            return x != x ? x : 0.0;
        }
        if (x > OVERFLOW) {
            return Double.POSITIVE_INFINITY;
        }
        double t = x * SCALE;
        long k = (long) (t >= 0 ? t + 0.5 : t - 0.5);
        double r = (x - k * LN2_OVER_64_HIGH) - k * LN2_OVER_64_LOW;
        double p = 1.0 + r * (1.0 + r * (0.5 + r * (1.0 / 6 + r * (1.0 / 24 + r * (1.0 / 120)))));
        int j = (int) (k & (TABLE_SIZE - 1));
        long e = k >> TABLE_BITS;
        double mantissa = TABLE[j] * p;
        if (e > -1022 && e < 1023) {
            return mantissa * Double.longBitsToDouble((e + 1023) << 52);
        }
        return Math.scalb(mantissa, (int) e);
    }
}
