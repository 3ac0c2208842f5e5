package org.skerry.engine.process;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;

/**
 * The last bytes a stream produced, kept in a ring of fixed size while a daemon thread drains the
 * stream: a program's standard error can be any length, but the reason an evaluation failed needs
 * only its end. Draining also keeps a chatty program from blocking on a full pipe.
 */
public final class OutputTail {

    private final byte[] ring;
    private long written;
    private final Thread drain;

    private OutputTail(int capacity, InputStream in, String name) {
        this.ring = new byte[capacity];
        this.drain = new Thread(() -> drain(in), name);
        drain.setDaemon(true);
    }

    /** Starts draining {@code in} on its own daemon thread, keeping its last {@code capacity} bytes. */
    public static OutputTail drain(InputStream in, int capacity, String threadName) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be >= 1, was " + capacity);
        }
        OutputTail tail = new OutputTail(capacity, in, threadName);
        tail.drain.start();
        return tail;
    }

    private void drain(InputStream in) {
        byte[] buffer = new byte[4096];
        try (in) {
            for (int n; (n = in.read(buffer)) >= 0;) {
                append(buffer, n);
            }
        } catch (IOException e) {
            // the process ended or was killed: what arrived is kept
        }
    }

    private synchronized void append(byte[] buffer, int n) {
        for (int i = 0; i < n; i++) {
            ring[(int) (written++ % ring.length)] = buffer[i];
        }
    }

    /** Waits up to {@code millis} for the stream to end (the process has exited), so the tail is complete. */
    public void awaitEnd(long millis) {
        try {
            drain.join(millis);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /**
     * The kept text, from the first whole line when the start was cut off, trimmed; empty when the
     * stream gave nothing.
     */
    public synchronized String text() {
        int kept = (int) Math.min(written, ring.length);
        byte[] bytes = new byte[kept];
        long start = written - kept;
        for (int i = 0; i < kept; i++) {
            bytes[i] = ring[(int) ((start + i) % ring.length)];
        }
        String text = new String(bytes, StandardCharsets.UTF_8);
        if (start > 0) {
            int newline = text.indexOf('\n');
            text = "…" + (newline >= 0 && newline < text.length() - 1 ? text.substring(newline + 1) : text);
        }
        return text.strip();
    }
}
