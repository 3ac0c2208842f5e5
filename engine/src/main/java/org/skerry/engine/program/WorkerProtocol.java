package org.skerry.engine.program;

import java.nio.file.Path;
import java.util.List;

/**
 * The worker line protocol, version 1 (docs/program-protocol.md is its full description): lines
 * of UTF-8 text, fields separated by one space, each message ended by a newline.
 *
 * <pre>
 * skerry → worker (start)          worker → skerry
 *   skerry-worker 1                  ready 1
 *   parameters 2 mu sigma
 *   files 1
 *   /abs/path/data.csv
 *   reply log-likelihood           (or: reply summaries
 *   start                                   summaries 2 mean sd)
 *
 * skerry → worker (request)        worker → skerry (reply)
 *   evaluate 7 3 2                   result 7 2
 *   SEED VALUE_1 … VALUE_d           value NUMBER     (one line per particle, in request order)
 *   SEED VALUE_1 … VALUE_d           error TEXT
 *                                    (summaries: value S_1 … S_s, one number per summary)
 * </pre>
 *
 * <p>{@code evaluate REQUEST ITERATION COUNT}: the request number counts from 1 per worker, the
 * iteration is the sampler's, then one line per particle with its seed (an unsigned 64-bit
 * decimal) and its parameter values (C99 hexadecimal, {@link WireNumbers}). The reply repeats the
 * request number and count. {@code reply KIND} names what a value line carries: a log-likelihood,
 * or ({@code reply summaries}, with a {@code summaries COUNT NAME…} line) one number per summary
 * for approximate Bayesian computation. The summaries kind is an addition within version 1: a
 * worker that knows only log-likelihoods refuses it at the start, before the run.
 */
public final class WorkerProtocol {

    /** The protocol version this build speaks. */
    public static final int VERSION = 1;
    /** What a reply value is, in this build: the log-likelihood of the data at the particle. */
    public static final String REPLY_LOG_LIKELIHOOD = "log-likelihood";
    /** What a reply value is for a simulator: its simulated summaries, one number each, in declared order. */
    public static final String REPLY_SUMMARIES = "summaries";

    private WorkerProtocol() {
    }

    /** The start message of a log-likelihood worker: version, parameter names, files, reply kind. */
    public static String start(List<String> names, List<Path> files, String replyKind) {
        return start(names, files, replyKind, List.of());
    }

    /**
     * The start message: version, parameter names, files, reply kind, and for {@link
     * #REPLY_SUMMARIES} the summary names (a line older workers skip as an unknown line).
     */
    public static String start(List<String> names, List<Path> files, String replyKind, List<String> summaries) {
        StringBuilder out = new StringBuilder(64);
        out.append("skerry-worker ").append(VERSION).append('\n');
        out.append("parameters ").append(names.size());
        for (String name : names) {
            out.append(' ').append(name);
        }
        out.append('\n');
        out.append("files ").append(files.size()).append('\n');
        for (Path file : files) {
            out.append(file.toAbsolutePath()).append('\n');
        }
        out.append("reply ").append(replyKind).append('\n');
        if (!summaries.isEmpty()) {
            out.append("summaries ").append(summaries.size());
            for (String name : summaries) {
                out.append(' ').append(name);
            }
            out.append('\n');
        }
        out.append("start\n");
        return out.toString();
    }

    /** The worker's answer to the start message when it speaks this version. */
    public static String ready() {
        return "ready " + VERSION;
    }

    /**
     * Appends the request for vectors {@code from … from+count−1} of {@code values} (dimension
     * {@code d}) with their {@code seeds}.
     */
    public static void request(StringBuilder out, long request, int iteration, double[] values, int d, int from,
            int count, long[] seeds) {
        out.append("evaluate ").append(request).append(' ').append(iteration).append(' ').append(count).append('\n');
        for (int i = from; i < from + count; i++) {
            WireNumbers.appendSeed(out, seeds[i]);
            for (int j = 0; j < d; j++) {
                WireNumbers.appendHex(out.append(' '), values[i * d + j]);
            }
            out.append('\n');
        }
    }

    /** The header a reply to request {@code request} of {@code count} particles starts with. */
    public static String resultHeader(long request, int count) {
        return "result " + request + " " + count;
    }
}
