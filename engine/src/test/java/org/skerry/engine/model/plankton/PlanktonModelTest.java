package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.distribution.LogNormalDistribution;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.nonstiff.GraggBulirschStoerIntegrator;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.LogNormal;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.prior.Uniform;

/**
 * The NPZ equations and the likelihood against closed forms and Commons Math. Special cases of
 * the equations with a closed (implicit) solution are solved for P by Brent's method
 * (Commons Math {@link BrentSolver}) and compared with the trajectory to a hundred times the
 * solver's local tolerance, as argued in {@link OdeTrajectoryTest}: ln P is controlled to 1e-8
 * absolute, so P is compared at 1e-6 relative, however small it gets.
 */
class PlanktonModelTest {

    private static double bound(double exact) {
        // ln P has absolute tolerance 1e-8 in the plankton solver: 1e-8 relative on P.
        return 100.0 * PlanktonDynamics.SOLVER.absoluteTolerance(1) * StrictMath.abs(exact);
    }

    /** Solves {@code equations} from (N, P, Z) and returns (N, P, Z) rows. */
    private static double[][] solve(NpzEquations equations, double n0, double p0, double z0, double[] times) {
        double[][] states = PlanktonDynamics.SOLVER.solve(equations, 0.0, NpzEquations.toIntegrated(n0, p0, z0), times);
        for (double[] state : states) {
            state[1] = StrictMath.exp(state[1]);
            state[2] = StrictMath.exp(state[2]);
        }
        return states;
    }
    private static final QuellmarBuoy DEMO = QuellmarScenario.demoBuoy();

    private static double[] halfDays(int count) {
        double[] times = new double[count];
        for (int j = 0; j < count; j++) {
            times[j] = 0.5 * (j + 1);
        }
        return times;
    }

    /** The P with {@code f(P) = target} in (lower, upper), by Brent's method to 1e-15 relative. */
    private static double root(DoubleUnaryOperator f, double target, double lower, double upper) {
        BrentSolver solver = new BrentSolver(1e-15, 1e-15 * upper, 1e-300);
        return solver.solve(1000, x -> f.applyAsDouble(x) - target, lower, upper);
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("total nitrogen N + P + Z stays at its initial value to integration error over a season")
    void nitrogenIsConserved(GrazingResponse grazing) {
        // The solver integrates (N, ln P, ln Z), in which N + P + Z is not linear, so it is kept only
        // to the integration error: a hundred times the local tolerance (1e-8 relative for each
        // pool, see OdeTrajectoryTest), 1e-6 of the total. A flux missing from one equation would
        // move the total by the order of that flux over a season, ~0.1 to 1.
        PlanktonDynamics dynamics = PlanktonDynamics.of(grazing, DEMO.constants(),
                QuellmarScenario.seasonDays(QuellmarScenario.FULL_SEASON));
        double[] y0 = DEMO.constants().initialState();
        double total = y0[0] + y0[1] + y0[2];
        double[][] states = dynamics.states(DEMO.trueParameters());
        double largestP = 0.0;
        for (double[] state : states) {
            assertEquals(total, state[0] + state[1] + state[2], 1e-6 * total);
            largestP = StrictMath.max(largestP, state[1]);
        }
        assertTrue(largestP > 0.5 * total, "a bloom takes up most of the nitrogen: " + largestP);
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("the log-space solve agrees with the equations in (N, P, Z) solved by Commons Math's Gragg-Bulirsch-Stoer")
    void agreesWithLinearFormReference(GrazingResponse grazing) {
        // The equations as written in the paper's form, in (N, P, Z), coded here independently of
        // NpzEquations and solved by extrapolation (Commons Math GraggBulirschStoerIntegrator,
        // Hairer, Nørsett & Wanner §II.9) at 1e-13 relative: a reference whose own error is
        // negligible against the 1e-6 compared.
        double[] th = DEMO.trueParameters();
        PlanktonConstants k = DEMO.constants();
        double gamma = k.assimilation();
        double mz = k.zooplanktonMortality();
        FirstOrderDifferentialEquations linear = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return 3;
            }

            @Override
            public void computeDerivatives(double t, double[] y, double[] yDot) {
                double n = y[0];
                double p = y[1];
                double z = y[2];
                double graze = grazing == GrazingResponse.SATURATING
                        ? th[2] * p / (th[3] + p) : th[2] * p * p / (th[3] * th[3] + p * p);
                double uptake = th[0] * n / (th[1] + n) * p;
                yDot[0] = -uptake + (1 - gamma) * graze * z + th[4] * p + mz * z;
                yDot[1] = uptake - graze * z - th[4] * p;
                yDot[2] = gamma * graze * z - mz * z;
            }
        };
        double[] days = QuellmarScenario.seasonDays(QuellmarScenario.FULL_SEASON);
        double[][] actual = PlanktonDynamics.of(grazing, k, days).states(th);
        GraggBulirschStoerIntegrator reference = new GraggBulirschStoerIntegrator(0.0, 7.0, 1e-15, 1e-13);
        double[] y = k.initialState();
        for (int j = 0; j < days.length; j++) {
            if (j > 0) {
                reference.integrate(linear, days[j - 1], y, days[j], y);
            }
            for (int i = 0; i < 3; i++) {
                assertEquals(y[i], actual[j][i], bound(y[i]) + 100 * PlanktonDynamics.SOLVER.absoluteTolerance(0),
                        "component " + i + " at day " + days[j]);
            }
        }
    }

    @Test
    @DisplayName("no grazers, no mortality: P follows the implicit solution of Monod uptake")
    void monodUptakeClosedForm() {
        // With Z = 0 and m_P = 0, N = T - P and dP/dt = mu (T - P) P / (k + T - P). Separating
        // variables with partial fractions gives the implicit solution
        // (1 + k/T) ln P - (k/T) ln(T - P) = mu t + const (derived by hand for this test).
        double mu = 1.1;
        double k = 0.6;
        double n0 = 4.0;
        double p0 = 0.05;
        double total = n0 + p0;
        NpzEquations equations = new NpzEquations(GrazingResponse.SATURATING, mu, k, 1.0, 1.0, 0.0, 0.3, 0.15);
        DoubleUnaryOperator f = p -> (1.0 + k / total) * StrictMath.log(p) - (k / total) * StrictMath.log(total - p);
        double[] times = halfDays(24);
        // ln Z needs Z > 0: 1e-300 grazers, growing at most e^{gamma g t} ~ 30-fold over 12
        // days, take a fraction ~1e-298 of P, far below the 1e-6 compared.
        double[][] states = solve(equations, n0, p0, 1e-300, times);
        for (int j = 0; j < times.length; j++) {
            double exact = root(f, f.applyAsDouble(p0) + mu * times[j], p0, total);
            assertEquals(exact, states[j][1], bound(exact), "P at t=" + times[j]);
            assertTrue(states[j][2] < 1e-290, "no zooplankton to speak of");
        }
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("no growth, no mortality: P follows the implicit solution of pure grazing")
    void grazingClosedForm(GrazingResponse grazing) {
        // With mu_max = m_P = m_Z = 0: dZ/dt = -gamma dP/dt, so Z = C - gamma P with
        // C = Z0 + gamma P0, and dP/dt = -G(P) (C - gamma P). Partial fractions (derived by hand):
        // type II:  (k/C) ln P - ((1 + k gamma/C)/gamma) ln(C - gamma P)                 = -g t + const
        // type III: (k^2 gamma/C^2) ln P - (k^2/C)/P - ((1 + k^2 gamma^2/C^2)/gamma) ln(C - gamma P) = -g t + const
        double g = 0.9;
        double k = 0.8;
        double gamma = 0.3;
        double p0 = 3.0;
        double z0 = 0.2;
        double c = z0 + gamma * p0;
        NpzEquations equations = new NpzEquations(grazing, 0.0, 0.5, g, k, 0.0, gamma, 0.0);
        DoubleUnaryOperator f = grazing == GrazingResponse.SATURATING
                ? p -> (k / c) * StrictMath.log(p) - ((1.0 + k * gamma / c) / gamma) * StrictMath.log(c - gamma * p)
                : p -> (k * k * gamma / (c * c)) * StrictMath.log(p) - (k * k / c) / p
                        - ((1.0 + k * k * gamma * gamma / (c * c)) / gamma) * StrictMath.log(c - gamma * p);
        double[] times = halfDays(40);
        double[][] states = solve(equations, 1.0, p0, z0, times);
        for (int j = 0; j < times.length; j++) {
            double exact = root(f, f.applyAsDouble(p0) - g * times[j], 1e-250, p0);
            assertEquals(exact, states[j][1], bound(exact), "P at t=" + times[j]);
            assertEquals(c - gamma * exact, states[j][2], bound(c - gamma * exact), "Z at t=" + times[j]);
        }
        assertTrue(states[times.length - 1][1] < 0.5 * p0, "grazing has eaten over half the phytoplankton");
    }

    @Test
    @DisplayName("both responses are half their maximum at k_P; type III is flat at zero (Holling 1959)")
    void grazingResponses() {
        for (GrazingResponse response : GrazingResponse.values()) {
            assertEquals(0.6, response.rate(1.2, 0.7, 0.7), 1e-15, response.name());
            assertEquals(1.2, response.rate(1.2, 0.7, 1e9), 1e-8, response.name() + " saturates at g_max");
        }
        // Slope at P -> 0: g/k for type II, 0 for type III.
        double h = 1e-7;
        assertEquals(1.2 / 0.7, GrazingResponse.SATURATING.rate(1.2, 0.7, h) / h, 1e-5);
        assertEquals(0.0, GrazingResponse.SIGMOIDAL.rate(1.2, 0.7, h) / h, 1e-5);
        assertEquals(GrazingResponse.SIGMOIDAL, GrazingResponse.fromSettingName(" Sigmoidal "));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> GrazingResponse.fromSettingName("holling-4"));
        assertTrue(e.getMessage().contains("'holling-4'"), e.getMessage());
    }

    @ParameterizedTest
    @EnumSource(GrazingResponse.class)
    @DisplayName("log-likelihood equals the sum of Commons Math LogNormalDistribution.logDensity at the solved trajectory")
    void likelihoodMatchesCommonsMath(GrazingResponse grazing) {
        double[][] rows = QuellmarData.generate(DEMO, 2024L);
        PlanktonModel model = QuellmarScenario.model(DEMO, rows, grazing);
        double[] truth = DEMO.trueParameters();
        double[] other = {1.3, 0.35, 0.8, 1.4, 0.07, 0.35};
        for (double[] theta : new double[][] {truth, other}) {
            double[][] states = model.dynamics().states(theta);
            double expected = 0.0;
            for (int j = 0; j < rows.length; j++) {
                double scale = StrictMath.log(DEMO.constants().chlorophyllPerNitrogen() * states[j][1]);
                expected += new LogNormalDistribution(scale, theta[PlanktonModel.SIGMA]).logDensity(rows[j][1]);
            }
            double actual = model.logLikelihood(theta, null);
            // Same terms, summed in another order with other log implementations: a few ulps per term.
            assertEquals(expected, actual, 1e-11 * StrictMath.abs(expected) + 1e-11);
        }
    }

    @Test
    @DisplayName("parameter supports are the prior's; the prior's normalised density is the product of marginals")
    void supportsAndPrior() {
        double[][] rows = QuellmarData.generate(DEMO, 5L, 8);
        IndependentPrior prior = IndependentPrior.of(LogNormal.of(0, 0.3), Uniform.of(0.1, 2.0), LogNormal.of(0, 0.3),
                LogNormal.of(0, 0.3), LogNormal.of(-2.3, 0.3), LogNormal.of(-1.6, 0.3));
        PlanktonModel model = QuellmarScenario.model(DEMO, rows, GrazingResponse.SIGMOIDAL, prior);
        assertEquals(PlanktonModel.PARAMETER_NAMES, model.parameters().names());
        assertEquals(Support.Kind.LOWER_BOUNDED, model.parameters().support(PlanktonModel.MU_MAX).kind());
        assertEquals(Support.Kind.INTERVAL, model.parameters().support(PlanktonModel.K_N).kind());
        assertEquals(2.0, model.parameters().support(PlanktonModel.K_N).upper(), 0.0);
    }

    @Test
    @DisplayName("bad data are refused naming the role, the row and the value; so is a prior reaching below zero")
    void badInput() {
        PlanktonConstants constants = PlanktonConstants.defaults();
        IndependentPrior prior = PlanktonPriors.defaults();
        GrazingResponse g = GrazingResponse.SATURATING;
        double[] chl = {0.2, 1.0, 2.0, 3.0};
        assertMessage(() -> PlanktonModel.of(g, constants, prior, new double[] {0, 7, 14, 14}, chl),
                "'day'", "row 3", "14.0");
        assertMessage(() -> PlanktonModel.of(g, constants, prior, new double[] {-1, 7, 14, 21}, chl),
                "'day'", "row 0", "-1.0");
        assertMessage(() -> PlanktonModel.of(g, constants, prior, new double[] {0, 7, 14, 21},
                new double[] {0.2, 1.0, 0.0, 3.0}), "'chlorophyll'", "row 2", "0.0");
        assertMessage(() -> PlanktonModel.of(g, constants, prior, new double[] {0, 7, 14, 21},
                new double[] {0.2, Double.NaN, 1.0, 3.0}), "'chlorophyll'", "row 1", "NaN");
        assertMessage(() -> PlanktonModel.of(g, constants, prior, new double[] {0, 7, 14}, chl),
                "'day' has 3", "'chlorophyll' has 4");
        IndependentPrior normal = IndependentPrior.of(LogNormal.of(0, 0.3), LogNormal.of(0, 0.3), Normal.of(1, 0.2),
                LogNormal.of(0, 0.3), LogNormal.of(0, 0.3), LogNormal.of(0, 0.3));
        assertMessage(() -> PlanktonModel.of(g, constants, normal, new double[] {0, 7, 14, 21}, chl),
                "g_max", "normal");
        assertMessage(() -> new PlanktonConstants(1.5, 0.1, 4, 0.1, 0.1, 1.59, 0), "assimilation", "1.5");
        assertMessage(() -> new PlanktonConstants(0.3, 0.1, 4, 0.0, 0.1, 1.59, 0), "initial.phytoplankton", "0.0");
        assertMessage(() -> new PlanktonConstants(0.3, 0.1, 4, 0.1, 0.0, 1.59, 0), "initial.zooplankton", "0.0");
    }

    static void assertMessage(org.junit.jupiter.api.function.Executable call, String... parts) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, call);
        for (String part : parts) {
            assertTrue(e.getMessage().contains(part), "'" + part + "' missing from: " + e.getMessage());
        }
    }
}
