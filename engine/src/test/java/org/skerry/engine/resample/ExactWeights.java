package org.skerry.engine.resample;

import java.math.BigDecimal;
import java.math.BigInteger;

/**
 * Test helper: the fixed-point weights and {@code N q_i / T} in exact arithmetic with
 * {@link BigDecimal}/{@link BigInteger} (the JDK's general-purpose arbitrary-precision classes),
 * independent of the production integer code.
 */
final class ExactWeights {

    private static final BigDecimal TWO_POW_62 = new BigDecimal(BigInteger.ONE.shiftLeft(62));

    final BigInteger[] q;
    final BigInteger total;

    ExactWeights(double[] logWeights, double logNormaliser) {
        this(logWeights, logNormaliser, 0);
    }

    ExactWeights(double[] logWeights, double reference, double logSumRelative) {
        q = new BigInteger[logWeights.length];
        BigInteger sum = BigInteger.ZERO;
        for (int i = 0; i < logWeights.length; i++) {
            double e = StrictMath.exp((logWeights[i] - reference) - logSumRelative);
            // floor(e * 2^62) exactly, clamped to [0, 2^62] as specified for the quantiser.
            BigInteger v = new BigDecimal(e).multiply(TWO_POW_62).setScale(0, java.math.RoundingMode.FLOOR)
                    .toBigInteger();
            q[i] = v.min(BigInteger.ONE.shiftLeft(62));
            sum = sum.add(q[i]);
        }
        total = sum;
    }

    /** {@code floor(N q_i / T)}. */
    long floor(int n, int i) {
        return BigInteger.valueOf(n).multiply(q[i]).divide(total).longValueExact();
    }

    /** {@code ceil(N q_i / T)}. */
    long ceil(int n, int i) {
        BigInteger[] qr = BigInteger.valueOf(n).multiply(q[i]).divideAndRemainder(total);
        return qr[0].longValueExact() + (qr[1].signum() > 0 ? 1 : 0);
    }
}
