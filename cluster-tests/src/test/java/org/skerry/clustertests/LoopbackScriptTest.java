package org.skerry.clustertests;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;

/**
 * deploy/loopback-cluster on a shared machine: Spark's authentication is on with a fresh secret
 * that no other user can read (files of mode 600, not on any command line, not in any log), every
 * port the daemons listen on is bound to a loopback address rather than all interfaces, the REST
 * submission server (which cannot check the secret) is off, and stop leaves no process behind.
 */
@Slow
class LoopbackScriptTest {

    @TempDir
    Path dir;

    private static int freePort() throws IOException {
        try (ServerSocket socket = new ServerSocket(0)) {
            return socket.getLocalPort();
        }
    }

    @Test
    @DisplayName("start: authentication with a secret kept out of process lists and logs, loopback-only listening "
            + "sockets, no REST server; stop: no process left")
    void secretAndBinding() throws Exception {
        Path script = Processes.root().resolve("deploy/loopback-cluster");
        Path cluster = dir.resolve("cluster");
        String marker = "-Dskerry.loopback.dir=" + cluster;
        int rest = freePort();
        List<String> start = List.of("bash", script.toString(), "start", "--dir", cluster.toString(), "--workers", "1",
                "--port", Integer.toString(freePort()), "--ui-port", Integer.toString(freePort()),
                "--rest-port", Integer.toString(rest), "--timeout", "120");
        try {
            Processes.Result started = Processes.run(start, dir, Map.of(), dir.resolve("start.log"), Duration.ofSeconds(180));
            assertEquals(0, started.exitCode(), started.output());

            Path secretFile = cluster.resolve("secret");
            String secret = Files.readString(secretFile, StandardCharsets.UTF_8).strip();
            assertTrue(secret.matches("[0-9a-f]{64}"), "32 random bytes in hex: " + secret.length() + " characters");
            for (Path file : List.of(secretFile, cluster.resolve("auth.properties"))) {
                assertEquals("rw-------", PosixFilePermissions.toString(Files.getPosixFilePermissions(file)), file.toString());
            }
            assertTrue(Files.readString(cluster.resolve("auth.properties")).contains("spark.authenticate=true\n"));

            List<String> daemons = Processes.carrying(marker);
            assertEquals(2, daemons.size(), "master and one worker: " + daemons);
            for (String daemon : daemons) {
                assertTrue(daemon.contains("-Dspark.authenticate=true"), daemon);
            }
            ProcessHandle.allProcesses().forEach(p -> assertFalse(Processes.commandLine(p.pid()).contains(secret),
                    "the secret on the command line of process " + p.pid()));
            assertFalse(started.output().contains(secret), "the secret in start's output");
            try (Stream<Path> files = Files.walk(cluster)) {
                for (Path file : files.filter(Files::isRegularFile).toList()) {
                    if (file.equals(secretFile) || file.getFileName().toString().equals("auth.properties")) {
                        continue;
                    }
                    assertFalse(new String(Files.readAllBytes(file), StandardCharsets.ISO_8859_1).contains(secret),
                            "the secret in " + file);
                }
            }

            List<String> listening = listeningSockets(daemons);
            assertTrue(listening.size() >= 4, "master RPC and UI, worker RPC and UI: " + listening);
            for (String address : listening) {
                assertTrue(address.startsWith("127.") || address.startsWith("[::ffff:127."),
                        "bound to loopback only, not all interfaces: " + address + " of " + listening);
                assertFalse(address.endsWith(":" + rest), "the REST server is off: " + listening);
            }
        } finally {
            Processes.Result stopped = Processes.run(List.of("bash", script.toString(), "stop", "--dir", cluster.toString()),
                    dir, Map.of(), dir.resolve("stop.log"), Duration.ofSeconds(60));
            assertEquals(0, stopped.exitCode(), stopped.output());
        }
        assertEquals(List.of(), Processes.carrying(marker), "processes left behind");
        assertFalse(Files.exists(cluster.resolve("secret")), "stop removes the secret");
    }

    @Test
    @DisplayName("start --no-auth: no secret written, daemons without spark.authenticate, the REST server on its "
            + "loopback port; stop: no process left")
    void withoutAuthentication() throws Exception {
        Path script = Processes.root().resolve("deploy/loopback-cluster");
        Path cluster = dir.resolve("open");
        String marker = "-Dskerry.loopback.dir=" + cluster;
        int rest = freePort();
        try {
            Processes.Result started = Processes.run(List.of("bash", script.toString(), "start", "--no-auth", "--dir",
                    cluster.toString(), "--workers", "1", "--port", Integer.toString(freePort()), "--ui-port",
                    Integer.toString(freePort()), "--rest-port", Integer.toString(rest), "--timeout", "120"), dir, Map.of(),
                    dir.resolve("start-open.log"), Duration.ofSeconds(180));
            assertEquals(0, started.exitCode(), started.output());
            assertTrue(started.output().contains("auth:    OFF"), started.output());
            assertFalse(Files.exists(cluster.resolve("secret")));
            assertFalse(Files.exists(cluster.resolve("auth.properties")));
            List<String> daemons = Processes.carrying(marker);
            assertEquals(2, daemons.size(), daemons.toString());
            daemons.forEach(daemon -> assertFalse(daemon.contains("spark.authenticate"), daemon));
            assertTrue(listeningSockets(daemons).contains("[::ffff:127.0.0.1]:" + rest)
                    || listeningSockets(daemons).contains("127.0.0.1:" + rest), "REST on loopback: "
                    + listeningSockets(daemons));
        } finally {
            Processes.Result stopped = Processes.run(List.of("bash", script.toString(), "stop", "--dir", cluster.toString()),
                    dir, Map.of(), dir.resolve("stop-open.log"), Duration.ofSeconds(60));
            assertEquals(0, stopped.exitCode(), stopped.output());
        }
        assertEquals(List.of(), Processes.carrying(marker), "processes left behind");
    }

    /** The local addresses the given processes (lines "PID command…") listen on, from {@code ss -ltnp}. */
    private List<String> listeningSockets(List<String> processes) throws Exception {
        Processes.Result ss = Processes.run(List.of("ss", "-H", "-ltnp"), dir, Map.of(), dir.resolve("ss.log"),
                Duration.ofSeconds(20));
        assertEquals(0, ss.exitCode(), ss.output());
        List<String> addresses = new ArrayList<>();
        for (String process : processes) {
            String pid = "pid=" + process.substring(0, process.indexOf(' ')) + ",";
            for (String line : ss.output().split("\n")) {
                if (line.contains(pid)) {
                    addresses.add(line.trim().split("\\s+")[3]);
                }
            }
        }
        return addresses;
    }
}
