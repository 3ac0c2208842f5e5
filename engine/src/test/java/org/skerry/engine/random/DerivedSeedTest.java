package org.skerry.engine.random;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

class DerivedSeedTest {

    @Test
    @DisplayName("FNV-1a 64 matches the published test vectors (FNV reference test suite; values from memory)")
    void fnvVectors() {
        assertEquals(0xCBF29CE484222325L, DerivedSeed.fnv1a(""));
        assertEquals(0xAF63DC4C8601EC8CL, DerivedSeed.fnv1a("a"));
        assertEquals(0x85944171F73967E8L, DerivedSeed.fnv1a("foobar"));
    }

    @Test
    @DisplayName("mix is SplitMix64's output: its first two outputs from state 0 (reference C code by Vigna; values from memory)")
    void splitMixOutputs() {
        long gamma = 0x9E3779B97F4A7C15L;
        assertEquals(0xE220A8397B1DCDAFL, DerivedSeed.mix(gamma));
        assertEquals(0x6E789E6AA1B965F4L, DerivedSeed.mix(2 * gamma));
    }

    @Test
    @DisplayName("the derivation as documented: mix(seed + gamma * mix(FNV-1a of the names with zero bytes))")
    void documentedFormula() {
        long h = DerivedSeed.fnv1a("buoy-07\0sigmoidal\0");
        assertEquals(DerivedSeed.mix(2026L + 0x9E3779B97F4A7C15L * DerivedSeed.mix(h)),
                DerivedSeed.of(2026L, "buoy-07", "sigmoidal"));
    }

    @Test
    void namesAndSeedsSeparate() {
        assertNotEquals(DerivedSeed.of(1, "ab", "c"), DerivedSeed.of(1, "a", "bc"));
        assertNotEquals(DerivedSeed.of(1, "a", "b"), DerivedSeed.of(2, "a", "b"));
        assertNotEquals(DerivedSeed.of(1, "a", "b"), DerivedSeed.of(1, "b", "a"));
        assertEquals(DerivedSeed.of(5, "x", "y"), DerivedSeed.of(5, "x", "y"));
        assertThrows(IllegalArgumentException.class, () -> DerivedSeed.of(1));
    }
}
