package org.skerry.engine.model.plankton;

import java.util.Arrays;

/**
 * One monitoring buoy of the invented Lake Quellmar scenario ({@link QuellmarScenario}): its
 * number and name, the stated true parameters its synthetic data are generated from (in
 * {@link PlanktonModel#PARAMETER_NAMES} order), and its initial nutrient stock. Fictional:
 * nothing here describes a real lake. Immutable.
 */
public final class QuellmarBuoy {

    private final int number;
    private final double[] trueParameters;
    private final double initialNutrient;

    QuellmarBuoy(int number, double[] trueParameters, double initialNutrient) {
        if (number < 1 || number > 99) {
            throw new IllegalArgumentException("buoy number must be in [1, 99], was " + number);
        }
        if (trueParameters.length != PlanktonModel.PARAMETER_NAMES.size()) {
            throw new IllegalArgumentException("buoy " + number + " needs " + PlanktonModel.PARAMETER_NAMES.size()
                    + " true parameters, was " + trueParameters.length);
        }
        for (int i = 0; i < trueParameters.length; i++) {
            if (!(trueParameters[i] > 0.0 && trueParameters[i] < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("buoy " + number + " true " + PlanktonModel.PARAMETER_NAMES.get(i)
                        + " must be finite and > 0, was " + trueParameters[i]);
            }
        }
        this.number = number;
        this.trueParameters = trueParameters.clone();
        this.initialNutrient = initialNutrient;
        constants();
    }

    public int number() {
        return number;
    }

    /** {@code buoy-01} … {@code buoy-12}. */
    public String name() {
        return String.format("buoy-%02d", number);
    }

    /** The true parameters (a copy), in {@link PlanktonModel#PARAMETER_NAMES} order. */
    public double[] trueParameters() {
        return trueParameters.clone();
    }

    /** The true value of the named parameter. */
    public double trueParameter(String name) {
        int index = PlanktonModel.PARAMETER_NAMES.indexOf(name);
        if (index < 0) {
            throw new IllegalArgumentException("unknown parameter '" + name + "'; parameters: "
                    + PlanktonModel.PARAMETER_NAMES);
        }
        return trueParameters[index];
    }

    /** N₀ at this buoy, mmol N m⁻³. */
    public double initialNutrient() {
        return initialNutrient;
    }

    /** The fixed quantities at this buoy: the defaults with this buoy's N₀. */
    public PlanktonConstants constants() {
        return PlanktonConstants.defaults().withInitialNutrient(initialNutrient);
    }

    @Override
    public String toString() {
        return name() + "(true " + PlanktonModel.PARAMETER_NAMES + " = " + Arrays.toString(trueParameters)
                + ", N0 = " + initialNutrient + ")";
    }
}
