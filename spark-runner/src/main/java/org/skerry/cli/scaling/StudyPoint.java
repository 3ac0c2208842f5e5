package org.skerry.cli.scaling;

import java.util.List;
import java.util.Map;
import org.skerry.cli.runfile.RunSpec;

/**
 * One point of a study's grid: its values on the axes, the run-file overrides that make it, and
 * the checked run settings. Points of one group share every axis value but cores.
 *
 * @param group     index of the combination of non-core axis values
 * @param values    axis key → value as shown (cores first when there is a cores axis)
 * @param cores     the cores the run may use, or 0 when the study has no cores axis
 * @param overrides {@code key=value} overrides of the base run file
 * @param spec      the checked settings of the run
 */
public record StudyPoint(int group, Map<String, String> values, int cores, List<String> overrides, RunSpec spec) {

    /** A folder name from the axis values: {@code cores-2_islands.count-8}, or {@code base}. */
    public String label() {
        StringBuilder out = new StringBuilder();
        for (Map.Entry<String, String> entry : values.entrySet()) {
            if (out.length() > 0) {
                out.append('_');
            }
            out.append(shortKey(entry.getKey())).append('-').append(entry.getValue().replaceAll("[^A-Za-z0-9.+-]", "."));
        }
        return out.length() == 0 ? "base" : out.toString();
    }

    /** The last two segments of a dotted key ({@code islands.count}), which stay readable and distinct. */
    private static String shortKey(String key) {
        String plain = key.replace("\"", "");
        String[] parts = plain.split("\\.");
        return parts.length <= 2 ? plain : parts[parts.length - 2] + "." + parts[parts.length - 1];
    }

    /** The non-core axis values, for naming a group in tables and plots. */
    public String groupLabel() {
        StringBuilder out = new StringBuilder();
        for (Map.Entry<String, String> entry : values.entrySet()) {
            if (entry.getKey().equals(StudyFile.CORES)) {
                continue;
            }
            out.append(out.length() > 0 ? ", " : "").append(shortKey(entry.getKey())).append(" = ").append(entry.getValue());
        }
        return out.length() == 0 ? "all points" : out.toString();
    }
}
