package org.skerry.engine.model.prior;

import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * A probability distribution on one real parameter, usable as a prior marginal: it draws from a
 * {@link RandomStream} and gives its normalised log-density.
 *
 * <p>Implementations are immutable and thread-safe. Draws consume only the stream handed in and
 * always land strictly inside {@link #support()}: a value that rounds onto a bound is drawn
 * again, so the moves' transformation to the real line never sees an infinite coordinate.
 */
public interface UnivariateDistribution {

    /** The open set of values this distribution gives positive density. */
    Support support();

    /** One draw, strictly inside {@link #support()}. */
    double sample(RandomStream random);

    /** The normalised log-density at {@code x}; {@code -Infinity} outside the support. */
    double logDensity(double x);
}
