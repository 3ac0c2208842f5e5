package org.skerry.cli.report;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/**
 * Typed look-ups in a JSON object read by {@link JsonValues}, whose errors name the file and the
 * key ({@code parameters.k.mean}) and say what was expected: bad input, never a stack trace.
 *
 * @param file the file, for messages
 * @param json its top-level object
 */
record JsonFields(Path file, Map<String, Object> json) {

    String text(String key) {
        return text(json, key, key);
    }

    String text(Map<String, Object> in, String key, String where) {
        String value = optionalText(in, key, where);
        if (value == null) {
            throw missing(where, "a text");
        }
        return value;
    }

    String optionalText(String key) {
        return optionalText(json, key, key);
    }

    String optionalText(Map<String, Object> in, String key, String where) {
        Object value = in.get(key);
        if (value != null && !(value instanceof String)) {
            throw wrong(where, value, "a text or null");
        }
        return (String) value;
    }

    boolean flag(String key) {
        Object value = json.get(key);
        if (!(value instanceof Boolean)) {
            throw value == null ? missing(key, "true or false") : wrong(key, value, "true or false");
        }
        return (Boolean) value;
    }

    long whole(String key) {
        return whole(json, key, key);
    }

    long whole(Map<String, Object> in, String key, String where) {
        Object value = in.get(key);
        if (!(value instanceof Long)) {
            throw value == null ? missing(where, "a whole number") : wrong(where, value, "a whole number");
        }
        return (Long) value;
    }

    long count(String key) {
        long value = whole(key);
        if (value < 0) {
            throw wrong(key, value, "a count (0 or more)");
        }
        return value;
    }

    /** A count, or −1 where the key holds null (not known, as for a failed analysis). */
    long optionalCount(Map<String, Object> in, String key, String where) {
        if (!in.containsKey(key)) {
            throw missing(where, "a count or null");
        }
        if (in.get(key) == null) {
            return -1;
        }
        long value = whole(in, key, where);
        if (value < 0) {
            throw wrong(where, value, "a count (0 or more)");
        }
        return value;
    }

    /** A number; JSON null (how a non-finite number is written) reads as NaN. */
    double number(Map<String, Object> in, String key, String where) {
        if (!in.containsKey(key)) {
            throw missing(where, "a number");
        }
        Object value = in.get(key);
        if (value == null) {
            return Double.NaN;
        }
        if (!(value instanceof Number)) {
            throw wrong(where, value, "a number");
        }
        return ((Number) value).doubleValue();
    }

    @SuppressWarnings("unchecked")
    Map<String, Object> object(Map<String, Object> in, String key, String where) {
        Object value = in.get(key);
        if (!(value instanceof Map)) {
            throw value == null ? missing(where, "an object") : wrong(where, value, "an object");
        }
        return (Map<String, Object>) value;
    }

    @SuppressWarnings("unchecked")
    List<Object> list(Map<String, Object> in, String key, String where) {
        Object value = in.get(key);
        if (!(value instanceof List)) {
            throw value == null ? missing(where, "a list") : wrong(where, value, "a list");
        }
        return (List<Object>) value;
    }

    ReportInputException missing(String key, String what) {
        return new ReportInputException(file + ": key " + key + " is missing (expected " + what + ")");
    }

    ReportInputException wrong(String key, Object value, String what) {
        return new ReportInputException(file + ": key " + key + " is " + value + ", expected " + what);
    }
}
