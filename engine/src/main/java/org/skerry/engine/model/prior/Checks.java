package org.skerry.engine.model.prior;

/** Argument checks shared by the distributions; messages name the argument and its value. */
final class Checks {

    private Checks() {
    }

    static double finite(String name, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + " must be finite, was " + value);
        }
        return value;
    }

    static double positive(String name, double value) {
        if (!(value > 0.0) || value == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException(name + " must be finite and > 0, was " + value);
        }
        return value;
    }
}
