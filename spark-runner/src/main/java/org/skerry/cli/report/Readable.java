package org.skerry.cli.report;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Locale;

/**
 * Numbers as a reader wants them: four significant digits, plain decimals from 0.001 to below a
 * million and scientific notation ({@code 1.235e-05}) outside, whole counts in groups of three
 * separated by a narrow space. The exact values stay in the run's own files.
 */
final class Readable {

    /** Separates groups of three digits; a narrow no-break space, so a count never wraps. */
    static final char GROUP = '\u202F';

    private static final MathContext FOUR = new MathContext(4, RoundingMode.HALF_EVEN);

    private Readable() {
    }

    static String number(double x) {
        if (Double.isNaN(x)) {
            return "NaN";
        }
        if (Double.isInfinite(x)) {
            return x > 0 ? "Infinity" : "-Infinity";
        }
        if (x == 0) {
            return "0";
        }
        double a = Math.abs(x);
        if (a >= 1e-3 && a < 1e6) {
            BigDecimal rounded = new BigDecimal(x).round(FOUR).stripTrailingZeros();
            if (Math.abs(rounded.doubleValue()) < 1e6) {
                return rounded.scale() < 0 ? rounded.setScale(0).toPlainString() : rounded.toPlainString();
            }
        }
        return String.format(Locale.ROOT, "%.3e", x);
    }

    static String count(long n) {
        return String.format(Locale.ROOT, "%,d", n).replace(',', GROUP);
    }

    /** {@code x} as a percentage with up to three significant digits, e.g. {@code 43.7 %}. */
    static String percent(double share) {
        if (!Double.isFinite(share)) {
            return number(share * 100) + "\u00A0%";
        }
        return number(new BigDecimal(share * 100).round(new MathContext(3)).doubleValue()) + "\u00A0%";
    }
}
