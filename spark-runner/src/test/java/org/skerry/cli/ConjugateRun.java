package org.skerry.cli;

/**
 * The small run file the command tests start from: the 1-D normal mean with a Normal prior
 * (closed form: BDA3 §2.5), 200 particles on the thread backend, no progress line, reading
 * {@code data.csv} beside it. Tests append lines to it; line 7 is the first appended line.
 */
public final class ConjugateRun {

    /** The run file's text, six lines ending with a newline. */
    public static final String RUN_FILE = String.join("\n",
            "name = conjugate",
            "model { name = normal-mean, settings { sigma = 2.0, prior { mean = 0, sd = 3 } } }",
            "data { file = \"data.csv\" }",
            "sampler { particles = 200, seed = 4 }",
            "output.progress = off",
            "backend.kind = threads",
            "");

    /** The text of its data file: four synthetic observations. */
    public static final String DATA = "# synthetic test data\ny\n1.2\n0.7\n2.5\n1.9\n";

    private ConjugateRun() {
    }
}
