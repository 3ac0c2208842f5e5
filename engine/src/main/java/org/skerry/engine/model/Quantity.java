package org.skerry.engine.model;

/**
 * What a number measures, for a figure's axis: a label ({@code chlorophyll-a}, {@code day}) and
 * a unit ({@code mg m^-3}; empty for a count or a dimensionless value). Immutable.
 *
 * @param label a non-blank name
 * @param unit the unit, or {@code ""} when there is none
 */
public record Quantity(String label, String unit) {

    /** The position of an observation that has no natural axis: its row number from 0. */
    public static final Quantity ROW = new Quantity("row", "");

    /**
     * @throws IllegalArgumentException if the label is null or blank, or the unit is null
     */
    public Quantity {
        if (label == null || label.isBlank()) {
            throw new IllegalArgumentException("label must not be null or blank, was " + label);
        }
        if (unit == null) {
            throw new IllegalArgumentException("unit of '" + label + "' must not be null; use \"\" for none");
        }
    }

    /** A quantity without a unit. */
    public static Quantity unitless(String label) {
        return new Quantity(label, "");
    }
}
