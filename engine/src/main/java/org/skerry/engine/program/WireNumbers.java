package org.skerry.engine.program;

/**
 * How numbers travel between skerry and a worker program, exactly: skerry writes parameter values
 * as C99 hexadecimal floating-point text ({@link Double#toHexString}, Python's {@code float.hex},
 * C's {@code %a}), which names the binary value itself, so no rounding happens on either side and
 * the text is the same on every JDK. Replies may use that form or any decimal text that reads back
 * to the intended double (shortest round-trip decimals, {@code %.17g}); {@code -inf} is a zero
 * likelihood. Seeds are unsigned 64-bit whole numbers in decimal.
 *
 * <p>Hexadecimal was chosen over shortest decimals by measurement (benchmarks/RESULTS.md,
 * "Program models: number text"): writing it costs skerry a fraction of a correct shortest
 * decimal, and Python reads it about as fast as decimal.
 */
public final class WireNumbers {

    private static final long TWO_TO_53 = 1L << 53;

    private WireNumbers() {
    }

    /** Appends {@code x} (finite) as C99 hexadecimal text. */
    public static StringBuilder appendHex(StringBuilder out, double x) {
        return out.append(Double.toHexString(x));
    }

    /** Appends {@code seed} as an unsigned decimal whole number. */
    public static StringBuilder appendSeed(StringBuilder out, long seed) {
        return out.append(Long.toUnsignedString(seed));
    }

    /**
     * The double {@code text} names: C99 hexadecimal ({@code 0x1.8p+1}), decimal ({@code 3},
     * {@code -2.5e-3}), or one of {@code inf}, {@code -inf}, {@code infinity}, {@code nan} in any
     * case, with an optional sign.
     *
     * @throws NumberFormatException naming the text when it is none of these
     */
    public static double parse(String text) {
        String t = text;
        int n = t.length();
        if (n == 0) {
            throw new NumberFormatException("empty number");
        }
        int start = t.charAt(0) == '-' || t.charAt(0) == '+' ? 1 : 0;
        boolean negative = t.charAt(0) == '-';
        String body = t.substring(start);
        if (body.equalsIgnoreCase("inf") || body.equalsIgnoreCase("infinity")) {
            return negative ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
        }
        if (body.equalsIgnoreCase("nan")) {
            return Double.NaN;
        }
        if (body.length() > 2 && body.charAt(0) == '0' && (body.charAt(1) == 'x' || body.charAt(1) == 'X')) {
            double value = hex(body, text);
            return negative ? -value : value;
        }
        checkDecimal(body, text);
        return Double.parseDouble(t);
    }

    private static void checkDecimal(String body, String text) {
        int i = 0;
        int n = body.length();
        int digits = 0;
        while (i < n && Character.isDigit(body.charAt(i)) && body.charAt(i) < 128) {
            i++;
            digits++;
        }
        if (i < n && body.charAt(i) == '.') {
            i++;
            while (i < n && body.charAt(i) >= '0' && body.charAt(i) <= '9') {
                i++;
                digits++;
            }
        }
        if (digits == 0) {
            throw new NumberFormatException("not a number: '" + text + "'");
        }
        if (i < n && (body.charAt(i) == 'e' || body.charAt(i) == 'E')) {
            i++;
            if (i < n && (body.charAt(i) == '+' || body.charAt(i) == '-')) {
                i++;
            }
            int exponentDigits = 0;
            while (i < n && body.charAt(i) >= '0' && body.charAt(i) <= '9') {
                i++;
                exponentDigits++;
            }
            if (exponentDigits == 0) {
                throw new NumberFormatException("not a number: '" + text + "'");
            }
        }
        if (i != n) {
            throw new NumberFormatException("not a number: '" + text + "'");
        }
    }

    /**
     * A non-negative hexadecimal float ({@code 0x} already checked). Up to 13 significant hex
     * digits of a normal result are converted here exactly (an integer below 2^53 scaled by a
     * power of two); anything else goes to {@link Double#parseDouble}, which rounds correctly but
     * is slower (it matches a regular expression).
     */
    private static double hex(String body, String text) {
        int i = 2;
        int n = body.length();
        long mantissa = 0;
        int significant = 0;
        int fractionDigits = 0;
        boolean point = false;
        boolean anyDigit = false;
        boolean exact = true;
        for (; i < n; i++) {
            char c = body.charAt(i);
            int v = Character.digit(c, 16);
            if (c == '.' && !point) {
                point = true;
                continue;
            }
            if (v < 0 || c > 127) {
                break;
            }
            anyDigit = true;
            if (mantissa == 0 && v == 0) {
                if (point) {
                    fractionDigits++;
                }
                continue;
            }
            if (significant >= 14) {
                exact = false;
                continue;
            }
            mantissa = mantissa << 4 | v;
            significant++;
            if (point) {
                fractionDigits++;
            }
        }
        if (!anyDigit || i >= n || (body.charAt(i) != 'p' && body.charAt(i) != 'P')) {
            throw new NumberFormatException("not a number: '" + text + "' (hexadecimal needs digits and a p exponent)");
        }
        i++;
        int sign = 1;
        if (i < n && (body.charAt(i) == '+' || body.charAt(i) == '-')) {
            sign = body.charAt(i) == '-' ? -1 : 1;
            i++;
        }
        if (i >= n) {
            throw new NumberFormatException("not a number: '" + text + "'");
        }
        long exponent = 0;
        for (; i < n; i++) {
            char c = body.charAt(i);
            if (c < '0' || c > '9') {
                throw new NumberFormatException("not a number: '" + text + "'");
            }
            if (exponent < 100_000) {
                exponent = exponent * 10 + (c - '0');
            }
        }
        if (mantissa == 0 && exact) {
            return 0.0;
        }
        long scale = sign * exponent - 4L * fractionDigits;
        if (exact && mantissa < TWO_TO_53 && Math.abs(scale) < 2000) {
            double value = Math.scalb((double) mantissa, (int) scale);
            if (value >= Double.MIN_NORMAL && value <= Double.MAX_VALUE) {
                return value;
            }
        }
        return Double.parseDouble(body);
    }
}
