package org.skerry.engine.program;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.BatchContext;
import org.skerry.engine.model.BatchedModel;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.UnivariateDistribution;

/**
 * A model whose log-likelihood a user's program computes, in any language: skerry keeps one
 * long-lived worker process per concurrent evaluation ({@link WorkerPool}) and speaks the line
 * protocol of {@link WorkerProtocol} with it. The parameters and their priors are declared in the
 * run file; each parameter's support is its prior's.
 *
 * <p>Every particle's request carries a 64-bit seed, the first number of the random stream the
 * sampler keys for that evaluation (seed, iteration, particle, step), so a program that draws its
 * randomness from that seed alone is deterministic, and answers bit for bit alike on every
 * backend, partitioning and resume. Requests carry up to {@code batch} particles: a program's
 * reply for one particle must depend only on that particle's parameters and seed, never on which
 * particles share its request. A failed particle (an error reply, a crash, a timeout) is NaN in a
 * batch, which the sampler evaluates again alone, retrying as the run file allows; there the
 * failure is a {@link ProgramFailureException} whose message is the reported reason.
 *
 * <p>Workers start on first use, so the copies of the model a run builds only to read its
 * parameters start no process; {@link #close} ends them, and {@link #probe} checks that one can
 * start before a run.
 *
 * <p>A program declaring summaries ({@code model.program.summaries}) is a {@link ProgramSimulator}
 * instead: the same workers, replying with summaries for ABC.
 */
public sealed class ProgramModel implements BatchedModel, AutoCloseable permits ProgramSimulator {

    private final ProgramSettings settings;
    private final ParameterSpace space;
    private final IndependentPrior prior;
    private final WorkerPool pool;
    private FileModeRun fileRun;
    private java.nio.file.Path fileRoot;

    public ProgramModel(ProgramSettings settings) {
        this.settings = settings;
        List<Support> supports = new ArrayList<>();
        for (UnivariateDistribution marginal : settings.priors()) {
            supports.add(marginal.support());
        }
        this.space = ParameterSpace.of(settings.names(), supports);
        this.prior = IndependentPrior.of(settings.priors());
        this.pool = new WorkerPool(settings);
    }

    public ProgramSettings settings() {
        return settings;
    }

    @Override
    public ParameterSpace parameters() {
        return space;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    @Override
    public double logLikelihood(double[] parameters, LikelihoodContext context) {
        long[] seeds = {context.random().nextLong()};
        double[] result = new double[1];
        String[] errors = new String[1];
        evaluate(parameters, 1, seeds, context.iteration(), result, errors);
        if (errors[0] != null) {
            throw new ProgramFailureException(errors[0]);
        }
        return result[0];
    }

    @Override
    public void logLikelihoods(double[] parameters, int count, double[] out) {
        throw new UnsupportedOperationException("a program model needs each particle's seed: call "
                + "logLikelihoods(parameters, count, context, out)");
    }

    @Override
    public void logLikelihoods(double[] parameters, int count, BatchContext context, double[] out) {
        long[] seeds = new long[count];
        for (int i = 0; i < count; i++) {
            seeds[i] = context.random(i).nextLong();
        }
        // A failed particle is NaN here; the sampler evaluates it again alone, with retries, and reports it.
        evaluate(parameters, count, seeds, context.iteration(), out, new String[count]);
    }

    /**
     * Evaluates {@code count} vectors in requests of at most {@code batch} particles on one
     * borrowed worker; a request whose worker broke leaves its particles NaN with the reason in
     * {@code errors}, and the rest go to a fresh worker. A program replying with s summaries
     * writes particle i's to {@code out[i·s … i·s+s−1]}.
     */
    final void evaluate(double[] parameters, int count, long[] seeds, int iteration, double[] out, String[] errors) {
        int d = space.dimension();
        if (settings.mode() == ProgramSettings.Mode.FILE) {
            FileModeRun run = fileRun();
            for (int i = 0; i < count; i++) {
                try {
                    out[i] = run.evaluate(parameters, d, i, seeds[i], iteration);
                    errors[i] = null;
                } catch (ProgramFailureException | ProgramStartException e) {
                    out[i] = Double.NaN;
                    errors[i] = e.getMessage();
                }
            }
            return;
        }
        Worker worker = null;
        try {
            for (int from = 0; from < count; from += settings.batch()) {
                int size = Math.min(settings.batch(), count - from);
                if (worker == null) {
                    try {
                        worker = pool.borrow();
                    } catch (ProgramStartException | ProgramFailureException e) {
                        fail(out, errors, from, size, "the model program's worker could not be (re)started: "
                                + e.getMessage());
                        continue;
                    }
                }
                try {
                    worker.evaluate(parameters, d, from, size, seeds, iteration, out, errors);
                } catch (ProgramFailureException e) {
                    fail(out, errors, from, size, e.getMessage());
                    pool.giveBack(worker);
                    worker = null;
                }
            }
        } finally {
            if (worker != null) {
                pool.giveBack(worker);
            }
        }
    }

    private void fail(double[] out, String[] errors, int from, int size, String reason) {
        int width = Math.max(1, settings.summaries().size());
        java.util.Arrays.fill(out, from * width, (from + size) * width, Double.NaN);
        for (int i = from; i < from + size; i++) {
            errors[i] = reason;
        }
    }

    /**
     * Starts one worker and completes its handshake, then ends it: a program that cannot start
     * (missing, an import error, another protocol version) is found before a run begins.
     *
     * @throws ProgramStartException with the program's standard-error tail
     */
    public void probe() {
        if (settings.mode() == ProgramSettings.Mode.FILE) {
            // A file-mode run has no handshake; what can be checked is that the program is there.
            try {
                org.skerry.engine.process.ProcessLauncher.resolveExecutable(settings.command().get(0),
                        org.skerry.engine.process.ChildEnvironment.of(settings.environment(), null).get("PATH"));
            } catch (java.io.IOException e) {
                throw new ProgramStartException("cannot start the model program " + String.join(" ", settings.command())
                        + ": " + e.getMessage());
            }
            return;
        }
        try (WorkerPool trial = new WorkerPool(settings)) {
            trial.giveBack(trial.borrow());
        }
    }

    /** How many workers this model has started, replacements included. */
    public int workersStarted() {
        return pool.started();
    }

    private synchronized FileModeRun fileRun() {
        if (fileRun == null) {
            fileRoot = ScratchFolders.createRoot(settings.scratch());
            fileRun = new FileModeRun(settings, InputTemplate.parse(settings.fileMode().templateText(), settings.names()),
                    fileRoot);
        }
        return fileRun;
    }

    /**
     * Ends every worker of this model and removes their scratch folders; in file mode the scratch
     * folder stays when it holds failed evaluations' folders kept for inspection.
     */
    @Override
    public void close() {
        pool.close();
        synchronized (this) {
            if (fileRun != null && !fileRun.keptAny()) {
                ScratchFolders.remove(fileRoot);
            }
        }
    }
}
