package org.skerry.engine.model;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * The named parameters of a model and the support of each, in parameter-vector order. Immutable.
 */
public final class ParameterSpace {

    private final List<String> names;
    private final Support[] supports;

    private ParameterSpace(List<String> names, Support[] supports) {
        this.names = names;
        this.supports = supports;
    }

    /**
     * @throws IllegalArgumentException if the lists differ in length, are empty, or a name is
     *     blank or repeated
     */
    public static ParameterSpace of(List<String> names, List<Support> supports) {
        if (names.isEmpty()) {
            throw new IllegalArgumentException("a model needs at least one parameter");
        }
        if (names.size() != supports.size()) {
            throw new IllegalArgumentException("parameter names (" + names.size()
                    + ") and supports (" + supports.size() + ") differ in number");
        }
        Set<String> seen = new HashSet<>();
        for (String name : names) {
            if (name == null || name.isBlank()) {
                throw new IllegalArgumentException("parameter names must not be blank: " + names);
            }
            if (!seen.add(name)) {
                throw new IllegalArgumentException("parameter name '" + name + "' appears twice in " + names);
            }
        }
        return new ParameterSpace(Collections.unmodifiableList(new ArrayList<>(names)),
                supports.toArray(new Support[0]));
    }

    /** {@code d} parameters named {@code prefix1 … prefixd}, all on the real line. */
    public static ParameterSpace real(String prefix, int dimension) {
        List<String> names = new ArrayList<>();
        List<Support> supports = new ArrayList<>();
        for (int i = 1; i <= dimension; i++) {
            names.add(prefix + i);
            supports.add(Support.real());
        }
        return of(names, supports);
    }

    public int dimension() {
        return supports.length;
    }

    public List<String> names() {
        return names;
    }

    public String name(int index) {
        return names.get(index);
    }

    public Support support(int index) {
        return supports[index];
    }

    /** Index of the named parameter, or −1. */
    public int indexOf(String name) {
        return names.indexOf(name);
    }

    /** Whether every coordinate of {@code x} lies inside its support. */
    public boolean contains(double[] x) {
        for (int i = 0; i < supports.length; i++) {
            if (!supports[i].contains(x[i])) {
                return false;
            }
        }
        return true;
    }

    /** Writes the unconstrained coordinates of {@code x} into {@code z}. */
    public void toUnconstrained(double[] x, double[] z) {
        for (int i = 0; i < supports.length; i++) {
            z[i] = supports[i].toUnconstrained(x[i]);
        }
    }

    /**
     * Writes the model-scale values of {@code z} into {@code x} and returns
     * {@code log|dx/dz|}, the log-Jacobian of the map, summed over coordinates.
     */
    public double fromUnconstrained(double[] z, double[] x) {
        double logJacobian = 0.0;
        for (int i = 0; i < supports.length; i++) {
            x[i] = supports[i].fromUnconstrained(z[i]);
            logJacobian += supports[i].logJacobian(z[i]);
        }
        return logJacobian;
    }

    /** {@code log|dx/dz|} summed over coordinates, at unconstrained point {@code z}. */
    public double logJacobian(double[] z) {
        double logJacobian = 0.0;
        for (int i = 0; i < supports.length; i++) {
            logJacobian += supports[i].logJacobian(z[i]);
        }
        return logJacobian;
    }

    @Override
    public String toString() {
        StringBuilder text = new StringBuilder("[");
        for (int i = 0; i < supports.length; i++) {
            text.append(i == 0 ? "" : ", ").append(names.get(i)).append(' ').append(supports[i]);
        }
        return text.append(']').toString();
    }

    @Override
    public boolean equals(Object other) {
        if (!(other instanceof ParameterSpace)) {
            return false;
        }
        ParameterSpace that = (ParameterSpace) other;
        return names.equals(that.names) && Arrays.toString(supports).equals(Arrays.toString(that.supports));
    }

    @Override
    public int hashCode() {
        return names.hashCode();
    }
}
