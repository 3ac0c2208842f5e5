package org.skerry.cli;

import java.io.File;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/** Starts the skerry program in a separate JVM with this JVM's class path and Spark's module options. */
public final class ProgramProcess {

    private static Boolean envResetsSignals;

    private ProgramProcess() {
    }

    /** Starts {@code skerry args…}, standard output and error both going to {@code log}. */
    public static Process start(Path log, String... args) throws IOException {
        return start(Path.of(System.getProperty("java.home")), log, List.of(), args);
    }

    /**
     * As {@link #start(Path, String...)} with {@code extraClassPath} after this JVM's class path,
     * as {@code bin/skerry} puts {@code SKERRY_CLASSPATH} after its own jars.
     */
    public static Process start(Path log, List<Path> extraClassPath, String... args) throws IOException {
        return start(Path.of(System.getProperty("java.home")), log, extraClassPath, args);
    }

    /** As {@link #start(Path, String...)}, on the Java installed in {@code javaHome}. */
    public static Process start(Path javaHome, Path log, String... args) throws IOException {
        return start(javaHome, log, List.of(), args);
    }

    private static Process start(Path javaHome, Path log, List<Path> extraClassPath, String... args)
            throws IOException {
        return new ProcessBuilder(command(javaHome, extraClassPath, args)).redirectErrorStream(true)
                .redirectOutput(log.toFile()).start();
    }

    /**
     * As {@link #start(Path, String...)}, with SIGINT at its default disposition, as in a terminal
     * where Ctrl-C reaches the program: a process inherits an ignored SIGINT (a JVM started from a
     * background job of a non-interactive shell has one), and the JVM then never installs a
     * handler for it. {@code env --default-signal=INT} (GNU coreutils 8.31 and newer) resets it.
     */
    public static Process startInterruptible(Path log, String... args) throws IOException {
        List<String> command = command(Path.of(System.getProperty("java.home")), List.of(), args);
        if (envResetsSignals()) {
            command.addAll(0, List.of("env", "--default-signal=INT"));
        }
        return new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(log.toFile()).start();
    }

    /** Whether {@code process} ignores SIGINT (read from /proc; true where that cannot be read). */
    public static boolean ignoresInterrupt(Process process) throws IOException {
        return interruptIgnoredIn(Path.of("/proc", Long.toString(process.pid()), "status"));
    }

    /** Whether the process whose /proc status file is {@code status} ignores SIGINT (true where it cannot be read). */
    public static boolean interruptIgnoredIn(Path status) throws IOException {
        if (!Files.isReadable(status)) {
            return true;
        }
        for (String line : Files.readAllLines(status)) {
            if (line.startsWith("SigIgn:")) {
                return (Long.parseUnsignedLong(line.substring(7).trim(), 16) & 2) != 0;
            }
        }
        return true;
    }

    /** Sends {@code signal} ("INT", "TERM" …) to {@code process} with kill(1). */
    public static void signal(Process process, String signal) throws IOException, InterruptedException {
        Process kill = new ProcessBuilder("kill", "-" + signal, Long.toString(process.pid())).inheritIO().start();
        if (!kill.waitFor(10, TimeUnit.SECONDS) || kill.exitValue() != 0) {
            throw new IOException("kill -" + signal + " " + process.pid() + " failed");
        }
    }

    private static synchronized boolean envResetsSignals() {
        if (envResetsSignals == null) {
            try {
                Process probe = new ProcessBuilder("env", "--default-signal=INT", "true").redirectErrorStream(true).start();
                envResetsSignals = probe.waitFor(10, TimeUnit.SECONDS) && probe.exitValue() == 0;
            } catch (IOException | InterruptedException e) {
                envResetsSignals = false;
            }
        }
        return envResetsSignals;
    }

    private static List<String> command(Path javaHome, List<Path> extraClassPath, String... args) {
        List<String> command = new ArrayList<>(List.of(javaHome.resolve("bin").resolve("java").toString()));
        // The module options Spark needs (surefire's argLine gives them to this JVM; the launcher to the program).
        for (String option : ManagementFactory.getRuntimeMXBean().getInputArguments()) {
            if (option.startsWith("--add-") || option.startsWith("-XX:+IgnoreUnrecognized") || option.startsWith("-Dio.netty")
                    || option.startsWith("-Djdk.reflect") || option.startsWith("--enable-native")) {
                command.add(option);
            }
        }
        StringBuilder classPath = new StringBuilder(System.getProperty("java.class.path"));
        for (Path entry : extraClassPath) {
            classPath.append(File.pathSeparator).append(entry);
        }
        command.addAll(List.of("-Xmx768m", "-cp", classPath.toString(), SkerryCommand.class.getName()));
        command.addAll(List.of(args));
        return command;
    }
}
