package org.skerry.engine.math;

import java.util.Arrays;

/**
 * An exact, order-independent accumulator of doubles: it holds the exact sum of everything added
 * and reads it back correctly rounded (round half to even), so the answer does not depend on the
 * order of addition nor on how partial sums were grouped across threads or partitions.
 *
 * <p>The method is Radford M. Neal's "small superaccumulator" (Neal 2015, "Fast exact summation
 * using small and large superaccumulators", arXiv:1505.05571): a fixed-point number spanning the
 * whole double range, from the least subnormal 2<sup>-1074</sup> upwards, kept as 67 signed
 * 64-bit chunks of which each carries 32 bits of place value. An addend touches two chunks with
 * no branch on its value; the spare high bits of each chunk absorb 2047 additions before carries
 * must be propagated, so carry propagation is deferred and counted rather than done per add.
 *
 * <p>Special values follow IEEE 754 as if the sum had been computed exactly: a NaN anywhere, or
 * both infinities, gives NaN; one kind of infinity gives that infinity. A finite exact sum whose
 * correctly rounded value exceeds {@link Double#MAX_VALUE} (that is, whose magnitude is at least
 * {@code MAX_VALUE + ulp(MAX_VALUE)/2}) reads as the infinity of its sign, yet stays exact inside:
 * adding values that bring it back into range gives the finite answer. An exact zero reads as
 * {@code +0.0}; the sign of zero is not kept.
 *
 * <p>Mutable and not thread-safe; one accumulator per thread, merged with {@link #add(ExactSum)}.
 * {@link #equals} and {@link #hashCode} compare exact values (so a hash key must not be added to
 * afterwards); like the other readers they may propagate pending carries, which never changes the
 * value. Partial sums travel between Spark executors and the driver as the object itself:
 * Kryo's field serialiser (registered in {@code SkerryKryoRegistrator}) writes all 67 chunks,
 * the add count and the special-value flags. {@link #toCompactArray()} is a smaller, canonical
 * form (only the chunks in use) that no backend uses at present; it is kept, and tested, for a
 * transport where the size matters.
 */
public final class ExactSum {

    /** Place-value bits per chunk. */
    private static final int CHUNK_BITS = 32;
    private static final long CHUNK_MASK = 0xFFFFFFFFL;
    /**
     * Bit 0 of chunk 0 is worth 2^-1074. A finite double's 53-bit significand starts at bit
     * 0..2045 and so ends by bit 2097, inside chunk 65; chunk 66 (and its signed high bits) holds
     * what carries beyond, so sums exceeding the double range stay exact.
     */
    private static final int CHUNK_COUNT = 67;
    private static final int TOP_CHUNK = CHUNK_COUNT - 1;
    /**
     * After propagation a chunk lies in [0, 2^32); each add puts less than 2^52 into it. With
     * 2047 adds a chunk stays below 2^32 + 2047 * 2^52 = 2^63 - 2^52 + 2^32, leaving room for
     * the carry (below 2^31) that propagation brings in.
     */
    private static final int ADDS_BETWEEN_CARRIES = 2047;

    private static final long SIGN_BIT = 0x8000000000000000L;
    private static final long FRACTION_MASK = 0x000FFFFFFFFFFFFFL;
    private static final int SPECIAL_EXPONENT = 0x7FF;

    /** Seen flags: a NaN sets both, so "both set" reads as NaN whichever way it arose. */
    private static final int POSITIVE_INFINITY_SEEN = 1;
    private static final int NEGATIVE_INFINITY_SEEN = 2;
    private static final int NAN_STATE = 3;

    /** Compact form: header tag so that a stray long[] is refused. */
    private static final long COMPACT_TAG = 0x5EA1L;
    private static final int COMPACT_NEGATIVE = 1 << 2;
    private static final int COMPACT_TOP_PRESENT = 1 << 3;
    /** The top chunk of a real sum is below (number of adds) * 2^-14; anything larger is corrupt. */
    private static final long MAX_COMPACT_TOP = 1L << 48;

    private final long[] chunks = new long[CHUNK_COUNT];
    private int addsUntilCarry = ADDS_BETWEEN_CARRIES;
    private int special;

    /** An accumulator holding zero. */
    public ExactSum() {
    }

    /** The correctly rounded sum of {@code values[from..to)}. */
    public static double sum(double[] values, int from, int to) {
        ExactSum sum = new ExactSum();
        sum.add(values, from, to);
        return sum.doubleValue();
    }

    /** Adds {@code x} exactly. */
    public void add(double x) {
        long bits = Double.doubleToRawLongBits(x);
        int exponent = (int) (bits >>> 52) & SPECIAL_EXPONENT;
        if (exponent == SPECIAL_EXPONENT) {
            addSpecial(bits);
            return;
        }
        // Subnormals have no implicit bit and the same scale as exponent 1.
        int normal = (exponent + SPECIAL_EXPONENT) >>> 11;
        long significand = (bits & FRACTION_MASK) | ((long) normal << 52);
        int shift = exponent - normal;
        long sign = bits >> 63;
        int index = shift >>> 5;
        int offset = shift & 31;
        long low = (significand << offset) & CHUNK_MASK;
        long high = significand >>> (CHUNK_BITS - offset);
        long[] c = chunks;
        c[index] += (low ^ sign) - sign;
        c[index + 1] += (high ^ sign) - sign;
        if (--addsUntilCarry == 0) {
            propagateCarries();
        }
    }

    /**
     * Adds {@code values[from..to)} exactly.
     *
     * @throws IllegalArgumentException if the range is not within the array
     */
    public void add(double[] values, int from, int to) {
        if (from < 0 || to < from || to > values.length) {
            throw new IllegalArgumentException("range [from, to) must lie within values.length "
                    + values.length + ", was [" + from + ", " + to + ")");
        }
        long[] c = chunks;
        int left = addsUntilCarry;
        for (int i = from; i < to; i++) {
            long bits = Double.doubleToRawLongBits(values[i]);
            int exponent = (int) (bits >>> 52) & SPECIAL_EXPONENT;
            if (exponent == SPECIAL_EXPONENT) {
                addSpecial(bits);
                continue;
            }
            int normal = (exponent + SPECIAL_EXPONENT) >>> 11;
            long significand = (bits & FRACTION_MASK) | ((long) normal << 52);
            int shift = exponent - normal;
            long sign = bits >> 63;
            int index = shift >>> 5;
            int offset = shift & 31;
            long low = (significand << offset) & CHUNK_MASK;
            long high = significand >>> (CHUNK_BITS - offset);
            c[index] += (low ^ sign) - sign;
            c[index + 1] += (high ^ sign) - sign;
            if (--left == 0) {
                propagateCarries();
                left = ADDS_BETWEEN_CARRIES;
            }
        }
        addsUntilCarry = left;
    }

    /** Adds the exact sum held by {@code other} (which is not changed; it may be this one). */
    public void add(ExactSum other) {
        special |= other.special;
        propagateCarries();
        // Ours are now below 2^32 and theirs below 2^63 - 2^52 + 2^32: the sum cannot overflow.
        long[] theirs = other.chunks;
        for (int i = 0; i < CHUNK_COUNT; i++) {
            chunks[i] += theirs[i];
        }
        propagateCarries();
    }

    /** Sets this accumulator back to zero. */
    public void reset() {
        Arrays.fill(chunks, 0L);
        addsUntilCarry = ADDS_BETWEEN_CARRIES;
        special = 0;
    }

    /** An independent accumulator holding the same exact sum. */
    public ExactSum copy() {
        ExactSum copy = new ExactSum();
        System.arraycopy(chunks, 0, copy.chunks, 0, CHUNK_COUNT);
        copy.addsUntilCarry = addsUntilCarry;
        copy.special = special;
        return copy;
    }

    /** The exact sum, correctly rounded to the nearest double (ties to even). */
    public double doubleValue() {
        if (special != 0) {
            return specialValue();
        }
        propagateCarries();
        if (chunks[TOP_CHUNK] < 0) {
            return roundMagnitude(negatedChunks(), true);
        }
        return roundMagnitude(chunks, false);
    }

    /**
     * This sum in a compact form (not used by the backends, which send the object itself; see the
     * class description): only the range of chunks in use,
     * two per {@code long}, after a header with the flags. Zero takes one {@code long}; a sum
     * whose terms span a few binades takes two to four.
     */
    public long[] toCompactArray() {
        if (special != 0) {
            return new long[] {header(special, 0, 0)};
        }
        propagateCarries();
        boolean negative = chunks[TOP_CHUNK] < 0;
        long[] magnitude = negative ? negatedChunks() : chunks;
        int lowest = 0;
        while (lowest < TOP_CHUNK && magnitude[lowest] == 0) {
            lowest++;
        }
        int highest = TOP_CHUNK - 1;
        while (highest >= lowest && magnitude[highest] == 0) {
            highest--;
        }
        int count = highest - lowest + 1;
        if (count <= 0) {
            lowest = 0;
            count = 0;
        }
        boolean topPresent = magnitude[TOP_CHUNK] != 0;
        int flags = (negative ? COMPACT_NEGATIVE : 0) | (topPresent ? COMPACT_TOP_PRESENT : 0);
        long[] compact = new long[1 + (count + 1) / 2 + (topPresent ? 1 : 0)];
        compact[0] = header(flags, lowest, count);
        for (int k = 0; k < count; k++) {
            compact[1 + k / 2] |= magnitude[lowest + k] << ((k & 1) * CHUNK_BITS);
        }
        if (topPresent) {
            compact[compact.length - 1] = magnitude[TOP_CHUNK];
        }
        return compact;
    }

    /**
     * Rebuilds an accumulator from {@link #toCompactArray()}; it reads, merges and compares
     * exactly as the original.
     *
     * @throws IllegalArgumentException if {@code compact} is not such an array
     */
    public static ExactSum fromCompactArray(long[] compact) {
        if (compact == null || compact.length == 0) {
            throw new IllegalArgumentException("compact must be a non-empty array from toCompactArray()");
        }
        long header = compact[0];
        int flags = (int) (header & 0xFF);
        int lowest = (int) ((header >>> 8) & 0xFF);
        int count = (int) ((header >>> 16) & 0xFF);
        boolean topPresent = (flags & COMPACT_TOP_PRESENT) != 0;
        int expectedLength = 1 + (count + 1) / 2 + (topPresent ? 1 : 0);
        if ((header >>> 48) != COMPACT_TAG || ((header >>> 24) & 0xFFFFFF) != 0 || (flags & ~0xF) != 0
                || lowest + count > TOP_CHUNK || compact.length != expectedLength) {
            throw new IllegalArgumentException("compact is not an array from toCompactArray(): header 0x"
                    + Long.toHexString(header) + ", length " + compact.length);
        }
        ExactSum sum = new ExactSum();
        sum.special = flags & NAN_STATE;
        if (sum.special != 0) {
            if (count != 0 || (flags & ~NAN_STATE) != 0) {
                throw new IllegalArgumentException("compact holds chunks beside a special value: header 0x"
                        + Long.toHexString(header));
            }
            return sum;
        }
        for (int k = 0; k < count; k++) {
            sum.chunks[lowest + k] = (compact[1 + k / 2] >>> ((k & 1) * CHUNK_BITS)) & CHUNK_MASK;
        }
        if (topPresent) {
            long top = compact[compact.length - 1];
            if (top <= 0 || top > MAX_COMPACT_TOP) {
                throw new IllegalArgumentException("compact top chunk out of range: " + top);
            }
            sum.chunks[TOP_CHUNK] = top;
        }
        if ((flags & COMPACT_NEGATIVE) != 0) {
            for (int i = 0; i < CHUNK_COUNT; i++) {
                sum.chunks[i] = -sum.chunks[i];
            }
            sum.propagateCarries();
        }
        return sum;
    }

    /** True when {@code object} is an {@code ExactSum} holding the same exact value and flags. */
    @Override
    public boolean equals(Object object) {
        if (this == object) {
            return true;
        }
        if (!(object instanceof ExactSum)) {
            return false;
        }
        ExactSum other = (ExactSum) object;
        if (special != 0 || other.special != 0) {
            return special == other.special;
        }
        // Propagated chunks are the unique two's-complement digits of the value.
        propagateCarries();
        other.propagateCarries();
        return Arrays.equals(chunks, other.chunks);
    }

    @Override
    public int hashCode() {
        if (special != 0) {
            return special;
        }
        propagateCarries();
        return Arrays.hashCode(chunks);
    }

    @Override
    public String toString() {
        return "ExactSum[" + doubleValue() + "]";
    }

    private void addSpecial(long bits) {
        if ((bits & FRACTION_MASK) != 0) {
            special = NAN_STATE;
        } else {
            special |= bits < 0 ? NEGATIVE_INFINITY_SEEN : POSITIVE_INFINITY_SEEN;
        }
    }

    private double specialValue() {
        if (special == POSITIVE_INFINITY_SEEN) {
            return Double.POSITIVE_INFINITY;
        }
        if (special == NEGATIVE_INFINITY_SEEN) {
            return Double.NEGATIVE_INFINITY;
        }
        return Double.NaN;
    }

    /** Leaves chunks 0..65 in [0, 2^32) and the signed remainder in the top chunk. */
    private void propagateCarries() {
        long[] c = chunks;
        long carry = 0;
        for (int i = 0; i < TOP_CHUNK; i++) {
            long value = c[i] + carry;
            carry = value >> CHUNK_BITS;
            c[i] = value & CHUNK_MASK;
        }
        c[TOP_CHUNK] += carry;
        addsUntilCarry = ADDS_BETWEEN_CARRIES;
    }

    /** The propagated chunks of minus this (propagated, negative) sum. */
    private long[] negatedChunks() {
        long[] negated = new long[CHUNK_COUNT];
        long carry = 0;
        for (int i = 0; i < TOP_CHUNK; i++) {
            long value = carry - chunks[i];
            carry = value >> CHUNK_BITS;
            negated[i] = value & CHUNK_MASK;
        }
        negated[TOP_CHUNK] = carry - chunks[TOP_CHUNK];
        return negated;
    }

    /** Rounds the non-negative propagated fixed-point number {@code m} to the nearest double. */
    private static double roundMagnitude(long[] m, boolean negative) {
        double infinity = negative ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
        if (m[TOP_CHUNK] != 0) {
            return infinity;
        }
        int top = TOP_CHUNK - 1;
        while (top >= 0 && m[top] == 0) {
            top--;
        }
        if (top < 0) {
            return 0.0;
        }
        int highestBit = top * CHUNK_BITS + 63 - Long.numberOfLeadingZeros(m[top]);
        long bits;
        if (highestBit < 53) {
            // Below 2^53 units of 2^-1074 every integer is a double, and its bit pattern is itself.
            bits = m[0] | (m[1] << CHUNK_BITS);
        } else {
            int roundBit = highestBit - 53;
            long window = bitsFrom(m, roundBit) & ((1L << 54) - 1);
            long significand = window >>> 1;
            if ((window & 1) != 0 && ((significand & 1) != 0 || anyBitBelow(m, roundBit))) {
                significand++;
            }
            // The significand's lowest bit is worth 2^(highestBit - 52 - 1074) = 2^(e - 1075).
            int biasedExponent = highestBit - 51;
            if (significand == 1L << 53) {
                significand >>>= 1;
                biasedExponent++;
            }
            if (biasedExponent >= SPECIAL_EXPONENT) {
                return infinity;
            }
            bits = ((long) biasedExponent << 52) | (significand & FRACTION_MASK);
        }
        return Double.longBitsToDouble(negative ? bits | SIGN_BIT : bits);
    }

    /** Bits {@code position ..} of the fixed-point number (at least 54 of them are right). */
    private static long bitsFrom(long[] m, int position) {
        int index = position >>> 5;
        int offset = position & 31;
        long window = m[index] >>> offset;
        if (index + 1 < CHUNK_COUNT) {
            window |= m[index + 1] << (CHUNK_BITS - offset);
        }
        if (index + 2 < CHUNK_COUNT) {
            // Two steps, as a single shift by 64 would be a shift by 0.
            window |= (m[index + 2] << CHUNK_BITS) << (CHUNK_BITS - offset);
        }
        return window;
    }

    private static boolean anyBitBelow(long[] m, int position) {
        int index = position >>> 5;
        if ((m[index] & ((1L << (position & 31)) - 1)) != 0) {
            return true;
        }
        for (int i = 0; i < index; i++) {
            if (m[i] != 0) {
                return true;
            }
        }
        return false;
    }

    private static long header(int flags, int lowest, int count) {
        return (COMPACT_TAG << 48) | ((long) count << 16) | ((long) lowest << 8) | flags;
    }
}
