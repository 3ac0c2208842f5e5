package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.particle.ParticleBlock;

/** Expansion copies ancestors in order; checked particle by particle against the definition. */
class ParticleExpansionTest {

    @Test
    @DisplayName("copies in ancestor then copy order, consecutive new indices, Eve kept, log-weight 0")
    void expandsInCanonicalOrder() {
        int d = 3;
        ParticleBlock source = new ParticleBlock(d, 5);
        source.resize(4);
        for (int i = 0; i < 4; i++) {
            for (int k = 0; k < d; k++) {
                source.values()[i * d + k] = 10 * i + k;
            }
            source.logPrior()[i] = -i;
            source.logLikelihood()[i] = -2.0 * i;
            source.logWeight()[i] = 0.5 + i;
            source.index()[i] = 100 + i;
            source.eve()[i] = 7 * i;
        }
        int[] offspring = {2, 0, 3, 1, 99}; // the entry past size is ignored
        ParticleBlock out = ParticleExpansion.expand(source, offspring, 40);
        int[] ancestor = {0, 0, 2, 2, 2, 3};
        assertEquals(ancestor.length, out.size());
        for (int s = 0; s < ancestor.length; s++) {
            int a = ancestor[s];
            for (int k = 0; k < d; k++) {
                assertEquals(10.0 * a + k, out.values()[s * d + k]);
            }
            assertEquals(-a, out.logPrior()[s]);
            assertEquals(-2.0 * a, out.logLikelihood()[s]);
            assertEquals(0.0, out.logWeight()[s]);
            assertEquals(40 + s, out.index()[s]);
            assertEquals(7L * a, out.eve()[s]);
        }
        assertEquals(3, ParticleExpansion.distinctAncestors(offspring, 4));
        assertEquals(0.5, source.logWeight()[0], "source untouched");
        assertThrows(IllegalArgumentException.class,
                () -> ParticleExpansion.expand(source, new int[] {1, -1, 0, 0}, 0));
        assertThrows(IllegalArgumentException.class, () -> ParticleExpansion.expand(source, new int[] {1}, 0));
    }
}
