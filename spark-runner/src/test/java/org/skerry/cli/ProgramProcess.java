package org.skerry.cli;

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
        List<String> command = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString()));
        // The module options Spark needs (surefire's argLine gives them to this JVM; the launcher to the program).
        for (String option : ManagementFactory.getRuntimeMXBean().getInputArguments()) {
            if (option.startsWith("--add-") || option.startsWith("-XX:+IgnoreUnrecognized") || option.startsWith("-Dio.netty")
                    || option.startsWith("-Djdk.reflect") || option.startsWith("--enable-native")) {
                command.add(option);
            }
        }
        command.addAll(List.of("-Xmx768m", "-cp", System.getProperty("java.class.path"), SkerryCommand.class.getName()));
        command.addAll(List.of(args));
        return new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(log.toFile()).start();
    }
}
