package org.skerry.clustertests;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;

/**
 * Runs commands as argument lists (never through a shell string), bounded in time, and finds
 * processes left behind by the marker on their command line, so each test can prove it stopped
 * everything it started.
 */
final class Processes {

    /** What a finished command gave: its exit code and its standard output and error together. */
    record Result(int exitCode, String output) {
    }

    private Processes() {
    }

    /** The repository root (set by the pom; the module folder's parent). */
    static Path root() {
        return Path.of(System.getProperty("skerry.root", "..")).toAbsolutePath().normalize();
    }

    /**
     * Runs {@code command} in {@code dir} with {@code environment} added, output to {@code log};
     * kills it and its descendants when it runs past {@code limit}.
     */
    static Result run(List<String> command, Path dir, Map<String, String> environment, Path log, Duration limit)
            throws IOException, InterruptedException {
        ProcessBuilder builder = new ProcessBuilder(command).directory(dir.toFile()).redirectErrorStream(true)
                .redirectOutput(log.toFile());
        builder.environment().putAll(environment);
        Process process = builder.start();
        if (!process.waitFor(limit.toMillis(), TimeUnit.MILLISECONDS)) {
            kill(process.toHandle());
            throw new AssertionError(String.join(" ", command) + " ran past " + limit.toSeconds() + " s; its output:\n"
                    + tail(log));
        }
        return new Result(process.exitValue(), Files.readString(log, StandardCharsets.UTF_8));
    }

    /**
     * {@link #run} on a thread of its own, for work a test overlaps with a wait (a reference run
     * while daemons come up); {@code join()} gives the result or the failure.
     */
    static CompletableFuture<Result> runInBackground(List<String> command, Path dir, Map<String, String> environment,
            Path log, Duration limit) {
        CompletableFuture<Result> result = new CompletableFuture<>();
        Thread thread = new Thread(() -> {
            try {
                result.complete(run(command, dir, environment, log, limit));
            } catch (Throwable e) {
                result.completeExceptionally(e);
            }
        }, "background " + log.getFileName());
        thread.setDaemon(true);
        thread.start();
        return result;
    }

    /** TERM, then KILL after 10 s, to {@code process} and everything below it. */
    static void kill(ProcessHandle process) throws InterruptedException {
        List<ProcessHandle> all = new ArrayList<>(process.descendants().toList());
        all.add(process);
        all.forEach(ProcessHandle::destroy);
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (all.stream().anyMatch(ProcessHandle::isAlive) && System.nanoTime() < deadline) {
            Thread.sleep(100);
        }
        all.forEach(ProcessHandle::destroyForcibly);
    }

    /** Processes alive now whose command line or environment-free argv holds {@code marker}. */
    static List<String> carrying(String marker) {
        List<String> found = new ArrayList<>();
        long self = ProcessHandle.current().pid();
        ProcessHandle.allProcesses().filter(p -> p.pid() != self && p.isAlive()).forEach(p -> {
            String line = commandLine(p.pid());
            if (line.contains(marker)) {
                found.add(p.pid() + " " + line);
            }
        });
        return found;
    }

    /** The command line of process {@code pid}, arguments joined by spaces; empty when gone or unreadable. */
    static String commandLine(long pid) {
        try {
            byte[] raw = Files.readAllBytes(Path.of("/proc", Long.toString(pid), "cmdline"));
            return new String(raw, StandardCharsets.UTF_8).replace('\0', ' ').strip();
        } catch (IOException e) {
            return "";
        }
    }

    /** The last lines of a log, for a failure message. */
    static String tail(Path log) {
        try {
            List<String> lines = Files.readAllLines(log, StandardCharsets.UTF_8);
            return String.join("\n", lines.subList(Math.max(0, lines.size() - 40), lines.size()));
        } catch (IOException e) {
            return "(no log: " + e.getMessage() + ")";
        }
    }
}
