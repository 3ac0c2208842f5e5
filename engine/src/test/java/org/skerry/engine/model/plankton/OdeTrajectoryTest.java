package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.exception.MaxCountExceededException;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The integration core against closed-form solutions. Each bound is a hundred times the local
 * tolerance, {@code 100·(atol + rtol·|y|)}: the global error of a method run with local error
 * control stays within a modest multiple of the tolerance on problems that do not amplify errors
 * (Hairer, Nørsett &amp; Wanner, Solving ODEs I, §II.4 and §II.10; the factor 100 is common
 * practice, not a theorem). With 1e-8 relative that is 1e-6 relative.
 */
class OdeTrajectoryTest {

    private static final double BOUND = 1e-6;
    /** Scalar tolerances equal to those {@link PlanktonDynamics#SOLVER} gives the nutrient. */
    private static final OdeTrajectory SCALAR = OdeTrajectory.of(1e-10, 1e-8, 100_000);

    private static final class Logistic implements FirstOrderDifferentialEquations {
        final double rate;
        final double capacity;

        Logistic(double rate, double capacity) {
            this.rate = rate;
            this.capacity = capacity;
        }

        @Override
        public int getDimension() {
            return 1;
        }

        @Override
        public void computeDerivatives(double t, double[] y, double[] yDot) {
            yDot[0] = rate * y[0] * (1.0 - y[0] / capacity);
        }

        /** Verhulst (1838), Correspondance mathématique et physique 10: N(t) = K·N0·e^{rt}/(K + N0·(e^{rt} − 1)). */
        double exact(double n0, double t) {
            double growth = StrictMath.exp(rate * t);
            return capacity * n0 * growth / (capacity + n0 * (growth - 1.0));
        }
    }

    @Test
    @DisplayName("logistic growth at weekly days matches Verhulst's closed form to 1e-6 relative")
    void logisticGrowth() {
        double[] days = QuellmarScenario.seasonDays(QuellmarScenario.FULL_SEASON);
        for (double rate : new double[] {0.3, 1.2}) {
            Logistic ode = new Logistic(rate, 10.0);
            double[][] states = SCALAR.solve(ode, 0.0, new double[] {0.01}, days);
            for (int j = 0; j < days.length; j++) {
                double exact = ode.exact(0.01, days[j]);
                assertEquals(exact, states[j][0], BOUND * exact, "rate " + rate + ", day " + days[j]);
            }
        }
    }

    @Test
    @DisplayName("the plankton solver itself: logistic growth in N and in ln N matches Verhulst's closed form")
    void planktonSolverOnLogisticGrowth() {
        // Three uncoupled logistic equations in the plankton state's layout: component 0 as N,
        // components 1 and 2 as u = ln N, du/dt = r (1 - e^u / K). Same closed form for each.
        Logistic nutrientLike = new Logistic(0.3, 10.0);
        Logistic fast = new Logistic(1.2, 6.0);
        Logistic slow = new Logistic(0.15, 2.0);
        FirstOrderDifferentialEquations ode = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return 3;
            }

            @Override
            public void computeDerivatives(double t, double[] y, double[] yDot) {
                yDot[0] = nutrientLike.rate * y[0] * (1.0 - y[0] / nutrientLike.capacity);
                yDot[1] = fast.rate * (1.0 - StrictMath.exp(y[1]) / fast.capacity);
                yDot[2] = slow.rate * (1.0 - StrictMath.exp(y[2]) / slow.capacity);
            }
        };
        double[] days = QuellmarScenario.seasonDays(QuellmarScenario.FULL_SEASON);
        double[][] states = PlanktonDynamics.SOLVER.solve(ode, 0.0,
                new double[] {0.01, StrictMath.log(0.001), StrictMath.log(0.05)}, days);
        for (int j = 0; j < days.length; j++) {
            double n = nutrientLike.exact(0.01, days[j]);
            assertEquals(n, states[j][0], BOUND * n, "N at day " + days[j]);
            // ln N has tolerance 1e-8 absolute, so 1e-6 on ln N, which is 1e-6 relative on N.
            assertEquals(StrictMath.log(fast.exact(0.001, days[j])), states[j][1], BOUND, "ln N (fast) at day " + days[j]);
            assertEquals(StrictMath.log(slow.exact(0.05, days[j])), states[j][2], BOUND, "ln N (slow) at day " + days[j]);
        }
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PlanktonDynamics.SOLVER.solve(nutrientLike, 0.0, new double[] {1.0}, days));
        assertTrue(e.getMessage().contains("for 3 equations"), e.getMessage());
    }

    @Test
    @DisplayName("logistic growth from a later start, output times off the step grid, start time returned as given")
    void laterStartAndUnevenTimes() {
        Logistic ode = new Logistic(0.7, 3.0);
        double t0 = 12.5;
        double[] times = {12.5, 12.6, 13.0, 15.25, 20.0, 31.7, 58.0};
        double[] y0 = {0.2};
        double[][] states = SCALAR.solve(ode, t0, y0, times);
        assertArrayEquals(y0, states[0], 0.0, "the state at t0 is the initial state");
        for (int j = 1; j < times.length; j++) {
            double exact = ode.exact(0.2, times[j] - t0);
            assertEquals(exact, states[j][0], BOUND * exact, "t=" + times[j]);
        }
        assertEquals(0.2, y0[0], 0.0, "the initial state is not modified");
    }

    @Test
    @DisplayName("harmonic oscillator y'' = -w^2 y matches cos and sin to 1e-6 over 25 periods")
    void harmonicOscillator() {
        double omega = 2.0 * StrictMath.PI / 7.0;
        FirstOrderDifferentialEquations ode = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return 2;
            }

            @Override
            public void computeDerivatives(double t, double[] y, double[] yDot) {
                yDot[0] = y[1];
                yDot[1] = -omega * omega * y[0];
            }
        };
        double[] times = new double[36];
        for (int j = 0; j < times.length; j++) {
            times[j] = 5.0 * j + 0.3;
        }
        double[][] states = SCALAR.solve(ode, 0.0, new double[] {1.0, 0.0}, times);
        for (int j = 0; j < times.length; j++) {
            // Closed form: y = cos(wt), y' = -w sin(wt). Errors of an oscillation grow linearly in
            // time rather than being damped, so this bound is absolute on a unit amplitude.
            assertEquals(StrictMath.cos(omega * times[j]), states[j][0], BOUND, "y at t=" + times[j]);
            assertEquals(-omega * StrictMath.sin(omega * times[j]), states[j][1], BOUND * omega, "y' at t=" + times[j]);
        }
    }

    @Test
    @DisplayName("bad output times are refused naming the index and value; the evaluation cap throws")
    void failures() {
        Logistic ode = new Logistic(0.3, 10.0);
        OdeTrajectory solver = SCALAR;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> solver.solve(ode, 0.0, new double[] {1.0}, new double[] {0.0, 7.0, 7.0}));
        assertTrue(e.getMessage().contains("times[2] was 7.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> solver.solve(ode, 5.0, new double[] {1.0}, new double[] {4.0}));
        assertTrue(e.getMessage().contains("times[0] was 4.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> solver.solve(ode, 0.0, new double[] {1.0, 2.0}, new double[] {1.0}));
        assertTrue(e.getMessage().contains("2 values"), e.getMessage());
        assertThrows(MaxCountExceededException.class,
                () -> OdeTrajectory.of(1e-10, 1e-8, 50).solve(ode, 0.0, new double[] {1.0}, new double[] {175.0}));
        e = assertThrows(IllegalArgumentException.class, () -> OdeTrajectory.of(-1.0, 1e-8, 10));
        assertTrue(e.getMessage().contains("absoluteTolerance[0]") && e.getMessage().contains("-1.0"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> OdeTrajectory.of(0.0, 0.0, 10));
        assertTrue(e.getMessage().contains("both be 0"), e.getMessage());
    }
}
