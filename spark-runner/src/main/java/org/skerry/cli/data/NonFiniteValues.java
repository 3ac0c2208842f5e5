package org.skerry.cli.data;

/**
 * Whether data may hold NaN and infinite values. Refused by default: in calibration data they are
 * nearly always a spreadsheet's way of saying "missing", which a model should not silently see.
 */
public enum NonFiniteValues {
    /** {@code NaN}, {@code Infinity} and {@code -Infinity} are errors. */
    REFUSE,
    /** {@code NaN}, {@code Infinity}, {@code -Infinity} (any case; also {@code inf}) are read as such. */
    ALLOW
}
