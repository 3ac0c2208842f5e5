package org.skerry.engine.model;

import java.util.List;

/**
 * A model that can be run forward but has no likelihood to evaluate: for parameters and a keyed
 * random stream it simulates a data set and returns its summaries, which approximate Bayesian
 * computation (ABC) compares with the observed summaries (Pritchard, Seielstad, Perez-Lezaun
 * &amp; Feldman 1999, Mol. Biol. Evol. 16; Beaumont, Zhang &amp; Balding 2002, Genetics 162).
 * An optional capability: {@link #of(Model)} finds it on a model or refuses. A Java class
 * implements it directly; a model run as an outside program implements it by asking the program
 * for summaries instead of a log-likelihood.
 *
 * <p>The contract: all randomness comes from {@link LikelihoodContext#random()}, which the
 * engine restarts for every call (as for a retry), so the same particle, iteration and step give
 * the same summaries on any thread, executor or resume. Calls come from many threads at once;
 * the simulator must not keep the arrays it is handed. A NaN or infinite summary, or a thrown
 * exception, counts as an invalid simulation (zero weight, counted and reported, as an invalid
 * likelihood evaluation is). A model without a likelihood may throw
 * {@link UnsupportedOperationException} from {@link Model#logLikelihood}; ABC never calls it.
 */
public interface SummarySimulator extends Model {

    /** The names of the summaries, in the order {@link #simulate} writes them; at least one. */
    List<String> summaryNames();

    /**
     * Simulates a data set at {@code parameters} (on the model's own scale, inside the support)
     * and writes its summaries into {@code summaries[0 .. summaryNames().size())}.
     */
    void simulate(double[] parameters, LikelihoodContext context, double[] summaries);

    /**
     * The summaries of the observed data, in the order of {@link #summaryNames()}, when the model
     * holds its data; null when they must come from elsewhere (a run file's observed summaries).
     */
    default double[] observedSummaries() {
        return null;
    }

    /**
     * Calls the simulator once at a prior draw to see that it writes as many summaries as it names
     * (a stream of its own purpose, so no run's answer changes): what can be known about the
     * simulator before a run.
     *
     * @return null when it does, else what is wrong, naming the counts
     */
    static String checkSummaryCount(SummarySimulator simulator, long seed) {
        int count = simulator.summaryNames().size();
        org.skerry.engine.random.RandomStream random = new org.skerry.engine.random.RandomStream(seed,
                org.skerry.engine.random.StreamPurpose.MODEL_CHECK, 0, 0, 0);
        double[] x = new double[simulator.dimension()];
        simulator.prior().sample(random, x);
        double[] out = new double[count + 1];
        java.util.Arrays.fill(out, Double.NaN);
        LikelihoodContext context = new LikelihoodContext() {
            @Override
            public org.skerry.engine.random.RandomStream random() {
                return random;
            }

            @Override
            public long particleIndex() {
                return 0;
            }

            @Override
            public int iteration() {
                return 0;
            }
        };
        String names = count + " summaries " + simulator.summaryNames();
        try {
            simulator.simulate(x, context, out);
        } catch (ArrayIndexOutOfBoundsException e) {
            return "the simulator wrote more summaries than the " + names + " it names (" + e.getMessage() + ")";
        } catch (RuntimeException e) {
            // A simulation that fails is an invalid simulation, counted during the run, not a wrong count.
            return null;
        }
        if (!Double.isNaN(out[count])) {
            return "the simulator wrote more summaries than the " + names + " it names";
        }
        return null;
    }

    /**
     * {@code model} as a simulator.
     *
     * @throws IllegalArgumentException naming the model's class when it simulates no summaries
     */
    static SummarySimulator of(Model model) {
        if (model instanceof SummarySimulator simulator) {
            return simulator;
        }
        throw new IllegalArgumentException("approximate Bayesian computation needs a model that simulates "
                + "summaries; " + model.getClass().getName() + " does not (it implements no SummarySimulator)");
    }
}
