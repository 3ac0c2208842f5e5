package org.skerry.engine.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.builtin.GaussianShellsModel;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;

/**
 * Finding the per-observation capability on a model (also through a source with retries), the
 * refusal that names a model without it, the range checks, and the default per-observation
 * terms, which must be the single ranges in increasing order.
 */
class ObservationLikelihoodTest {

    /** Observation j contributes {@code −(θ − j)²}; records the ranges asked. */
    private static final class Recording implements ObservationLikelihood {

        final List<String> asked = new ArrayList<>();

        @Override
        public ParameterSpace parameters() {
            return ParameterSpace.real("theta", 1);
        }

        @Override
        public Prior prior() {
            return IndependentPrior.of(Normal.of(0.0, 1.0));
        }

        @Override
        public int observationCount() {
            return 5;
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            return logLikelihood(parameters, 0, 5, context);
        }

        @Override
        public double logLikelihood(double[] parameters, int from, int to, LikelihoodContext context) {
            ObservationLikelihood.checkRange(from, to, 5);
            asked.add("[" + from + "," + to + ")");
            double sum = 0.0;
            for (int j = from; j < to; j++) {
                sum -= (parameters[0] - j) * (parameters[0] - j);
            }
            return sum;
        }
    }

    /** A model with Object's toString: the message must still name it, by class. */
    private static final class Plain implements Model {

        @Override
        public ParameterSpace parameters() {
            return ParameterSpace.real("theta", 1);
        }

        @Override
        public Prior prior() {
            return IndependentPrior.of(Normal.of(0.0, 1.0));
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            return 0.0;
        }
    }

    @Test
    @DisplayName("the capability is found on a model, also on the model a source builds")
    void foundThroughSources() {
        NormalMeanModel model = NormalMeanModel.of(new double[][] {{1.0}, {2.0}}, 1.0, 0.0, 1.0);
        assertSame(model, ObservationLikelihood.of(model));
        Model built = ModelSource.local(model).create();
        assertSame(model, ObservationLikelihood.of(built));
    }

    @Test
    @DisplayName("a model without the capability is refused with a message naming it")
    void absentCapabilityIsRefused() {
        GaussianShellsModel shells = GaussianShellsModel.of(2, 2.0, 0.1, 3.5, 6.0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> ObservationLikelihood.of(shells));
        assertTrue(e.getMessage().contains("'" + shells + "'"), e.getMessage());
        assertTrue(e.getMessage().contains(GaussianShellsModel.class.getName()), e.getMessage());
        assertTrue(e.getMessage().contains(ObservationLikelihood.class.getName()), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> ObservationLikelihood.of(new Plain()));
        assertTrue(e.getMessage().startsWith("model " + Plain.class.getName() + " gives no log-likelihood"),
                e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> ObservationLikelihood.of(null));
        assertEquals("model must not be null", e.getMessage());
    }

    @Test
    @DisplayName("default terms are the single ranges, asked in increasing order, written from index 0")
    void defaultTerms() {
        Recording model = new Recording();
        double[] terms = new double[4];
        terms[3] = 99.0;
        model.logLikelihoodTerms(new double[] {1.5}, 1, 4, terms, null);
        assertEquals(List.of("[1,2)", "[2,3)", "[3,4)"), model.asked);
        assertEquals(-0.25, terms[0]);
        assertEquals(-0.25, terms[1]);
        assertEquals(-2.25, terms[2]);
        assertEquals(99.0, terms[3], "nothing written past the range");
    }

    @Test
    @DisplayName("ranges outside [0, n), reversed ranges and short term arrays are refused, naming the range")
    void rangeChecks() {
        Recording model = new Recording();
        double[] theta = {0.0};
        for (int[] range : new int[][] {{-1, 2}, {3, 2}, {0, 6}}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> model.logLikelihood(theta, range[0], range[1], null));
            assertEquals("observation range [" + range[0] + ", " + range[1] + ") must lie within [0, 5) with from <= to",
                    e.getMessage());
        }
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> model.logLikelihoodTerms(theta, 0, 3, new double[2], null));
        assertEquals("terms must hold 3 values for observations [0, 3), was of length 2", e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> model.logLikelihoodTerms(theta, 0, 3, null, null));
        assertEquals("terms must hold 3 values for observations [0, 3), was null", e.getMessage());
        ObservationLikelihood.checkRange(5, 5, 5);
    }
}
