package org.skerry.cli.output;

import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.QuoteMode;

/**
 * The one CSV layout of the run outputs: comma-separated, a header row, {@code \n} line ends
 * whatever the platform, fields quoted (RFC 4180 style) only when they need it, and an absent
 * value as an empty field.
 */
final class CsvOutput {

    private CsvOutput() {
    }

    static CSVFormat withHeader(String... columns) {
        return CSVFormat.DEFAULT.builder()
                .setHeader(columns)
                .setRecordSeparator("\n")
                .setQuoteMode(QuoteMode.MINIMAL)
                .setNullString(null)
                .get();
    }
}
