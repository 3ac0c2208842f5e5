package org.skerry.engine.model;

/**
 * A model whose likelihood factorises over its observations given the parameters, so that it can
 * give the log-likelihood of any run of consecutive observations: what data tempering needs, the
 * targets {@code π_t(θ) ∝ p(θ)·L(y_1..y_{n_t} | θ)} that add observations in batches (Chopin 2002,
 * "A sequential particle filter method for static models", Biometrika 89(3), 539–551). An optional
 * capability: {@link #of(Model)} finds it on a model or refuses.
 *
 * <p>Observations are numbered {@code 0 .. observationCount()-1} in one fixed order that the
 * model documents: time order for a series, data-file row order otherwise. A range
 * {@code [from, to)} holds the observations {@code from} to {@code to - 1}; an empty range
 * ({@code from == to}) has log-likelihood 0.
 *
 * <p>The contract, which every implementation keeps:
 * <ul>
 *   <li><b>Whole range, bit for bit.</b> {@code logLikelihood(θ, 0, n, c)} returns exactly the
 *       bits of {@link Model#logLikelihood(double[], LikelihoodContext) logLikelihood(θ, c)}, so a
 *       sequence of targets that ends with all the data ends on the very target, and the very
 *       numbers, of likelihood tempering at temperature 1. A model whose full likelihood is
 *       evaluated from sufficient statistics answers the whole range that way.</li>
 *   <li><b>Additive to rounding.</b> For {@code from <= k <= to},
 *       {@code logLikelihood(θ, from, to)} equals {@code logLikelihood(θ, from, k) +
 *       logLikelihood(θ, k, to)} up to the rounding of summing the per-observation terms (of the
 *       order of {@code (to − from)·ε·Σ|term|}, Higham, Accuracy and Stability of Numerical
 *       Algorithms, 2nd ed. (2002), §4.2), not bit for bit: the sums are grouped differently.</li>
 *   <li><b>Thread-safety and failures as for {@link Model}:</b> called from many threads at once;
 *       {@code -Infinity} is a valid zero; NaN, {@code +Infinity} or an exception is an invalid
 *       evaluation.</li>
 *   <li><b>Stochastic models.</b> The engine restarts {@link LikelihoodContext#random()} for every
 *       call, as it does for a retry. A simulator draws only from that stream, keeps nothing
 *       between calls, and consumes it in an order that does not depend on the range asked (say,
 *       simulating the series from its start), so that a range's value never depends on which
 *       ranges were asked before, and observation {@code j} meets the same numbers in every range
 *       that holds it.</li>
 * </ul>
 *
 * <p>A model that wraps another model must implement this interface itself and forward it, or
 * the capability is lost. Evaluation retries are the engine's, not a wrapper's, so they keep it.
 */
public interface ObservationLikelihood extends Model {

    /** The number n of observations, at least 1. */
    int observationCount();

    /**
     * The log-likelihood of the observations {@code [fromObservation, toObservation)} at
     * {@code parameters}, constants included, as {@link Model#logLikelihood} is for all of them.
     *
     * @throws IllegalArgumentException if not {@code 0 <= fromObservation <= toObservation <= n}
     */
    double logLikelihood(double[] parameters, int fromObservation, int toObservation, LikelihoodContext context);

    /**
     * Writes the log-likelihood of each single observation of {@code [fromObservation,
     * toObservation)} into {@code terms[0 .. toObservation − fromObservation)}: {@code terms[j −
     * fromObservation]} is, bit for bit, {@code logLikelihood(parameters, j, j + 1, context)}.
     *
     * <p>It exists because an adaptive choice of the next batch of observations (bisection on the
     * effective sample size over the number of observations added) wants, per particle, the
     * partial sums over every candidate batch of a window: one call here evaluates the window
     * once, where a call per candidate would repeat the shared work (for an ODE model, one solve
     * per candidate instead of one). The default calls the single-observation ranges in
     * increasing order; a model whose observations share costly work overrides it.
     *
     * @throws IllegalArgumentException if the range is out of bounds or {@code terms} is too short
     */
    default void logLikelihoodTerms(double[] parameters, int fromObservation, int toObservation, double[] terms,
            LikelihoodContext context) {
        checkTerms(fromObservation, toObservation, observationCount(), terms);
        for (int j = fromObservation; j < toObservation; j++) {
            terms[j - fromObservation] = logLikelihood(parameters, j, j + 1, context);
        }
    }

    /**
     * {@code model} as an {@code ObservationLikelihood}.
     *
     * @throws IllegalArgumentException naming the model if it does not factorise over observations
     */
    static ObservationLikelihood of(Model model) {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        if (model instanceof ObservationLikelihood) {
            return (ObservationLikelihood) model;
        }
        throw new IllegalArgumentException("model " + describe(model) + " gives no log-likelihood per observation "
                + "range: adding observations in batches (data tempering) needs a model that implements "
                + ObservationLikelihood.class.getName() + "; use likelihood tempering for this model");
    }

    /**
     * Fails unless {@code 0 <= from <= to <= count}; for implementations.
     *
     * @throws IllegalArgumentException naming the range and the number of observations
     */
    static void checkRange(int from, int to, int count) {
        if (from < 0 || to < from || to > count) {
            throw new IllegalArgumentException("observation range [" + from + ", " + to + ") must lie within [0, "
                    + count + ") with from <= to");
        }
    }

    /**
     * Fails unless the range is as for {@link #checkRange} and {@code terms} holds
     * {@code to − from} values; for implementations of {@link #logLikelihoodTerms}.
     */
    static void checkTerms(int from, int to, int count, double[] terms) {
        checkRange(from, to, count);
        if (terms == null || terms.length < to - from) {
            throw new IllegalArgumentException("terms must hold " + (to - from) + " values for observations ["
                    + from + ", " + to + "), was " + (terms == null ? "null" : "of length " + terms.length));
        }
    }

    private static String describe(Model model) {
        String type = model.getClass().getName();
        String text = String.valueOf(model);
        return text.startsWith(type + "@") ? type : "'" + text + "' (" + type + ")";
    }
}
