package org.skerry.cli.report;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads a JSON file into plain values — maps in file order, lists, strings, booleans, numbers
 * as {@code Double} or {@code Long}, and {@code null} — with Jackson's streaming parser, the
 * one the writers use; a syntax error names the file and line.
 */
final class JsonValues {

    private static final JsonFactory FACTORY = new JsonFactory();

    private JsonValues() {
    }

    /** The top-level object of {@code file}. */
    static Map<String, Object> readObject(Path file) {
        try (JsonParser p = FACTORY.createParser(file.toFile())) {
            if (p.nextToken() != JsonToken.START_OBJECT) {
                throw new ReportInputException(file + ": expected a JSON object");
            }
            return object(p);
        } catch (JsonProcessingException e) {
            throw new ReportInputException(file + " line " + e.getLocation().getLineNr() + ": not valid JSON: "
                    + e.getOriginalMessage());
        } catch (IOException e) {
            throw new ReportInputException("cannot read " + file + ": " + e.getMessage(), e);
        }
    }

    private static Map<String, Object> object(JsonParser p) throws IOException {
        Map<String, Object> out = new LinkedHashMap<>();
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String name = p.currentName();
            p.nextToken();
            out.put(name, value(p));
        }
        return Collections.unmodifiableMap(out);
    }

    private static Object value(JsonParser p) throws IOException {
        return switch (p.currentToken()) {
            case START_OBJECT -> object(p);
            case START_ARRAY -> {
                List<Object> list = new ArrayList<>();
                while (p.nextToken() != JsonToken.END_ARRAY) {
                    list.add(value(p));
                }
                yield Collections.unmodifiableList(list);
            }
            case VALUE_STRING -> p.getText();
            case VALUE_NUMBER_INT -> p.getLongValue();
            case VALUE_NUMBER_FLOAT -> p.getDoubleValue();
            case VALUE_TRUE -> Boolean.TRUE;
            case VALUE_FALSE -> Boolean.FALSE;
            default -> null;
        };
    }
}
