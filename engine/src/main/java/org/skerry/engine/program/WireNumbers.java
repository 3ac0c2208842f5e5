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
 * "Program models: number text"): skerry writes it in 78 ns against 2.2 µs for a shortest decimal
 * and reads it in 81 ns against 293 ns; Python reads and writes it about twice as fast as decimal.
 */
public final class WireNumbers {

    private static final long TWO_TO_53 = 1L << 53;

    private WireNumbers() {
    }

    private static final char[] DIGITS = "0123456789abcdef".toCharArray();

    /**
     * Appends {@code x} (finite) as C99 hexadecimal text, the characters {@link Double#toHexString}
     * gives ({@code 0x1.8p1}, {@code -0x0.0p0}, {@code 0x0.0000000000001p-1022}), written without
     * its regular expression, which costs it most of a microsecond a number.
     */
    public static StringBuilder appendHex(StringBuilder out, double x) {
        if (!Double.isFinite(x)) {
            return out.append(Double.toHexString(x));
        }
        long bits = Double.doubleToRawLongBits(x);
        if (bits < 0) {
            out.append('-');
        }
        int biased = (int) (bits >>> 52) & 0x7ff;
        long fraction = bits & 0xfffffffffffffL;
        if (biased == 0 && fraction == 0) {
            return out.append("0x0.0p0");
        }
        out.append(biased == 0 ? "0x0." : "0x1.");
        if (fraction == 0) {
            out.append('0');
        } else {
            int digits = 13;
            while ((fraction & 0xf) == 0) {
                fraction >>>= 4;
                digits--;
            }
            for (int shift = 4 * (digits - 1); shift >= 0; shift -= 4) {
                out.append(DIGITS[(int) (fraction >>> shift) & 0xf]);
            }
        }
        return out.append('p').append(biased == 0 ? -1022 : biased - 1023);
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
