package org.skerry.engine.program;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.ArrayList;
import java.util.List;

/**
 * A file-mode program's input file with placeholders: {@code {{NAME}}} for a parameter's value,
 * {@code {{NAME:hex}}} for it in C99 hexadecimal, {@code {{seed}}} and {@code {{iteration}}}.
 * Values are written as 17 significant decimal digits in scientific notation
 * ({@code 1.2345678901234567e+00}), which every language's reader (Fortran's included) reads back
 * to the same double, and which is the same text on every JDK. Any other {@code {{…}}} is refused
 * when the template is read. Immutable.
 */
public final class InputTemplate {

    private static final MathContext DIGITS = new MathContext(17, RoundingMode.HALF_EVEN);
    private static final int SEED = -1;
    private static final int ITERATION = -2;

    private final List<String> literals;
    /** Per placeholder: a parameter index, or SEED / ITERATION; hexadecimal when {@code hex} says so. */
    private final int[] slots;
    private final boolean[] hex;

    private InputTemplate(List<String> literals, int[] slots, boolean[] hex) {
        this.literals = literals;
        this.slots = slots;
        this.hex = hex;
    }

    /**
     * Parses {@code text} for parameters {@code names}.
     *
     * @throws IllegalArgumentException naming the first unknown or unclosed placeholder
     */
    public static InputTemplate parse(String text, List<String> names) {
        List<String> literals = new ArrayList<>();
        List<Integer> slots = new ArrayList<>();
        List<Boolean> hex = new ArrayList<>();
        int at = 0;
        while (true) {
            int open = text.indexOf("{{", at);
            if (open < 0) {
                literals.add(text.substring(at));
                break;
            }
            int close = text.indexOf("}}", open + 2);
            if (close < 0) {
                throw new IllegalArgumentException("the placeholder at character " + open + " is not closed with }}");
            }
            literals.add(text.substring(at, open));
            String name = text.substring(open + 2, close).strip();
            boolean inHex = name.endsWith(":hex");
            if (inHex) {
                name = name.substring(0, name.length() - 4).strip();
            }
            int slot;
            if (name.equals("seed") && !inHex) {
                slot = SEED;
            } else if (name.equals("iteration") && !inHex) {
                slot = ITERATION;
            } else {
                slot = names.indexOf(name);
                if (slot < 0) {
                    throw new IllegalArgumentException("unknown placeholder {{" + text.substring(open + 2, close)
                            + "}}; the template knows the parameters " + names + " (add :hex for hexadecimal), "
                            + "{{seed}} and {{iteration}}");
                }
            }
            slots.add(slot);
            hex.add(inHex);
            at = close + 2;
        }
        int[] slotArray = new int[slots.size()];
        boolean[] hexArray = new boolean[hex.size()];
        for (int i = 0; i < slotArray.length; i++) {
            slotArray[i] = slots.get(i);
            hexArray[i] = hex.get(i);
        }
        return new InputTemplate(List.copyOf(literals), slotArray, hexArray);
    }

    /** The input file for vector {@code i} of {@code values} (dimension {@code d}). */
    public String render(double[] values, int d, int i, long seed, int iteration) {
        StringBuilder out = new StringBuilder(256);
        for (int k = 0; k < slots.length; k++) {
            out.append(literals.get(k));
            int slot = slots[k];
            if (slot == SEED) {
                WireNumbers.appendSeed(out, seed);
            } else if (slot == ITERATION) {
                out.append(iteration);
            } else if (hex[k]) {
                WireNumbers.appendHex(out, values[i * d + slot]);
            } else {
                appendDecimal(out, values[i * d + slot]);
            }
        }
        return out.append(literals.get(literals.size() - 1)).toString();
    }

    /** {@code x} (finite) as {@code d.dddddddddddddddde±XX}: 17 significant digits, exact enough to read back. */
    static StringBuilder appendDecimal(StringBuilder out, double x) {
        if (x == 0) {
            return out.append(Double.doubleToRawLongBits(x) < 0 ? "-" : "").append("0.0000000000000000e+00");
        }
        BigDecimal rounded = new BigDecimal(x).round(DIGITS);
        String digits = rounded.unscaledValue().abs().toString();
        digits = digits + "0".repeat(Math.max(0, 17 - digits.length()));
        int exponent = rounded.precision() - rounded.scale() - 1;
        if (rounded.signum() < 0) {
            out.append('-');
        }
        out.append(digits.charAt(0)).append('.').append(digits, 1, 17).append('e');
        out.append(exponent < 0 ? '-' : '+');
        int magnitude = Math.abs(exponent);
        if (magnitude < 10) {
            out.append('0');
        }
        return out.append(magnitude);
    }
}
