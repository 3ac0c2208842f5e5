package org.skerry.benchmarks;

import java.util.LinkedHashMap;
import java.util.Map;

/** The benchmark harnesses' command line: {@code key=value} arguments, in the order given. */
final class KeyValueArguments {

    private KeyValueArguments() {
    }

    static Map<String, String> parse(String[] args) {
        Map<String, String> options = new LinkedHashMap<>();
        for (String arg : args) {
            int eq = arg.indexOf('=');
            if (eq < 1) {
                throw new IllegalArgumentException("arguments are key=value, got " + arg);
            }
            options.put(arg.substring(0, eq), arg.substring(eq + 1));
        }
        return options;
    }
}
