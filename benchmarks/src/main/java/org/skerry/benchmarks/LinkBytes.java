package org.skerry.benchmarks;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Byte counters of named network interfaces, read from a file in the format of Linux's
 * {@code /proc/net/dev}: with {@code /proc/PID/net/dev} of a process in the root namespace, a
 * driver inside a namespace of its own still sees the bridge ends of every link of the shaped
 * network ({@code deploy/loopback-cluster start --network}). On a bridge end, bytes received are
 * what the node sent, bytes transmitted what it received.
 */
final class LinkBytes {

    private final Path file;
    private final List<String> interfaces;

    LinkBytes(Path file, List<String> interfaces) {
        if (interfaces.isEmpty()) {
            throw new IllegalArgumentException("links: name at least one interface");
        }
        this.file = file;
        this.interfaces = List.copyOf(interfaces);
        read(); // fail fast on a wrong file or name
    }

    /** For each interface: {received, transmitted} bytes since it was created. */
    Map<String, long[]> read() {
        Map<String, long[]> counts = new LinkedHashMap<>();
        try {
            for (String line : Files.readAllLines(file)) {
                int colon = line.indexOf(':');
                if (colon < 0) {
                    continue;
                }
                String name = line.substring(0, colon).strip();
                if (interfaces.contains(name)) {
                    String[] fields = line.substring(colon + 1).strip().split("\\s+");
                    // receive: bytes packets errs drop fifo frame compressed multicast; then transmit: bytes …
                    counts.put(name, new long[] {Long.parseLong(fields[0]), Long.parseLong(fields[8])});
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read interface counters from " + file, e);
        }
        for (String name : interfaces) {
            if (!counts.containsKey(name)) {
                throw new IllegalArgumentException("links: no interface " + name + " in " + file);
            }
        }
        return counts;
    }

    /** One line: megabytes each node sent and received between two readings. */
    static String describe(Map<String, long[]> before, Map<String, long[]> after) {
        StringBuilder line = new StringBuilder("bytes over the links (MB sent / received by the node):");
        for (Map.Entry<String, long[]> entry : after.entrySet()) {
            long[] b = before.get(entry.getKey());
            long[] a = entry.getValue();
            line.append(String.format(Locale.ROOT, " %s %.1f / %.1f;", entry.getKey(), (a[0] - b[0]) / 1e6,
                    (a[1] - b[1]) / 1e6));
        }
        return line.toString();
    }
}
