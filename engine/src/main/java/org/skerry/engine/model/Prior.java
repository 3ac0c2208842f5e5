package org.skerry.engine.model;

import org.skerry.engine.random.RandomStream;

/**
 * A prior distribution over a parameter vector, on the model's own scale: it can be sampled from
 * a random stream and its normalised log-density evaluated. The normalising constant matters,
 * because the evidence is reported on an absolute scale.
 *
 * <p>Implementations are immutable and thread-safe; sampling must draw only from the stream it is
 * given, so that a particle's initial value depends on its address alone.
 */
public interface Prior {

    /** Number of parameters. */
    int dimension();

    /** Draws one vector into {@code out} (length {@link #dimension()}). */
    void sample(RandomStream random, double[] out);

    /** The normalised log-density at {@code parameters}; {@code -Infinity} outside the support. */
    double logDensity(double[] parameters);
}
