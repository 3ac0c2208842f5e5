package org.skerry.engine.process;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.concurrent.TimeUnit;

/**
 * A user's program running as a child of this JVM: started from an argument list (never a shell
 * string) with exactly the environment and working folder given, its standard error drained into a
 * bounded {@link OutputTail}, and stopped by killing its whole process tree. Every child is
 * started by {@link ProcessLauncher}, which also kills whatever is left when the JVM ends.
 *
 * <p>Thread-safe: {@link #kill} may come from a timer thread while another thread reads the
 * child's output (the read then ends at end of stream).
 */
public final class ChildProcess implements AutoCloseable {

    /** How many bytes of standard error are kept for messages. */
    public static final int TAIL_BYTES = 4096;

    private final Process process;
    private final OutputTail stderr;
    private final String label;
    private volatile boolean killed;

    private ChildProcess(Process process, OutputTail stderr, String label) {
        this.process = process;
        this.stderr = stderr;
        this.label = label;
    }

    /**
     * Starts {@code argv} in {@code folder} with {@code environment} (the complete environment).
     * The program name is looked up on the environment's PATH first, so a missing program is
     * reported by name rather than as an exit status.
     *
     * @param mergeStderr send standard error into standard output (a file-mode program, whose
     *     output is all diagnostics) instead of keeping its tail separately
     * @throws IOException naming the program when it cannot be found or started
     */
    public static ChildProcess start(List<String> argv, Map<String, String> environment, Path folder,
            boolean mergeStderr) throws IOException {
        Objects.requireNonNull(argv, "argv");
        if (argv.isEmpty()) {
            throw new IllegalArgumentException("argv must name a program");
        }
        List<String> resolved = new ArrayList<>(argv);
        resolved.set(0, ProcessLauncher.resolveExecutable(argv.get(0), environment.get("PATH")).toString());
        Process process = ProcessLauncher.start(resolved, environment, folder, mergeStderr);
        String label = String.join(" ", argv) + " (pid " + process.pid() + ")";
        OutputTail tail = OutputTail.drain(mergeStderr ? process.getInputStream() : process.getErrorStream(),
                TAIL_BYTES, "skerry-stderr-" + process.pid());
        ChildProcess child = new ChildProcess(process, tail, label);
        ProcessLauncher.register(child);
        process.onExit().thenRun(() -> ProcessLauncher.unregister(child));
        return child;
    }

    /** The program's standard input. */
    public OutputStream stdin() {
        return process.getOutputStream();
    }

    /** The program's standard output (unless merged into the tail). */
    public InputStream stdout() {
        return process.getInputStream();
    }

    /** The command and process id, for messages. */
    public String label() {
        return label;
    }

    public long pid() {
        return process.pid();
    }

    public boolean isAlive() {
        return process.isAlive();
    }

    /** Whether {@link #kill} was called. */
    public boolean wasKilled() {
        return killed;
    }

    /** The end of what the program wrote to standard error (complete once it has exited). */
    public String stderrTail() {
        if (!process.isAlive()) {
            stderr.awaitEnd(1000);
        }
        return stderr.text();
    }

    /** Waits up to {@code millis} for the program to exit; its exit status, or null if it still runs. */
    public Integer waitFor(long millis) {
        try {
            return process.waitFor(millis, TimeUnit.MILLISECONDS) ? process.exitValue() : null;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return process.isAlive() ? null : process.exitValue();
        }
    }

    /** The exit status, or null while it runs. */
    public Integer exitStatus() {
        return process.isAlive() ? null : process.exitValue();
    }

    /**
     * Kills the program and every process it started (SIGKILL on Unix), and waits briefly for it
     * to be gone. The tree is listed before the program is killed, since its children are handed
     * to another parent as soon as it dies.
     */
    public void kill() {
        killed = true;
        List<ProcessHandle> tree = new ArrayList<>();
        try {
            process.descendants().forEach(tree::add);
        } catch (RuntimeException e) {
            // a process table we cannot read: the program itself is still killed
        }
        // Through the handle, not Process.destroyForcibly: that also closes the streams, and the
        // standard error's last lines, written just before, could be dropped before they were read.
        process.toHandle().destroyForcibly();
        for (ProcessHandle descendant : tree) {
            descendant.destroyForcibly();
        }
        waitFor(5000);
        stderr.awaitEnd(1000);
        closeQuietly(process.getOutputStream());
        closeQuietly(process.getInputStream());
        closeQuietly(process.getErrorStream());
        ProcessLauncher.unregister(this);
    }

    /**
     * Ends the program politely: closes its standard input (a worker exits on end of input), waits
     * up to {@code graceMillis}, then kills whatever of its tree is left.
     */
    public void stop(long graceMillis) {
        List<ProcessHandle> tree = new ArrayList<>();
        try {
            process.descendants().forEach(tree::add);
        } catch (RuntimeException e) {
            // nothing to add
        }
        try {
            process.getOutputStream().close();
        } catch (IOException e) {
            // already closed: the program has gone
        }
        if (waitFor(graceMillis) == null) {
            kill();
        }
        for (ProcessHandle descendant : tree) {
            if (descendant.isAlive()) {
                descendant.destroyForcibly();
            }
        }
        ProcessLauncher.unregister(this);
    }

    @Override
    public void close() {
        kill();
    }

    private static void closeQuietly(java.io.Closeable stream) {
        try {
            stream.close();
        } catch (java.io.IOException e) {
            // the program is gone; nothing more can be read or written
        }
    }
}
