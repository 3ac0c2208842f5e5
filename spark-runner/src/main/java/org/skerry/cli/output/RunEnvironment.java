package org.skerry.cli.output;

import java.net.InetAddress;
import java.net.UnknownHostException;
import java.time.Instant;

/**
 * Where and when a run happened, for {@code timing.json}: program version, Java version and
 * vendor, host, backend description and start time. Any field but {@code startedAt} may be null
 * when unknown, and is then written as null.
 *
 * @param programVersion this program's version
 * @param javaVersion    the {@code java.version} system property
 * @param javaVendor     the {@code java.vendor} system property
 * @param host           the host name
 * @param backend        a description of the population backend (threads, Spark master …)
 * @param startedAt      when the run started
 */
public record RunEnvironment(String programVersion, String javaVersion, String javaVendor, String host,
        String backend, Instant startedAt) {

    public RunEnvironment {
        if (startedAt == null) {
            throw new IllegalArgumentException("startedAt must not be null");
        }
    }

    /** The environment of this JVM: Java properties and host name looked up here. */
    public static RunEnvironment current(String programVersion, String backend, Instant startedAt) {
        return new RunEnvironment(programVersion, System.getProperty("java.version"),
                System.getProperty("java.vendor"), hostName(), backend, startedAt);
    }

    private static String hostName() {
        // The variables first: asking the resolver can stall on a badly configured machine.
        for (String variable : new String[] {"HOSTNAME", "COMPUTERNAME"}) {
            String value = System.getenv(variable);
            if (value != null && !value.isBlank()) {
                return value.trim();
            }
        }
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (UnknownHostException | SecurityException e) {
            return null;
        }
    }
}
