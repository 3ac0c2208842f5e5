package org.skerry.cli;

import java.io.File;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/** Starts the skerry program in a separate JVM with this JVM's class path and Spark's module options. */
public final class ProgramProcess {

    private ProgramProcess() {
    }

    /** Starts {@code skerry args…}, standard output and error both going to {@code log}. */
    public static Process start(Path log, String... args) throws IOException {
        return start(log, List.of(), args);
    }

    /**
     * As {@link #start(Path, String...)} with {@code extraClassPath} after this JVM's class path,
     * as {@code bin/skerry} puts {@code SKERRY_CLASSPATH} after its own jars.
     */
    public static Process start(Path log, List<Path> extraClassPath, String... args) throws IOException {
        List<String> command = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString()));
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
        return new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(log.toFile()).start();
    }
}
