package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.util.DefaultIndenter;
import com.fasterxml.jackson.core.util.DefaultPrettyPrinter;
import com.fasterxml.jackson.core.util.Separators;
import java.io.IOException;
import java.io.OutputStream;

/**
 * The one JSON layout of the run outputs: two-space indents, {@code "key": value}, and {@code \n}
 * line ends whatever the platform, so equal content gives equal bytes everywhere; doubles go
 * through {@link DoubleText}, non-finite ones as null.
 */
final class JsonOutput {

    private static final JsonFactory FACTORY = new JsonFactory();

    private JsonOutput() {
    }

    static JsonGenerator open(OutputStream out) throws IOException {
        DefaultIndenter indenter = new DefaultIndenter("  ", "\n");
        Separators separators = Separators.createDefaultInstance()
                .withObjectFieldValueSpacing(Separators.Spacing.AFTER)
                .withObjectEmptySeparator("")
                .withArrayEmptySeparator("");
        DefaultPrettyPrinter printer = new DefaultPrettyPrinter(separators)
                .withObjectIndenter(indenter)
                .withArrayIndenter(indenter);
        JsonGenerator generator = FACTORY.createGenerator(out, JsonEncoding.UTF8);
        generator.setPrettyPrinter(printer);
        return generator;
    }

    /** Ends the document with a line break, as text files should. */
    static void close(JsonGenerator generator) throws IOException {
        generator.writeRaw('\n');
        generator.close();
    }

    static void number(JsonGenerator generator, String field, double value) throws IOException {
        generator.writeFieldName(field);
        number(generator, value);
    }

    static void number(JsonGenerator generator, double value) throws IOException {
        if (DoubleText.isWritableAsJsonNumber(value)) {
            generator.writeNumber(DoubleText.format(value));
        } else {
            generator.writeNull();
        }
    }

    static void text(JsonGenerator generator, String field, String value) throws IOException {
        if (value == null) {
            generator.writeNullField(field);
        } else {
            generator.writeStringField(field, value);
        }
    }
}
