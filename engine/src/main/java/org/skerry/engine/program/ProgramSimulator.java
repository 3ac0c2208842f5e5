package org.skerry.engine.program;

import java.util.List;
import org.skerry.engine.model.BatchContext;
import org.skerry.engine.model.BatchedSummarySimulator;
import org.skerry.engine.model.LikelihoodContext;

/**
 * A user's program as a simulator for approximate Bayesian computation: the workers of a
 * {@link ProgramModel}, started with {@code reply summaries} and the names of
 * {@code model.program.summaries}, reply with one number per summary for each particle instead of
 * a log-likelihood. The seed of a request is the first number of the stream the sampler keys for
 * the simulation (a retry or a resume gets the same seed), so a program that draws from it alone
 * simulates the same summaries on every backend. A reply with another count of numbers, a
 * non-number, or an error is an invalid simulation with the reason; observed summaries come from
 * the run file ({@code sampler.abc.observed} or {@code observed-file}), as the program holds none.
 * It has no likelihood: the likelihood methods refuse.
 */
public final class ProgramSimulator extends ProgramModel implements BatchedSummarySimulator {

    /** The words of a wrong-count reason (a reply with another number of summaries than named). */
    public static final String WRONG_COUNT = "model.program.summaries names";

    private final int width;

    public ProgramSimulator(ProgramSettings settings) {
        super(settings);
        if (!settings.simulatesSummaries()) {
            throw new IllegalArgumentException("settings name no summaries; a program replying with "
                    + "log-likelihoods is a ProgramModel");
        }
        this.width = settings.summaries().size();
    }

    @Override
    public List<String> summaryNames() {
        return settings().summaries();
    }

    @Override
    public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
        long[] seeds = {context.random().nextLong()};
        String[] errors = new String[1];
        double[] out = summaries.length == width ? summaries : new double[width];
        evaluate(parameters, 1, seeds, context.iteration(), out, errors);
        if (errors[0] != null) {
            throw new ProgramFailureException(errors[0]);
        }
        if (out != summaries) {
            System.arraycopy(out, 0, summaries, 0, width);
        }
    }

    /**
     * Requests of up to {@code model.program.batch} particles (several particles a request, each
     * replying with its summaries). Vector i's simulation m gets the m-th number of its stream as
     * seed, as the m-th of its single calls would.
     */
    @Override
    public void simulateAll(double[] parameters, int count, int simulations, BatchContext context, double[] summaries,
            String[] errors) {
        int d = dimension();
        int total = count * simulations;
        double[] each = parameters;
        if (simulations > 1) {
            each = new double[total * d];
            for (int i = 0; i < count; i++) {
                for (int m = 0; m < simulations; m++) {
                    System.arraycopy(parameters, i * d, each, (i * simulations + m) * d, d);
                }
            }
        }
        long[] seeds = new long[total];
        for (int i = 0; i < count; i++) {
            org.skerry.engine.random.RandomStream random = context.random(i);
            for (int m = 0; m < simulations; m++) {
                seeds[i * simulations + m] = random.nextLong();
            }
        }
        String[] reasons = new String[total];
        evaluate(each, total, seeds, context.iteration(), summaries, reasons);
        for (int i = 0; i < count; i++) {
            errors[i] = null;
            for (int m = 0; m < simulations && errors[i] == null; m++) {
                errors[i] = reasons[i * simulations + m];
            }
        }
    }

    @Override
    public double logLikelihood(double[] parameters, LikelihoodContext context) {
        throw noLikelihood();
    }

    @Override
    public void logLikelihoods(double[] parameters, int count, double[] out) {
        throw noLikelihood();
    }

    @Override
    public void logLikelihoods(double[] parameters, int count, BatchContext context, double[] out) {
        throw noLikelihood();
    }

    private static UnsupportedOperationException noLikelihood() {
        return new UnsupportedOperationException("a program model with model.program.summaries replies with "
                + "summaries and offers no likelihood: run it with sampler.sequence = abc");
    }
}
