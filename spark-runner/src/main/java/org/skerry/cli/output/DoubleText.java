package org.skerry.cli.output;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;

/**
 * The text form of a {@code double} in every output file: the same characters on every JDK, and
 * read back by {@link Double#parseDouble} to exactly the same bits.
 *
 * <p>The digits are those of the exact binary value rounded half-even to 15 significant digits,
 * or to 16, or to 17: the first of these that reads back to the same double, trailing zeros
 * removed. Any decimal of 15 or fewer digits survives the trip to a normal double and back, so
 * for normal doubles this is the shortest round-trip form whenever one of 15 digits or fewer
 * exists; 17 digits always suffice. {@link Double#toString} is not used because its digits changed
 * in JDK 19.
 *
 * <p>Notation: plain ({@code 0.000123}, {@code 42.0}, {@code 1234.5}) when the decimal exponent is
 * between −6 and 15 inclusive, that is for 10⁻⁶ ≤ |x| &lt; 10¹⁶; otherwise scientific with one
 * digit before the point and a lower-case {@code e} ({@code 1.0e-300}, {@code -2.5e20}). There is
 * always a digit after the point, so every value reads as floating-point in tools that guess
 * column types. Zero keeps its sign ({@code 0.0}, {@code -0.0}). Non-finite values are spelled
 * {@code NaN}, {@code Infinity} and {@code -Infinity}, the spellings {@code parseDouble} accepts;
 * JSON has no such numbers, so the JSON writers write {@code null} instead (see
 * {@link #isWritableAsJsonNumber}).
 */
public final class DoubleText {

    private static final MathContext[] DIGITS = {
        new MathContext(15, RoundingMode.HALF_EVEN),
        new MathContext(16, RoundingMode.HALF_EVEN),
        new MathContext(17, RoundingMode.HALF_EVEN),
    };

    private static final int LOWEST_PLAIN_EXPONENT = -6;
    private static final int HIGHEST_PLAIN_EXPONENT = 15;

    private DoubleText() {
    }

    /** The text of {@code x}; see the class description for the exact rules. */
    public static String format(double x) {
        if (Double.isNaN(x)) {
            return "NaN";
        }
        if (Double.isInfinite(x)) {
            return x > 0 ? "Infinity" : "-Infinity";
        }
        if (x == 0.0) {
            return Double.doubleToRawLongBits(x) == 0L ? "0.0" : "-0.0";
        }
        return render(digits(x));
    }

    /** Whether {@code x} can be written as a JSON number (it is finite); otherwise write null. */
    public static boolean isWritableAsJsonNumber(double x) {
        return Double.isFinite(x);
    }

    private static BigDecimal digits(double x) {
        BigDecimal exact = new BigDecimal(x);
        for (int i = 0; i < DIGITS.length - 1; i++) {
            BigDecimal rounded = exact.round(DIGITS[i]);
            // parseDouble is specified to round correctly, so this check means the same on every JDK.
            if (Double.parseDouble(rounded.toString()) == x) {
                return rounded.stripTrailingZeros();
            }
        }
        return exact.round(DIGITS[DIGITS.length - 1]).stripTrailingZeros();
    }

    private static String render(BigDecimal value) {
        String digits = value.unscaledValue().abs().toString();
        int exponent = digits.length() - 1 - value.scale();
        StringBuilder text = new StringBuilder(digits.length() + 8);
        if (value.signum() < 0) {
            text.append('-');
        }
        if (exponent < LOWEST_PLAIN_EXPONENT || exponent > HIGHEST_PLAIN_EXPONENT) {
            text.append(digits.charAt(0)).append('.');
            text.append(digits.length() > 1 ? digits.substring(1) : "0");
            text.append('e').append(exponent);
        } else if (exponent < 0) {
            text.append("0.");
            text.append("0".repeat(-exponent - 1));
            text.append(digits);
        } else if (digits.length() > exponent + 1) {
            text.append(digits, 0, exponent + 1).append('.').append(digits, exponent + 1, digits.length());
        } else {
            text.append(digits).append("0".repeat(exponent + 1 - digits.length())).append(".0");
        }
        return text.toString();
    }
}
