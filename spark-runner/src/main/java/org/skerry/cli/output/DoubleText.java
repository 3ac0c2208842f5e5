package org.skerry.cli.output;

import com.fasterxml.jackson.core.io.NumberOutput;
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
 *
 * <p>Speed: {@link #format} takes its digits from Jackson's port of Giulietti's Schubfach (2020),
 * the shortest decimal that reads back, closest to {@code x} among the shortest (ties to even),
 * computed in integer arithmetic and so the same on every JVM. For a normal double those are the
 * digits of the rule above: at most one decimal of 15 digits or fewer lies in a normal double's
 * rounding interval (their spacing is over four times its width), so when one exists it is both
 * the shortest and the correctly rounded one; a 17-digit correctly rounded value always lies in
 * the interval and is the closest there. With 16 digits the two agree whenever the interval is
 * symmetric around {@code x}, because the closest 16-digit decimal is then inside it whenever any
 * is. They can differ only where the interval is lopsided (a power of two, whose neighbour below is
 * twice as close) and for subnormals, whose interval is wide relative to the value; a power of two
 * with 16 shortest digits and every subnormal take the exact BigDecimal path, {@link #formatExact}, which is the definition. {@code DoubleTextTest} and
 * the benchmark harness {@code DoubleTextAgreement} check the agreement bit for bit.
 */
public final class DoubleText {

    private static final MathContext[] DIGITS = {
        new MathContext(15, RoundingMode.HALF_EVEN),
        new MathContext(16, RoundingMode.HALF_EVEN),
        new MathContext(17, RoundingMode.HALF_EVEN),
    };

    private static final int LOWEST_PLAIN_EXPONENT = -6;
    private static final int HIGHEST_PLAIN_EXPONENT = 15;
    /** Digit characters in Jackson's text: 17 significant, or up to 8 with the point's padding zero. */
    private static final int MAX_DIGITS = 17;
    private static final long EXPONENT_MASK = 0x7ff0_0000_0000_0000L;
    private static final long SIGNIFICAND_MASK = 0x000f_ffff_ffff_ffffL;

    private DoubleText() {
    }

    /** The text of {@code x}; see the class description for the exact rules. */
    public static String format(double x) {
        long bits = Double.doubleToRawLongBits(x);
        long exponentBits = bits & EXPONENT_MASK;
        if (exponentBits == 0L || exponentBits == EXPONENT_MASK) {
            return formatExact(x); // zero, subnormal, infinite or NaN: rare, or the shortest differs
        }
        String shortest = NumberOutput.toString(x, true);
        if ((bits & SIGNIFICAND_MASK) != 0L && shortest.indexOf('E') < 0) {
            // Jackson writes 10^-3 <= |x| < 10^7 in plain notation by the same rules as ours
            // (a digit after the point, no other trailing zero), so its text is ours as it is.
            return shortest;
        }
        char[] digits = new char[MAX_DIGITS];
        int count = 0;
        int pointAt = -1;
        int leadingZerosAfterPoint = 0;
        int exponent = 0;
        int length = shortest.length();
        int start = x < 0 ? 1 : 0;
        for (int i = start; i < length; i++) {
            char c = shortest.charAt(i);
            if (c == '.') {
                pointAt = count;
            } else if (c == 'E') {
                exponent = Integer.parseInt(shortest, i + 1, length, 10);
                break;
            } else if (c != '0' || count > 0) {
                digits[count++] = c;
            } else if (pointAt >= 0) {
                leadingZerosAfterPoint++; // as in 0.00123: each shifts the exponent down by one
            }
        }
        while (digits[count - 1] == '0') {
            count--;
        }
        if (count == 16 && (bits & SIGNIFICAND_MASK) == 0L) {
            return formatExact(x); // a power of two: the shortest may not be the rounded 16 digits
        }
        // Jackson always writes a point; the significant digits before it give the exponent.
        int decimalExponent = exponent + pointAt - leadingZerosAfterPoint - 1;
        return render(x < 0, digits, count, decimalExponent);
    }

    /**
     * The text of {@code x} by the exact BigDecimal path: the definition {@link #format} agrees with
     * character for character, kept for the cases the fast path hands over and to check it.
     */
    public static String formatExact(double x) {
        if (Double.isNaN(x)) {
            return "NaN";
        }
        if (Double.isInfinite(x)) {
            return x > 0 ? "Infinity" : "-Infinity";
        }
        if (x == 0.0) {
            return Double.doubleToRawLongBits(x) == 0L ? "0.0" : "-0.0";
        }
        BigDecimal value = digits(x);
        String digits = value.unscaledValue().abs().toString();
        return render(value.signum() < 0, digits.toCharArray(), digits.length(), digits.length() - 1 - value.scale());
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

    /** Writes {@code count} significant digits (no trailing zero) with decimal exponent {@code exponent}. */
    private static String render(boolean negative, char[] digits, int count, int exponent) {
        // At most: sign, 17 digits, point, 6 zeros before them (plain) or "e-324" (scientific).
        char[] text = new char[32];
        int at = 0;
        if (negative) {
            text[at++] = '-';
        }
        if (exponent < LOWEST_PLAIN_EXPONENT || exponent > HIGHEST_PLAIN_EXPONENT) {
            text[at++] = digits[0];
            text[at++] = '.';
            if (count > 1) {
                System.arraycopy(digits, 1, text, at, count - 1);
                at += count - 1;
            } else {
                text[at++] = '0';
            }
            text[at++] = 'e';
            if (exponent < 0) {
                text[at++] = '-';
            }
            String magnitude = Integer.toString(Math.abs(exponent));
            magnitude.getChars(0, magnitude.length(), text, at);
            at += magnitude.length();
        } else if (exponent < 0) {
            text[at++] = '0';
            text[at++] = '.';
            for (int i = 0; i < -exponent - 1; i++) {
                text[at++] = '0';
            }
            System.arraycopy(digits, 0, text, at, count);
            at += count;
        } else if (count > exponent + 1) {
            System.arraycopy(digits, 0, text, at, exponent + 1);
            at += exponent + 1;
            text[at++] = '.';
            System.arraycopy(digits, exponent + 1, text, at, count - exponent - 1);
            at += count - exponent - 1;
        } else {
            System.arraycopy(digits, 0, text, at, count);
            at += count;
            for (int i = count; i < exponent + 1; i++) {
                text[at++] = '0';
            }
            text[at++] = '.';
            text[at++] = '0';
        }
        return new String(text, 0, at);
    }
}
