package org.skerry.engine.model.plankton;

import java.util.Arrays;

/**
 * The deterministic part of a {@link PlanktonModel}: for a parameter vector, the NPZ state
 * (Franks, Wroblewski &amp; Flierl 1986, Marine Biology 91) at fixed output days, from one
 * {@link OdeTrajectory} solve. Shared by the likelihood and the synthetic-data generator, so
 * that data are simulated from exactly the model that is calibrated. Immutable and thread-safe.
 */
public final class PlanktonDynamics {

    /**
     * The solver of {@code (N, ln P, ln Z)}: local error within 1e-10 mmol N m⁻³ + 1e-8·N for the
     * nutrient and within 1e-8 for ln P and ln Z, that is 1e-8 relative for P and Z down to any
     * size. On the Lake Quellmar seasons the global error of ln P stays within about 1e-6
     * (measured against a solve at 1e-13 over prior draws), which moves a log-likelihood with
     * σ ≈ 0.2 by about 1e-4: far below the sampler's Monte Carlo error. A season takes a few
     * thousand evaluations; the cap of 100 000 bounds the cost of a pathological parameter vector.
     */
    public static final OdeTrajectory SOLVER = OdeTrajectory.of(new double[] {1e-10, 1e-8, 1e-8},
            new double[] {1e-8, 0.0, 0.0}, 100_000);

    private final GrazingResponse grazing;
    private final PlanktonConstants constants;
    private final double[] days;
    private final OdeTrajectory solver;

    private PlanktonDynamics(GrazingResponse grazing, PlanktonConstants constants, double[] days,
            OdeTrajectory solver) {
        this.grazing = grazing;
        this.constants = constants;
        this.days = days;
        this.solver = solver;
    }

    /**
     * Dynamics solved with {@link #SOLVER}.
     *
     * @param days output days: finite, strictly increasing, none before the initial day
     * @throws IllegalArgumentException if an argument is null or the days are not as required
     */
    public static PlanktonDynamics of(GrazingResponse grazing, PlanktonConstants constants, double[] days) {
        return of(grazing, constants, days, SOLVER);
    }

    /** As {@link #of(GrazingResponse, PlanktonConstants, double[])}, with another solver. */
    public static PlanktonDynamics of(GrazingResponse grazing, PlanktonConstants constants, double[] days,
            OdeTrajectory solver) {
        if (grazing == null || constants == null || days == null || solver == null) {
            throw new IllegalArgumentException("grazing, constants, days and solver must not be null");
        }
        if (days.length == 0) {
            throw new IllegalArgumentException("data column for role 'day' is empty");
        }
        for (int i = 0; i < days.length; i++) {
            double day = days[i];
            if (!Double.isFinite(day)) {
                throw new IllegalArgumentException("data column for role 'day' row " + i + " must be finite, was " + day);
            }
            if (i == 0 && day < constants.initialDay()) {
                throw new IllegalArgumentException("data column for role 'day' row 0 must be >= initial.day="
                        + constants.initialDay() + ", was " + day);
            }
            if (i > 0 && !(day > days[i - 1])) {
                throw new IllegalArgumentException("data column for role 'day' must be strictly increasing; row "
                        + i + " was " + day + " after " + days[i - 1]);
            }
        }
        return new PlanktonDynamics(grazing, constants, days.clone(), solver);
    }

    public GrazingResponse grazing() {
        return grazing;
    }

    public PlanktonConstants constants() {
        return constants;
    }

    /** The output days (a copy). */
    public double[] days() {
        return days.clone();
    }

    public int size() {
        return days.length;
    }

    public OdeTrajectory solver() {
        return solver;
    }

    /** The right-hand side for {@code parameters}, in {@link PlanktonModel}'s order (σ is ignored). */
    public NpzEquations equations(double[] parameters) {
        return new NpzEquations(grazing, parameters[PlanktonModel.MU_MAX], parameters[PlanktonModel.K_N],
                parameters[PlanktonModel.G_MAX], parameters[PlanktonModel.K_P], parameters[PlanktonModel.M_P],
                constants.assimilation(), constants.zooplanktonMortality());
    }

    /**
     * The solved states {@code (N, ln P, ln Z)} at each output day, one row per day (a fresh
     * array): the form {@link NpzEquations} integrates.
     *
     * @throws IllegalStateException or a Commons Math exception if the solve fails
     *     (see {@link OdeTrajectory#solve})
     */
    public double[][] integratedStates(double[] parameters) {
        double[] y0 = NpzEquations.toIntegrated(constants.initialNutrient(), constants.initialPhytoplankton(),
                constants.initialZooplankton());
        return solver.solve(equations(parameters), constants.initialDay(), y0, days);
    }

    /**
     * The solved states {@code (N, ln P, ln Z)} at the first {@code count} output days: bit for bit
     * the first {@code count} rows of {@link #integratedStates(double[])}, from a solve that stops
     * after the step covering day {@code count − 1} (see {@link OdeTrajectory#solve(
     * org.apache.commons.math3.ode.FirstOrderDifferentialEquations, double, double[], double[], int)}).
     *
     * @throws IllegalArgumentException if {@code count} is not in {@code [0, size()]}
     * @throws IllegalStateException or a Commons Math exception if the solve fails
     */
    public double[][] integratedStates(double[] parameters, int count) {
        double[] y0 = NpzEquations.toIntegrated(constants.initialNutrient(), constants.initialPhytoplankton(),
                constants.initialZooplankton());
        return solver.solve(equations(parameters), constants.initialDay(), y0, days, count);
    }

    /** The states (N, P, Z) at each output day, one row per day (a fresh array). */
    public double[][] states(double[] parameters) {
        double[][] states = integratedStates(parameters);
        for (double[] state : states) {
            state[1] = StrictMath.exp(state[1]);
            state[2] = StrictMath.exp(state[2]);
        }
        return states;
    }

    /** The chlorophyll-a the model predicts at each output day: ratio·P (a fresh array). */
    public double[] chlorophyll(double[] parameters) {
        double[][] states = integratedStates(parameters);
        double[] out = new double[states.length];
        for (int j = 0; j < out.length; j++) {
            out[j] = constants.chlorophyllPerNitrogen() * StrictMath.exp(states[j][1]);
        }
        return out;
    }

    @Override
    public String toString() {
        return "plankton-dynamics(" + grazing.settingName() + ", " + constants + ", days " + Arrays.toString(days)
                + ", " + solver + ")";
    }
}
