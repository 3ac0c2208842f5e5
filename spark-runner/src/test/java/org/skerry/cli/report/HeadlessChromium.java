package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.TimeUnit;

/**
 * Runs Chromium headless as a process, with an argument list and a fresh profile folder per call.
 * A call that outlives {@link #TIMEOUT_SECONDS} is killed with its children, and so is one whose
 * wait is interrupted: a browser left behind would hold the shared machine's memory.
 */
final class HeadlessChromium {

    /** Generous: a cold start takes 4–5 s on our loaded 2-core machine. */
    static final long TIMEOUT_SECONDS = 120;

    /** What one call left: its exit status, what it printed on stdout, and its log (stderr). */
    record Result(int exitCode, String out, String log) {
    }

    /**
     * Quiet and self-contained: no sandbox (CI runs as root in a container), no GPU, and none of
     * the browser's own background traffic (sign-in, updates), which would otherwise put network
     * errors in the log that have nothing to do with the page.
     */
    private static final List<String> COMMON = List.of("--headless", "--no-sandbox", "--disable-gpu",
            "--disable-dev-shm-usage", "--disable-background-networking", "--disable-sync",
            "--disable-component-update", "--disable-default-apps", "--no-first-run", "--hide-scrollbars");

    private final Path executable;
    private final Path scratch;

    HeadlessChromium(Path executable, Path scratch) {
        this.executable = Objects.requireNonNull(executable, "executable");
        this.scratch = Objects.requireNonNull(scratch, "scratch");
    }

    /** A screenshot of {@code page} at 1200 × 2400 CSS pixels, with the browser's log at verbosity 1. */
    Result screenshot(URI page, Path png) throws IOException, InterruptedException {
        return run(List.of("--enable-logging=stderr", "--v=1", "--window-size=1200,2400",
                "--screenshot=" + png.toAbsolutePath(), page.toString()));
    }

    /**
     * The DOM of {@code page} after its load event, as the browser serialises it. File pages may
     * read other file pages here: the probe page looks into the report page in its frame.
     */
    Result dumpDom(URI page) throws IOException, InterruptedException {
        return run(List.of("--allow-file-access-from-files", "--dump-dom", page.toString()));
    }

    private Result run(List<String> arguments) throws IOException, InterruptedException {
        Path call = Files.createTempDirectory(scratch, "chromium-");
        List<String> command = new ArrayList<>();
        command.add(executable.toString());
        command.addAll(COMMON);
        command.add("--user-data-dir=" + call.resolve("profile"));
        command.addAll(arguments);
        Path out = call.resolve("stdout.txt");
        Path log = call.resolve("stderr.txt");
        Process process = new ProcessBuilder(command).directory(call.toFile())
                .redirectOutput(out.toFile()).redirectError(log.toFile()).start();
        boolean finished = false;
        try {
            finished = process.waitFor(TIMEOUT_SECONDS, TimeUnit.SECONDS);
        } finally {
            if (!finished) {
                kill(process);
            }
        }
        if (!finished) {
            fail("the browser ran past " + TIMEOUT_SECONDS + " s and was killed: " + command + "\nlog tail: "
                    + tail(Files.readString(log)));
        }
        return new Result(process.exitValue(), Files.readString(out), Files.readString(log));
    }

    /** Children first: once the launcher is gone they are no longer its descendants to find. */
    private static void kill(Process process) throws InterruptedException {
        process.descendants().forEach(ProcessHandle::destroyForcibly);
        process.destroyForcibly();
        process.waitFor(10, TimeUnit.SECONDS);
    }

    static String tail(String text) {
        return text.length() <= 4000 ? text : "…" + text.substring(text.length() - 4000);
    }
}
