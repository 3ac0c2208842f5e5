package org.skerry.engine.random;

import java.nio.charset.StandardCharsets;

/**
 * Derives the seed of one member of a family of runs (one analysis of a batch, say) from the
 * family's seed and the member's names, so that the member can be re-run alone with the same
 * answer. The function is fixed and documented, never to change:
 *
 * <pre>
 *   h    = FNV-1a 64-bit hash of UTF-8(name₁) · 0x00 · UTF-8(name₂) · 0x00 · …
 *   seed = mix(seed₀ + 0x9E3779B97F4A7C15 · mix(h))
 * </pre>
 *
 * where {@code mix} is the output function of SplitMix64 (Steele, Lea &amp; Flood 2014, "Fast
 * splittable pseudorandom number generators", OOPSLA; constants of Stafford's "Mix13") and the
 * arithmetic is modulo 2⁶⁴. FNV-1a is Fowler, Noll &amp; Vo's hash (offset basis
 * 0xCBF29CE484222325, prime 0x100000001B3). The zero byte after each name keeps ("ab", "c") and
 * ("a", "bc") apart. A derived seed is any {@code long}, negative ones included.
 */
public final class DerivedSeed {

    private static final long FNV_OFFSET = 0xCBF29CE484222325L;
    private static final long FNV_PRIME = 0x100000001B3L;
    private static final long GOLDEN_GAMMA = 0x9E3779B97F4A7C15L;

    private DerivedSeed() {
    }

    /** The seed of the member named {@code names} of the family seeded with {@code seed}. */
    public static long of(long seed, String... names) {
        if (names == null || names.length == 0) {
            throw new IllegalArgumentException("names must not be empty");
        }
        long h = FNV_OFFSET;
        for (String name : names) {
            if (name == null) {
                throw new IllegalArgumentException("names must not hold null");
            }
            for (byte b : name.getBytes(StandardCharsets.UTF_8)) {
                h = fnvStep(h, b);
            }
            h = fnvStep(h, (byte) 0);
        }
        return mix(seed + GOLDEN_GAMMA * mix(h));
    }

    /** FNV-1a 64 of the UTF-8 bytes of {@code text}, with no trailing zero byte. */
    static long fnv1a(String text) {
        long h = FNV_OFFSET;
        for (byte b : text.getBytes(StandardCharsets.UTF_8)) {
            h = fnvStep(h, b);
        }
        return h;
    }

    private static long fnvStep(long h, byte b) {
        return (h ^ (b & 0xFF)) * FNV_PRIME;
    }

    /** SplitMix64's output function. */
    static long mix(long z) {
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}
