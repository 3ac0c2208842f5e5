package org.skerry.engine.settings;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigParseOptions;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * {@link SettingsReader}: the one set of rules for numbers, whole numbers, booleans and text, and
 * errors that name the file, line, full key and value. The numbers' expected values are the
 * decimal literals themselves (IEEE 754 nearest double, as {@link Double#parseDouble} defines).
 */
class SettingsReaderTest {

    private static SettingsReader read(String hocon) {
        return SettingsReader.of(ConfigFactory.parseString(hocon,
                ConfigParseOptions.defaults().setOriginDescription("test")));
    }

    @Test
    @DisplayName("numbers: HOCON numbers and decimal text are read alike")
    void numbers() {
        SettingsReader r = read("a = 2.5e-3, b = \"2.5e-3\", c = \" 7 \", d = 12, e = -.5, f = \"+1E2\"");
        assertEquals(2.5e-3, r.number("a"));
        assertEquals(2.5e-3, r.number("b"));
        assertEquals(7.0, r.number("c"));
        assertEquals(12.0, r.number("d"));
        assertEquals(-0.5, r.number("e"));
        assertEquals(100.0, r.number("f"));
    }

    @ParameterizedTest
    @ValueSource(strings = {"\"NaN\"", "\"Infinity\"", "\"-Infinity\"", "\"inf\"", "1e400", "\"1e400\"", "\"0x10\"",
        "\"1f\"", "\"2d\"", "\"\"", "\"one\"", "true", "[1]", "{ x = 1 }"})
    @DisplayName("non-finite numbers, hexadecimal, type suffixes and non-numbers are refused as numbers")
    void refusedNumbers(String written) {
        SettingsReader r = read("x = " + written);
        SettingsException e = assertThrows(SettingsException.class, () -> r.number("x"));
        assertTrue(e.getMessage().startsWith("test: x = "), e.getMessage());
        assertTrue(e.getMessage().endsWith("expected a finite number"), e.getMessage());
        assertThrows(SettingsException.class, () -> r.wholeNumber("x", Long.MIN_VALUE, Long.MAX_VALUE));
        assertThrows(SettingsException.class, () -> read("x = [1, " + written + "]").numbers("x"));
    }

    @Test
    @DisplayName("whole numbers: integral exact values only, in range, never truncated or rounded")
    void wholeNumbers() {
        SettingsReader r = read("a = 1e3, b = \"12\", c = 200.7, d = 9223372036854775807, e = 9223372036854775808, "
                + "f = 4.0");
        assertEquals(1000, r.integer("a", 0, 10_000));
        assertEquals(12, r.integer("b", 0, 100));
        assertEquals(4, r.integer("f", 0, 100));
        assertMessage(() -> r.integer("c", 0, 1000), "test: c = 200.7: expected a whole number");
        assertMessage(() -> r.integer("a", 0, 999), "test: a = 1000: must be between 0 and 999");
        assertEquals(Long.MAX_VALUE, r.seed("d"));
        assertThrows(SettingsException.class, () -> r.seed("e"));
    }

    @Test
    @DisplayName("booleans follow HOCON: true/false and yes/no/on/off, also as text")
    void booleans() {
        SettingsReader r = read("a = true, b = \"off\", c = yes, d = 1");
        assertTrue(r.bool("a"));
        assertFalse(r.bool("b"));
        assertTrue(r.bool("c"));
        assertMessage(() -> r.bool("d"), "test: d = 1: expected true or false");
    }

    @Test
    @DisplayName("text, null and missing values; nested readers name full keys")
    void textAndViews() {
        SettingsReader r = read("a = null, b = 0.5, g { h { k = \"NaN\" } }");
        assertNull(r.text("a"));
        assertNull(r.text("nothing"));
        assertEquals("0.5", r.text("b"));
        assertFalse(r.has("a"));
        SettingsReader h = r.at("g").at("h");
        assertEquals("g.h", h.path());
        assertMessage(() -> h.number("k"), "test: g.h.k = \"NaN\": expected a finite number");
        assertMessage(() -> h.number("m"), "test, g.h.m: missing setting");
        assertArrayEquals(new double[] {1, 2.5}, read("x = [1, \"2.5\"]").numbers("x"));
    }

    @Test
    @DisplayName("errors in a file name the file (relative to the working folder when below it) and the line")
    void locatedInFile(@TempDir Path folder) throws Exception {
        Path file = folder.resolve("settings.conf");
        Files.writeString(file, "# synthetic\nsampler {\n  threshold = \"NaN\"\n}\n");
        Config config = ConfigFactory.parseFile(file.toFile());
        SettingsException e = assertThrows(SettingsException.class,
                () -> SettingsReader.of(config).number("sampler.threshold", 0, false, 1, true));
        assertEquals(Origins.shorten(file) + ": line 3: sampler.threshold = \"NaN\": expected a finite number",
                e.getMessage());
    }

    private static void assertMessage(Runnable action, String expected) {
        SettingsException e = assertThrows(SettingsException.class, action::run);
        assertEquals(expected, e.getMessage());
    }
}
