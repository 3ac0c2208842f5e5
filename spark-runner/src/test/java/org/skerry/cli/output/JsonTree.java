package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads a JSON file with Jackson's own parser into maps (in key order), lists, Double (numbers
 * with a fraction or exponent, parsed by Jackson), Long, Boolean, String and null.
 */
public final class JsonTree {

    private JsonTree() {
    }

    @SuppressWarnings("unchecked")
    public static Map<String, Object> read(Path file) throws IOException {
        try (JsonParser parser = new JsonFactory().createParser(file.toFile())) {
            Object value = value(parser, parser.nextToken());
            if (parser.nextToken() != null) {
                throw new IOException("content after the root value in " + file);
            }
            return (Map<String, Object>) value;
        }
    }

    private static Object value(JsonParser parser, JsonToken token) throws IOException {
        switch (token) {
            case START_OBJECT: {
                Map<String, Object> map = new LinkedHashMap<>();
                for (JsonToken t = parser.nextToken(); t != JsonToken.END_OBJECT; t = parser.nextToken()) {
                    String key = parser.currentName();
                    if (map.containsKey(key)) {
                        throw new IOException("duplicate key " + key);
                    }
                    map.put(key, value(parser, parser.nextToken()));
                }
                return map;
            }
            case START_ARRAY: {
                List<Object> list = new ArrayList<>();
                for (JsonToken t = parser.nextToken(); t != JsonToken.END_ARRAY; t = parser.nextToken()) {
                    list.add(value(parser, t));
                }
                return list;
            }
            case VALUE_NUMBER_FLOAT:
                return parser.getDoubleValue();
            case VALUE_NUMBER_INT:
                return parser.getLongValue();
            case VALUE_STRING:
                return parser.getText();
            case VALUE_TRUE:
                return Boolean.TRUE;
            case VALUE_FALSE:
                return Boolean.FALSE;
            case VALUE_NULL:
                return null;
            default:
                throw new IOException("unexpected " + token);
        }
    }
}
