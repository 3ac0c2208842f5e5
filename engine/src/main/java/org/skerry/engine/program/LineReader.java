package org.skerry.engine.program;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;

/**
 * Reads newline-ended lines of UTF-8 from a program's output without a charset decoder per byte
 * (replies are short and many), refusing lines longer than a limit so a program that writes
 * without newlines cannot exhaust memory. Not thread-safe.
 */
final class LineReader {

    private final InputStream in;
    private final int maxLine;
    private byte[] buffer = new byte[1 << 16];
    private int start;
    private int end;

    LineReader(InputStream in, int maxLine) {
        this.in = in;
        this.maxLine = maxLine;
    }

    /**
     * The next line without its newline (a carriage return before it is dropped too), or null at
     * the end of the stream (a last line without newline is returned first).
     *
     * @throws IOException when the stream fails or a line exceeds the limit
     */
    String readLine() throws IOException {
        int scanned = start;
        while (true) {
            for (int i = scanned; i < end; i++) {
                if (buffer[i] == '\n') {
                    int stop = i > start && buffer[i - 1] == '\r' ? i - 1 : i;
                    String line = new String(buffer, start, stop - start, StandardCharsets.UTF_8);
                    start = i + 1;
                    return line;
                }
            }
            scanned = end;
            if (end - start > maxLine) {
                throw new IOException("a line of more than " + maxLine + " bytes");
            }
            if (end == buffer.length) {
                if (start > 0) {
                    System.arraycopy(buffer, start, buffer, 0, end - start);
                    end -= start;
                    scanned -= start;
                    start = 0;
                } else {
                    buffer = java.util.Arrays.copyOf(buffer, buffer.length * 2);
                }
            }
            int n = in.read(buffer, end, buffer.length - end);
            if (n < 0) {
                if (end > start) {
                    String line = new String(buffer, start, end - start, StandardCharsets.UTF_8);
                    start = end;
                    return line;
                }
                return null;
            }
            end += n;
        }
    }
}
