package org.skerry.cli.output;

import java.util.List;

/**
 * Parameter values as text, {@code name=value} pairs joined by a separator, each value written by
 * {@link DoubleText} so it reads back exactly: how a failing particle is named in
 * {@code iterations.csv} and in the log.
 */
public final class ParameterValues {

    private ParameterValues() {
    }

    /**
     * @param names     the parameter names, or null to name values by position ({@code x0, x1 …})
     * @param values    the values, in parameter order
     * @param separator what goes between pairs
     */
    public static String text(List<String> names, List<Double> values, String separator) {
        StringBuilder text = new StringBuilder();
        for (int k = 0; k < values.size(); k++) {
            String name = names != null && k < names.size() ? names.get(k) : "x" + k;
            text.append(k == 0 ? "" : separator).append(name).append('=').append(DoubleText.format(values.get(k)));
        }
        return text.toString();
    }
}
