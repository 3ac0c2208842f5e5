package org.skerry.engine.program;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.ScheduledThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import org.skerry.engine.process.ChildEnvironment;
import org.skerry.engine.process.ChildProcess;

/**
 * One long-lived worker process and the conversation with it ({@link WorkerProtocol}): the start
 * message and the worker's ready line, then requests and replies. A request has a deadline; a
 * watchdog that looks at every worker 20 times a second kills the process tree of one past its
 * deadline, which ends the read in progress. (A timer task per request would cost a wake-up of
 * the timer thread per request, measurable at a millisecond an evaluation.) Any
 * breach of the protocol, an exit, a crash or a timeout leaves the worker broken: it is killed and
 * never used again, and the particles of the request in progress fail with a reason that ends
 * with the worker's standard-error tail. Used by one thread at a time.
 */
final class Worker implements AutoCloseable {

    private static final int MAX_LINE = 1 << 20;
    /** How long a worker may take to exit after its input closes before it is killed. */
    private static final long STOP_GRACE_MILLIS = 2000;
    private static final long WATCH_MILLIS = 50;
    /** The workers whose deadlines the watchdog checks. */
    private static final java.util.Set<Worker> WATCHED = java.util.concurrent.ConcurrentHashMap.newKeySet();
    private static final ScheduledExecutorService TIMER = timer();

    private final ChildProcess child;
    private final OutputStream in;
    private final LineReader out;
    private final Path folder;
    private final String label;
    private final Duration timeout;
    /** The summary names when the worker replies with summaries, else empty (one log-likelihood). */
    private final java.util.List<String> summaries;
    private final StringBuilder request = new StringBuilder(256);
    private long requests;
    /** The current request's deadline ({@link System#nanoTime}), checked while {@link #armed}. */
    private volatile long deadline;
    private volatile boolean armed;
    private volatile boolean timedOut;
    private boolean broken;

    private Worker(ChildProcess child, Path folder, String label, Duration timeout, java.util.List<String> summaries) {
        this.child = child;
        this.in = new BufferedOutputStream(child.stdin(), 1 << 16);
        this.out = new LineReader(child.stdout(), MAX_LINE);
        this.folder = folder;
        this.label = label;
        this.timeout = timeout;
        this.summaries = summaries;
    }

    /**
     * Starts worker {@code number} in {@code folder} (its scratch folder, which it owns from now
     * on) and completes the handshake.
     *
     * @throws ProgramStartException when the program cannot be started or does not say it is ready
     */
    static Worker start(ProgramSettings settings, int number, Path folder) {
        String command = String.join(" ", settings.command());
        ChildProcess child;
        try {
            child = ChildProcess.start(settings.command(), ChildEnvironment.of(settings.environment(), folder), folder,
                    false);
        } catch (IOException e) {
            ScratchFolders.remove(folder);
            throw new ProgramStartException("cannot start the model program " + command + ": " + e.getMessage());
        }
        Worker worker = new Worker(child, folder, "worker " + number + " (" + child.label() + ")", settings.timeout(),
                settings.summaries());
        worker.handshake(settings);
        return worker;
    }

    private void handshake(ProgramSettings settings) {
        WATCHED.add(this);
        arm(settings.startTimeout());
        String line;
        try {
            String kind = settings.simulatesSummaries() ? WorkerProtocol.REPLY_SUMMARIES
                    : WorkerProtocol.REPLY_LOG_LIKELIHOOD;
            in.write(WorkerProtocol.start(settings.names(), settings.files(), kind, settings.summaries())
                    .getBytes(StandardCharsets.UTF_8));
            in.flush();
            line = out.readLine();
        } catch (IOException e) {
            line = null;
        } finally {
            armed = false;
        }
        if (WorkerProtocol.ready().equals(line)) {
            return;
        }
        String why;
        if (timedOut) {
            why = "it did not say it was ready within " + describe(settings.startTimeout());
        } else if (line == null) {
            Integer status = child.waitFor(1000);
            why = "it " + (status == null ? "closed its output" : "exited with status " + status)
                    + " before saying it was ready";
        } else if (line.startsWith("ready ")) {
            why = "it speaks protocol version " + line.substring(6).strip() + "; this skerry speaks version "
                    + WorkerProtocol.VERSION + " (update the worker library, or the program)";
        } else {
            why = "its first line was '" + abbreviate(line) + "', not '" + WorkerProtocol.ready()
                    + "' (a worker writes only protocol lines to standard output; print anything else to standard error)";
        }
        kill();
        ScratchFolders.remove(folder);
        String tail = child.stderrTail();
        throw new ProgramStartException("the model program " + String.join(" ", settings.command())
                + " did not start as a worker: " + why
                + (tail.isEmpty() ? " (it wrote nothing to standard error)" : "; its standard error ended with:\n" + tail));
    }

    /**
     * Evaluates vectors {@code from … from+count−1} of {@code values} (dimension {@code d}) with
     * their {@code seeds} in one request. Each particle's result goes to {@code results[i]}, or
     * NaN with the worker's error text in {@code errors[i]}; a worker replying with s summaries
     * writes them to {@code results[i·s … i·s+s−1]}.
     *
     * @throws ProgramFailureException when the conversation broke; the worker is then killed
     */
    void evaluate(double[] values, int d, int from, int count, long[] seeds, int iteration, double[] results,
            String[] errors) {
        if (broken) {
            throw new IllegalStateException(label + " is broken");
        }
        long number = ++requests;
        request.setLength(0);
        WorkerProtocol.request(request, number, iteration, values, d, from, count, seeds);
        arm(timeout);
        try {
            in.write(request.toString().getBytes(StandardCharsets.US_ASCII));
            in.flush();
            String header = out.readLine();
            String expected = WorkerProtocol.resultHeader(number, count);
            if (!expected.equals(header)) {
                throw broke(header == null ? null : "its reply began '" + abbreviate(header) + "', not '" + expected
                        + "'");
            }
            for (int i = from; i < from + count; i++) {
                String line = out.readLine();
                if (line == null) {
                    throw broke(null);
                }
                if (line.startsWith("value ") && !summaries.isEmpty()) {
                    readSummaries(line, i, results, errors);
                } else if (line.startsWith("value ")) {
                    try {
                        results[i] = WireNumbers.parse(line.substring(6));
                        errors[i] = null;
                    } catch (NumberFormatException e) {
                        results[i] = Double.NaN;
                        errors[i] = label + ": its reply for the particle was '" + abbreviate(line)
                                + "', which is not a number" + tail();
                    }
                } else if (line.startsWith("error")) {
                    int width = Math.max(1, summaries.size());
                    java.util.Arrays.fill(results, i * width, i * width + width, Double.NaN);
                    String text = line.length() > 6 ? line.substring(6).strip() : "";
                    errors[i] = "the model program reported an error: " + (text.isEmpty() ? "(no text)" : text);
                } else {
                    throw broke("its reply line for particle " + (i - from + 1) + " of " + count + " was '"
                            + abbreviate(line) + "', neither 'value NUMBER' nor 'error TEXT'");
                }
            }
        } catch (IOException e) {
            throw broke(null);
        } finally {
            armed = false;
        }
    }

    /**
     * Reads a summaries reply line into particle {@code i}'s slots: as many numbers as summaries,
     * or the particle's simulation is invalid with a reason naming the counts (the worker goes on).
     */
    private void readSummaries(String line, int i, double[] results, String[] errors) {
        int s = summaries.size();
        String[] fields = line.substring(6).strip().split(" +");
        errors[i] = null;
        if (fields.length != s) {
            java.util.Arrays.fill(results, i * s, i * s + s, Double.NaN);
            errors[i] = label + ": its reply for the particle carried " + fields.length + " number"
                    + (fields.length == 1 ? "" : "s") + " ('" + abbreviate(line) + "'), but " + ProgramSimulator.WRONG_COUNT + " "
                    + s + " " + summaries;
            return;
        }
        for (int k = 0; k < s; k++) {
            try {
                results[i * s + k] = WireNumbers.parse(fields[k]);
            } catch (NumberFormatException e) {
                java.util.Arrays.fill(results, i * s, i * s + s, Double.NaN);
                errors[i] = label + ": its reply for summary '" + summaries.get(k) + "' was '" + abbreviate(fields[k])
                        + "', which is not a number" + tail();
                return;
            }
        }
    }

    private void arm(Duration limit) {
        deadline = System.nanoTime() + limit.toNanos();
        armed = true;
    }

    /** The watchdog's round: kills every worker past its deadline. */
    private static void expireOverdue() {
        long now = System.nanoTime();
        for (Worker worker : WATCHED) {
            if (worker.armed && now - worker.deadline >= 0) {
                worker.armed = false;
                worker.expire();
            }
        }
    }

    /** Marks the worker broken, kills it and says why, with its standard-error tail. */
    private ProgramFailureException broke(String protocolProblem) {
        broken = true;
        boolean expired = timedOut;
        String why;
        String tail;
        if (expired || protocolProblem != null) {
            kill();
            why = expired ? "no reply within " + describe(timeout) + " (the timeout); its process tree was killed"
                    : protocolProblem + "; it was stopped";
            tail = tail();
        } else {
            // Its output ended: read the exit status and the standard error before killing what is
            // left, because killing closes the error stream and drops whatever was not yet read.
            Integer status = child.waitFor(1000);
            why = status == null ? "its output ended" : exitDescription(status);
            tail = tail();
            kill();
        }
        return new ProgramFailureException(label + ": " + why + tail);
    }

    private static String exitDescription(int status) {
        if (status > 128 && status < 160) {
            return "it was killed by signal " + (status - 128) + " during the evaluation";
        }
        return "it exited with status " + status + " during the evaluation";
    }

    private String tail() {
        String tail = child.stderrTail();
        if (tail.isEmpty()) {
            return " (nothing on its standard error)";
        }
        String flat = tail.replace("\r", "").replace('\n', '|');
        if (flat.length() > 1000) {
            flat = "…" + flat.substring(flat.length() - 1000);
        }
        return "; its standard error ended with: " + flat;
    }

    private void expire() {
        timedOut = true;
        child.kill();
    }

    /** Whether the worker can take another request. */
    boolean usable() {
        return !broken && child.isAlive();
    }

    /** Kills the worker's process tree at once. */
    void kill() {
        broken = true;
        WATCHED.remove(this);
        child.kill();
    }

    /** Ends the worker politely (its input closes), then removes its scratch folder. */
    @Override
    public void close() {
        WATCHED.remove(this);
        if (child.isAlive()) {
            child.stop(STOP_GRACE_MILLIS);
        }
        ScratchFolders.remove(folder);
    }

    private static String abbreviate(String line) {
        return line.length() > 200 ? line.substring(0, 200) + "…" : line;
    }

    static String describe(Duration duration) {
        long millis = duration.toMillis();
        return millis % 1000 == 0 ? millis / 1000 + " s" : millis + " ms";
    }

    private static ScheduledExecutorService timer() {
        ScheduledThreadPoolExecutor timer = new ScheduledThreadPoolExecutor(1, task -> {
            Thread thread = new Thread(task, "skerry-worker-timeouts");
            thread.setDaemon(true);
            return thread;
        });
        timer.scheduleWithFixedDelay(Worker::expireOverdue, WATCH_MILLIS, WATCH_MILLIS, TimeUnit.MILLISECONDS);
        return timer;
    }
}
