package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.settings.ModelSettings;

/** Reads data columns for the factories and checks them; messages name the roles. */
final class Data {

    private Data() {
    }

    /** The named columns as an n × roles.size() matrix, all columns of one non-zero length. */
    static double[][] rows(ModelSettings settings, List<String> roles) {
        double[][] columns = new double[roles.size()][];
        int n = -1;
        for (int j = 0; j < columns.length; j++) {
            columns[j] = settings.column(roles.get(j));
            if (columns[j].length == 0) {
                throw new IllegalArgumentException("data column for role '" + roles.get(j) + "' is empty");
            }
            if (n >= 0 && columns[j].length != n) {
                throw new IllegalArgumentException("data columns differ in length: role '" + roles.get(0)
                        + "' has " + n + " values, role '" + roles.get(j) + "' has " + columns[j].length);
            }
            n = columns[j].length;
            for (int i = 0; i < n; i++) {
                if (!Double.isFinite(columns[j][i])) {
                    throw new IllegalArgumentException("data column for role '" + roles.get(j) + "' row "
                            + i + " must be finite, was " + columns[j][i]);
                }
            }
        }
        double[][] rows = new double[n][columns.length];
        for (int j = 0; j < columns.length; j++) {
            for (int i = 0; i < n; i++) {
                rows[i][j] = columns[j][i];
            }
        }
        return rows;
    }

    /** A column of whole numbers, as ints. */
    static int[] wholeNumbers(ModelSettings settings, String role) {
        double[] column = settings.column(role);
        int[] out = new int[column.length];
        for (int i = 0; i < column.length; i++) {
            double x = column[i];
            if (!(x == StrictMath.rint(x) && x >= 0 && x <= Integer.MAX_VALUE)) {
                throw new IllegalArgumentException("data column for role '" + role
                        + "' must hold whole numbers >= 0, row " + i + " was " + x);
            }
            out[i] = (int) x;
        }
        return out;
    }

    static void requireFinite(String name, double[][] rows) {
        for (int i = 0; i < rows.length; i++) {
            for (int j = 0; j < rows[i].length; j++) {
                if (!Double.isFinite(rows[i][j])) {
                    throw new IllegalArgumentException(name + "[" + i + "][" + j + "] must be finite, was "
                            + rows[i][j]);
                }
            }
        }
    }

    static double positive(String name, double value) {
        if (!(value > 0.0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(name + " must be finite and > 0, was " + value);
        }
        return value;
    }

    static double finite(String name, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + " must be finite, was " + value);
        }
        return value;
    }
}
