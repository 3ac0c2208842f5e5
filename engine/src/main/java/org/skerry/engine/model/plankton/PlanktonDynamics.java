package org.skerry.engine.model.plankton;

import java.util.Arrays;

/**
 * The deterministic part of a {@link PlanktonModel}: for a parameter vector, the NPZ state
 * (Franks, Wroblewski &amp; Flierl 1986, Marine Biology 91) at fixed output days, from one
 * {@link OdeTrajectory} solve. Shared by the likelihood and the synthetic-data generator, so
 * that data are simulated from exactly the model that is calibrated. Immutable and thread-safe.
 */
public final class PlanktonDynamics {

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
     * Dynamics solved with {@link OdeTrajectory#standard()}.
     *
     * @param days output days: finite, strictly increasing, none before the initial day
     * @throws IllegalArgumentException if an argument is null or the days are not as required
     */
    public static PlanktonDynamics of(GrazingResponse grazing, PlanktonConstants constants, double[] days) {
        return of(grazing, constants, days, OdeTrajectory.standard());
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
     * The states (N, P, Z) at each output day, one row per day (a fresh array).
     *
     * @throws IllegalStateException or a Commons Math exception if the solve fails
     *     (see {@link OdeTrajectory#solve})
     */
    public double[][] states(double[] parameters) {
        return solver.solve(equations(parameters), constants.initialDay(), constants.initialState(), days);
    }

    /** The chlorophyll-a the model predicts at each output day: ratio·P (a fresh array). */
    public double[] chlorophyll(double[] parameters) {
        double[][] states = states(parameters);
        double[] out = new double[states.length];
        for (int j = 0; j < out.length; j++) {
            out[j] = constants.chlorophyllPerNitrogen() * states[j][1];
        }
        return out;
    }

    @Override
    public String toString() {
        return "plankton-dynamics(" + grazing.settingName() + ", " + constants + ", days " + Arrays.toString(days)
                + ", " + solver + ")";
    }
}
