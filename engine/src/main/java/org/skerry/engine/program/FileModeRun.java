package org.skerry.engine.program;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import org.skerry.engine.process.ChildEnvironment;
import org.skerry.engine.process.ChildProcess;

/**
 * File mode: one run of the program per evaluation, for codes that read an input file and write
 * an output file. Each evaluation gets a fresh scratch folder; the input file is rendered there
 * from the template ({@link InputTemplate}); the program runs there with its argument list; the
 * output file's content (one number: decimal, hexadecimal or {@code -inf}) is the log-likelihood.
 * The folder is removed afterwards, or kept for inspection when the evaluation failed, up to
 * {@code keep-failed} folders per model and JVM. Thread-safe.
 */
final class FileModeRun {

    private static final int MAX_OUTPUT_BYTES = 1 << 16;

    private final ProgramSettings settings;
    private final InputTemplate template;
    private final Path root;
    private final AtomicLong evaluations = new AtomicLong();
    private final AtomicInteger kept = new AtomicInteger();

    FileModeRun(ProgramSettings settings, InputTemplate template, Path root) {
        this.settings = settings;
        this.template = template;
        this.root = root;
    }

    /** Whether a failed evaluation's folder was kept. */
    boolean keptAny() {
        return kept.get() > 0 && settings.keepFailed() > 0;
    }

    /**
     * The log-likelihood of vector {@code i} of {@code values}.
     *
     * @throws ProgramFailureException saying what went wrong, with the end of the program's output
     */
    double evaluate(double[] values, int d, int i, long seed, int iteration) {
        Path folder = ScratchFolders.create(root, "evaluation-" + evaluations.incrementAndGet());
        ChildProcess child = null;
        String failure;
        try {
            Files.writeString(folder.resolve(settings.inputName()), template.render(values, d, i, seed, iteration),
                    StandardCharsets.UTF_8);
            child = ChildProcess.start(settings.command(), ChildEnvironment.of(settings.environment(), folder), folder,
                    true);
            child.stdin().close();
            Integer status = child.waitFor(settings.timeout().toMillis());
            if (status == null) {
                child.kill();
                failure = "no result within " + Worker.describe(settings.timeout())
                        + " (the timeout); its process tree was killed";
            } else if (status != 0) {
                failure = status > 128 && status < 160 ? "it was killed by signal " + (status - 128)
                        : "it exited with status " + status;
            } else {
                Path output = folder.resolve(settings.outputName());
                if (!Files.isRegularFile(output)) {
                    failure = "it wrote no output file " + settings.outputName();
                } else if (Files.size(output) > MAX_OUTPUT_BYTES) {
                    failure = "its output file " + settings.outputName() + " holds more than one number";
                } else {
                    String text = Files.readString(output, StandardCharsets.UTF_8).strip();
                    try {
                        double value = WireNumbers.parse(text);
                        ScratchFolders.remove(folder);
                        return value;
                    } catch (NumberFormatException e) {
                        failure = "its output file " + settings.outputName() + " holds '"
                                + (text.length() > 200 ? text.substring(0, 200) + "…" : text) + "', not a number";
                    }
                }
            }
        } catch (IOException e) {
            failure = "it could not be run: " + e.getMessage();
        } finally {
            if (child != null && child.isAlive()) {
                child.kill();
            }
        }
        String tail = child == null ? "" : child.stderrTail();
        String keptNote;
        if (kept.incrementAndGet() <= settings.keepFailed()) {
            keptNote = "; its folder is kept: " + folder;
        } else {
            ScratchFolders.remove(folder);
            keptNote = "";
        }
        throw new ProgramFailureException("the model program " + String.join(" ", settings.command()) + ": " + failure
                + keptNote + (tail.isEmpty() ? " (it printed nothing)"
                        : "; its output ended with: " + tail.replace("\r", "").replace('\n', '|')));
    }
}
