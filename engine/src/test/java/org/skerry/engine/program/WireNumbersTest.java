package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.SplittableRandom;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** The protocol's number text: hexadecimal and decimal read back to the same bits. */
class WireNumbersTest {

    private static double roundTrip(double x) {
        return WireNumbers.parse(WireNumbers.appendHex(new StringBuilder(), x).toString());
    }

    @Test
    @DisplayName("hexadecimal text (the characters of Double.toHexString) reads back to the same bits: random bit patterns, subnormals, extremes")
    void hexRoundTrip() {
        SplittableRandom random = new SplittableRandom(5);
        for (int i = 0; i < 20_000; i++) {
            double x = Double.longBitsToDouble(random.nextLong());
            if (!Double.isFinite(x)) {
                continue;
            }
            assertEquals(Double.doubleToRawLongBits(x), Double.doubleToRawLongBits(roundTrip(x)), Double.toHexString(x));
            assertEquals(Double.toHexString(x), WireNumbers.appendHex(new StringBuilder(), x).toString());
        }
        for (double x : new double[] {0.0, -0.0, Double.MIN_VALUE, -Double.MIN_VALUE, Double.MIN_NORMAL,
                Math.nextDown(Double.MIN_NORMAL), Double.MAX_VALUE, 1.0, -2.5, 0.1}) {
            assertEquals(Double.doubleToRawLongBits(x), Double.doubleToRawLongBits(roundTrip(x)), Double.toHexString(x));
            assertEquals(Double.toHexString(x), WireNumbers.appendHex(new StringBuilder(), x).toString(),
                    "the same characters as Double.toHexString");
        }
    }

    @Test
    @DisplayName("C's %a and Python's float.hex spellings; decimals; infinities and NaN in their usual spellings")
    void otherSpellings() {
        // C99 printf("%a", 3.0) and Python float.hex(3.0); Python float.hex(0.1) (values from those languages' rules)
        assertEquals(3.0, WireNumbers.parse("0x1.8p+1"));
        assertEquals(0.1, WireNumbers.parse("0x1.999999999999ap-4"));
        assertEquals(-0.0, WireNumbers.parse("-0x0.0p+0"));
        assertEquals(Double.MIN_VALUE, WireNumbers.parse("0x0.0000000000001p-1022"));
        assertEquals(1.0, WireNumbers.parse("0x10p-4"));
        assertEquals(0.1, WireNumbers.parse("0.1"));
        assertEquals(-1234.5e-3, WireNumbers.parse("-1234.5e-3"));
        assertEquals(17.0, WireNumbers.parse("17"));
        assertEquals(Double.NEGATIVE_INFINITY, WireNumbers.parse("-inf"));
        assertEquals(Double.NEGATIVE_INFINITY, WireNumbers.parse("-Infinity"));
        assertEquals(Double.POSITIVE_INFINITY, WireNumbers.parse("inf"));
        assertEquals(Double.NaN, WireNumbers.parse("nan"));
        assertEquals(Double.NaN, WireNumbers.parse("NaN"));
    }

    @Test
    @DisplayName("anything else is refused, naming the text")
    void refusals() {
        for (String text : new String[] {"", "abc", "1.0f", "1d", "0x1.8", "1e", "--1", "1.2.3", " 1", "1 ", "0x", "."}) {
            NumberFormatException e = assertThrows(NumberFormatException.class, () -> WireNumbers.parse(text), text);
            assertEquals(true, e.getMessage().contains("number"), e.getMessage());
        }
    }
}
