package org.skerry.engine.model.settings;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** {@link ModelSettings}: lookups by dotted key, nested views, and error messages. */
class ModelSettingsTest {

    private static ModelSettings sample() {
        return ModelSettings.builder()
                .origin("run.conf")
                .set("sigma", 0.5)
                .set("count", 12)
                .set("quoted", "2.5e-3")
                .set("name", "shells")
                .set("flag", true)
                .set("list", List.of(1, 2.5, "3"))
                .set("names", List.of("x1", "x2"))
                .set("prior.mu.distribution", "normal")
                .set("prior.mu.mean", 0)
                .set("prior.mu.sd", 10)
                .column("y", new double[] {1, 2, 3})
                .column("x", new double[] {4, 5, 6})
                .build();
    }

    @Test
    @DisplayName("typed getters read numbers, quoted numbers, text, booleans and lists")
    void getters() {
        ModelSettings s = sample();
        assertEquals(0.5, s.getDouble("sigma"));
        assertEquals(12, s.getInt("count"));
        assertEquals(12.0, s.getDouble("count"));
        assertEquals(2.5e-3, s.getDouble("quoted"));
        assertEquals("shells", s.getString("name"));
        assertEquals("0.5", s.getString("sigma"));
        assertTrue(s.getBoolean("flag", false));
        assertArrayEquals(new double[] {1, 2.5, 3}, s.getDoubles("list"));
        assertEquals(List.of("x1", "x2"), s.getStrings("names"));
        assertEquals(10.0, s.getDouble("prior.mu.sd"));
        assertEquals(7.0, s.getDouble("missing", 7.0));
        assertEquals(3, s.getInt("missing", 3));
        assertEquals("d", s.getString("missing", "d"));
        assertTrue(s.has("prior.mu"));
        assertFalse(s.has("prior.nu"));
        assertFalse(s.has("sigma.deeper"));
    }

    @Test
    @DisplayName("keys are sorted; nested views read relative keys and report full paths")
    void nestedViews() {
        ModelSettings s = sample();
        assertEquals(List.of("count", "flag", "list", "name", "names", "prior", "quoted", "sigma"),
                List.copyOf(s.keys()), "sorted, as from a run file");
        ModelSettings mu = s.at("prior").at("mu");
        assertEquals(List.of("distribution", "mean", "sd"), List.copyOf(mu.keys()));
        assertEquals("normal", mu.getString("distribution"));
        assertEquals("run.conf, prior.mu.sd", mu.where("sd"));
        assertEquals("run.conf, sigma", s.where("sigma"));
        assertArrayEquals(new double[] {1, 2, 3}, mu.column("y"), "views share the data columns");
    }

    @Test
    @DisplayName("a missing or mistyped setting fails with where() and the value")
    void errors() {
        ModelSettings s = sample();
        assertMessage(() -> s.getDouble("nope"), "run.conf, nope", "missing");
        assertMessage(() -> s.getDouble("name"), "run.conf: name", "\"shells\"");
        assertMessage(() -> s.getInt("sigma"), "run.conf: sigma", "0.5");
        assertMessage(() -> s.getBoolean("name", true), "run.conf: name", "\"shells\"");
        assertMessage(() -> s.getDoubles("sigma"), "run.conf: sigma", "0.5");
        assertMessage(() -> s.getDoubles("names"), "run.conf: names", "\"x1\"");
        assertMessage(() -> s.getString("prior"), "run.conf: prior", "text value");
        assertMessage(() -> s.at("sigma"), "run.conf: sigma", "0.5");
        assertMessage(() -> s.at("prior").at("mu").getDouble("rate"), "run.conf, prior.mu.rate", "missing");
        assertMessage(() -> s.getDouble("a..b"), "key", "'a..b'");
    }

    @Test
    @DisplayName("a role with no column fails naming the role and the bound roles")
    void columns() {
        ModelSettings s = sample();
        assertTrue(s.hasColumn("y"));
        assertEquals(List.of("y", "x"), List.copyOf(s.columnRoles()));
        assertMessage(() -> s.column("z"), "'z'", "[y, x]");
    }

    @Test
    @DisplayName("the settings copy their inputs and hand out copies")
    void immutable() {
        double[] data = {1, 2};
        Map<String, Object> inner = new LinkedHashMap<>();
        inner.put("a", 1.0);
        Map<String, Object> tree = new LinkedHashMap<>();
        tree.put("group", inner);
        ModelSettings s = ModelSettings.builder().setAll(tree).column("y", data).build();
        data[0] = 99;
        inner.put("a", 2.0);
        s.column("y")[1] = 99;
        assertArrayEquals(new double[] {1, 2}, s.column("y"));
        assertEquals(1.0, s.getDouble("group.a"));
        assertThrows(UnsupportedOperationException.class, () -> s.keys().clear());
    }

    @Test
    @DisplayName("unsupported values and non-finite numbers are refused when set")
    void badValues() {
        assertMessage(() -> ModelSettings.builder().set("x", new Object()), "x", "unsupported");
        assertMessage(() -> ModelSettings.builder().set("x", Double.NaN), "x", "NaN");
        assertMessage(() -> ModelSettings.of(Map.of("a", Map.of("b.c", 1))), "a", "'b.c'");
    }

    static void assertMessage(Runnable action, String first, String second) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, action::run);
        assertTrue(e.getMessage().contains(first) && e.getMessage().contains(second), e.getMessage());
    }
}
