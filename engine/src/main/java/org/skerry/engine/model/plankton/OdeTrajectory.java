package org.skerry.engine.model.plankton;

import java.util.Arrays;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;
import org.apache.commons.math3.ode.sampling.StepHandler;
import org.apache.commons.math3.ode.sampling.StepInterpolator;

/**
 * The solution of an initial-value problem at given output times, by one adaptive
 * Dormand–Prince 8(5,3) integration (Dormand &amp; Prince 1980, J. Comput. Appl. Math. 6(1);
 * Hairer, Nørsett &amp; Wanner, Solving ODEs I, 2nd ed. (1993), §II.10) with Commons Math's
 * {@link DormandPrince853Integrator}. The outputs are read from the method's 7th-order dense
 * output inside the step that covers each time, so output times never shorten the steps.
 *
 * <p>A step is accepted when a root-mean-square norm over components of the local error
 * estimates scaled by {@code atol_i + rtol_i·|y_i|} is at most 1 (Commons Math's control, after
 * Hairer, Nørsett &amp; Wanner §II.4 and §II.10). Minimum and maximum step are left open (0 and
 * the whole span); a runaway solve is stopped by the evaluation cap instead.
 *
 * <p>Commons Math integrators are pure Java (its {@code FastMath}) and therefore give the same
 * numbers on every Java 17 JVM. They are also stateful, so each {@link #solve} builds its own:
 * this class is immutable and may be shared between threads.
 */
public final class OdeTrajectory {

    private final double[] absoluteTolerances;
    private final double[] relativeTolerances;
    private final int maxEvaluations;

    private OdeTrajectory(double[] absoluteTolerances, double[] relativeTolerances, int maxEvaluations) {
        this.absoluteTolerances = absoluteTolerances;
        this.relativeTolerances = relativeTolerances;
        this.maxEvaluations = maxEvaluations;
    }

    /**
     * A solver whose error control keeps the local error of every component {@code y_i} within
     * about {@code absoluteTolerance + relativeTolerance·|y_i|}, for systems of any size.
     *
     * @throws IllegalArgumentException if a tolerance is negative or not finite, both are zero,
     *     or {@code maxEvaluations < 1}
     */
    public static OdeTrajectory of(double absoluteTolerance, double relativeTolerance, int maxEvaluations) {
        return of(new double[] {absoluteTolerance}, new double[] {relativeTolerance}, maxEvaluations);
    }

    /**
     * A solver for systems of {@code absoluteTolerances.length} equations whose error control keeps
     * the local error of component {@code y_i} within about
     * {@code absoluteTolerances[i] + relativeTolerances[i]·|y_i|}.
     *
     * @throws IllegalArgumentException if the arrays differ in length or are empty, a tolerance is
     *     negative or not finite, both tolerances of a component are zero, or {@code maxEvaluations < 1}
     */
    public static OdeTrajectory of(double[] absoluteTolerances, double[] relativeTolerances, int maxEvaluations) {
        if (absoluteTolerances.length == 0 || absoluteTolerances.length != relativeTolerances.length) {
            throw new IllegalArgumentException("absoluteTolerances (" + absoluteTolerances.length
                    + ") and relativeTolerances (" + relativeTolerances.length + ") must be non-empty and of one length");
        }
        for (int i = 0; i < absoluteTolerances.length; i++) {
            double a = absoluteTolerances[i];
            double r = relativeTolerances[i];
            if (!(a >= 0 && a < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("absoluteTolerance[" + i + "] must be finite and >= 0, was " + a);
            }
            if (!(r >= 0 && r < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("relativeTolerance[" + i + "] must be finite and >= 0, was " + r);
            }
            if (a == 0 && r == 0) {
                throw new IllegalArgumentException("absoluteTolerance[" + i + "] and relativeTolerance[" + i
                        + "] must not both be 0");
            }
        }
        if (maxEvaluations < 1) {
            throw new IllegalArgumentException("maxEvaluations must be >= 1, was " + maxEvaluations);
        }
        return new OdeTrajectory(absoluteTolerances.clone(), relativeTolerances.clone(), maxEvaluations);
    }

    /** The absolute tolerance of component {@code i} (the one tolerance of a size-free solver for every i). */
    public double absoluteTolerance(int i) {
        return absoluteTolerances[absoluteTolerances.length == 1 ? 0 : i];
    }

    /** The relative tolerance of component {@code i} (the one tolerance of a size-free solver for every i). */
    public double relativeTolerance(int i) {
        return relativeTolerances[relativeTolerances.length == 1 ? 0 : i];
    }

    public int maxEvaluations() {
        return maxEvaluations;
    }

    /**
     * The states at {@code times}, one row per time (a fresh array).
     *
     * @param ode   the system; called from this thread only
     * @param t0    the time of the initial state
     * @param y0    the initial state (not modified)
     * @param times output times, finite, strictly increasing and {@code >= t0}
     * @throws IllegalArgumentException if the times or the state size are wrong
     * @throws IllegalStateException if the integration breaks down (a non-finite time or state)
     * @throws org.apache.commons.math3.exception.MaxCountExceededException if the solve needs more
     *     than {@link #maxEvaluations()} evaluations of the right-hand side
     */
    public double[][] solve(FirstOrderDifferentialEquations ode, double t0, double[] y0, double[] times) {
        return solve(ode, t0, y0, times, times.length);
    }

    /**
     * The states at the first {@code count} of {@code times}, bit for bit the first {@code count}
     * rows of {@link #solve(FirstOrderDifferentialEquations, double, double[], double[])
     * solve(ode, t0, y0, times)}, at less cost: the integration is set up for the whole span (the
     * step-size limit and the last step's length depend on where it ends) and takes the same steps,
     * but stops after the step that covers {@code times[count − 1]}.
     *
     * @throws IllegalArgumentException if the times, {@code count} or the state size are wrong
     * @throws IllegalStateException as for the full solve
     * @throws org.apache.commons.math3.exception.MaxCountExceededException as for the full solve
     */
    public double[][] solve(FirstOrderDifferentialEquations ode, double t0, double[] y0, double[] times, int count) {
        int dimension = ode.getDimension();
        if (absoluteTolerances.length != 1 && absoluteTolerances.length != dimension) {
            throw new IllegalArgumentException("this solver's tolerances are for " + absoluteTolerances.length
                    + " equations but the system has " + dimension);
        }
        if (y0.length != dimension) {
            throw new IllegalArgumentException("initial state has " + y0.length + " values but the system has "
                    + dimension + " equations");
        }
        checkTimes(t0, times);
        if (count < 0 || count > times.length) {
            throw new IllegalArgumentException("count must lie in [0, " + times.length + "], was " + count);
        }
        double[][] out = new double[count][];
        int next = 0;
        while (next < count && times[next] == t0) {
            out[next++] = y0.clone();
        }
        if (next < count) {
            double end = times[times.length - 1];
            DormandPrince853Integrator integrator = absoluteTolerances.length == 1
                    ? new DormandPrince853Integrator(0.0, end - t0, absoluteTolerances[0], relativeTolerances[0])
                    : new DormandPrince853Integrator(0.0, end - t0, absoluteTolerances, relativeTolerances);
            integrator.setMaxEvaluations(maxEvaluations);
            integrator.addStepHandler(new Recorder(times, next, out));
            try {
                integrator.integrate(ode, t0, y0.clone(), end, new double[dimension]);
            } catch (Recorder.OutputsComplete stop) {
                // Every requested output is recorded; the rest of the span is not needed.
            }
        }
        for (int k = 0; k < out.length; k++) {
            if (out[k] == null) {
                throw new IllegalStateException("integration ended before t=" + times[k]);
            }
            for (double v : out[k]) {
                if (!Double.isFinite(v)) {
                    throw new IllegalStateException("non-finite state at t=" + times[k] + ": "
                            + Arrays.toString(out[k]));
                }
            }
        }
        return out;
    }

    private static void checkTimes(double t0, double[] times) {
        if (!Double.isFinite(t0)) {
            throw new IllegalArgumentException("t0 must be finite, was " + t0);
        }
        double previous = t0;
        for (int k = 0; k < times.length; k++) {
            double t = times[k];
            if (!Double.isFinite(t) || t < t0 || (k > 0 && !(t > previous))) {
                throw new IllegalArgumentException("output times must be finite, >= t0=" + t0
                        + " and strictly increasing; times[" + k + "] was " + t
                        + (k > 0 ? " after " + previous : ""));
            }
            previous = t;
        }
    }

    @Override
    public String toString() {
        return "dormand-prince-853(absTol=" + Arrays.toString(absoluteTolerances) + ", relTol="
                + Arrays.toString(relativeTolerances) + ", maxEvaluations=" + maxEvaluations + ")";
    }

    /**
     * Copies the dense output at each pending output time the current step has reached, and
     * stops the integration once {@code out} is full: a step handler has no call to end a solve,
     * and an event handler could, but at the cost of a root search in every step.
     */
    private static final class Recorder implements StepHandler {

        private final double[] times;
        private final double[][] out;
        private int next;

        Recorder(double[] times, int next, double[][] out) {
            this.times = times;
            this.next = next;
            this.out = out;
        }

        @Override
        public void init(double t0, double[] y0, double t) {
        }

        @Override
        public void handleStep(StepInterpolator interpolator, boolean isLast) {
            double reached = interpolator.getCurrentTime();
            if (!Double.isFinite(reached)) {
                // A NaN state makes the error estimate NaN, which the integrator accepts, and the
                // next step size NaN: stop here rather than step on until the evaluation cap.
                throw new IllegalStateException("integration broke down after t="
                        + interpolator.getPreviousTime());
            }
            while (next < out.length && (times[next] <= reached || isLast)) {
                interpolator.setInterpolatedTime(times[next]);
                out[next++] = interpolator.getInterpolatedState().clone();
            }
            if (next == out.length && !isLast) {
                throw new OutputsComplete();
            }
        }

        /** Thrown to end a solve early; no stack trace, as it is caught at once. */
        private static final class OutputsComplete extends RuntimeException {

            private static final long serialVersionUID = 1L;

            OutputsComplete() {
                super(null, null, false, false);
            }
        }
    }
}
