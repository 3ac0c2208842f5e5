package org.skerry.engine.abc;

/**
 * The ABC kernel K_ε(d) that weighs a simulation by its distance d from the observed summaries at
 * tolerance ε, in log form and unnormalised (its normalising constant depends on ε alone, so it
 * cancels in every normalised weight and acceptance ratio). At ε = +∞ every kernel is 1.
 */
public enum AbcKernel {
    /** {@code 1(d ≤ ε)}: the simulation is accepted or not. */
    UNIFORM,
    /** {@code exp(−d²/(2ε²))}. */
    GAUSSIAN;

    /** {@code log K_ε(d)}; {@code d} must be a distance (not NaN). */
    public double logKernel(double distance, double tolerance) {
        if (tolerance == Double.POSITIVE_INFINITY) {
            return 0.0;
        }
        if (this == UNIFORM) {
            return distance <= tolerance ? 0.0 : Double.NEGATIVE_INFINITY;
        }
        double r = distance / tolerance;
        return -0.5 * r * r;
    }
}
