package org.skerry.engine.population;

import java.io.Serializable;

/**
 * Counts from Metropolis–Hastings moves: proposals made, proposals accepted, proposals rejected
 * because the prior density was zero there (no likelihood call needed), and the tally of the
 * likelihood evaluations the moves made. Immutable.
 */
public final class MoveTally implements Serializable {

    private static final long serialVersionUID = 1L;

    /** The tally of no moves. */
    public static final MoveTally NONE = new MoveTally(0, 0, 0, EvaluationTally.NONE);

    private final long proposed;
    private final long accepted;
    private final long outsidePrior;
    private final EvaluationTally evaluations;

    public MoveTally(long proposed, long accepted, long outsidePrior, EvaluationTally evaluations) {
        this.proposed = proposed;
        this.accepted = accepted;
        this.outsidePrior = outsidePrior;
        this.evaluations = evaluations;
    }

    public MoveTally plus(MoveTally other) {
        return new MoveTally(proposed + other.proposed, accepted + other.accepted,
                outsidePrior + other.outsidePrior, evaluations.plus(other.evaluations));
    }

    public long proposed() {
        return proposed;
    }

    public long accepted() {
        return accepted;
    }

    public long outsidePrior() {
        return outsidePrior;
    }

    public EvaluationTally evaluations() {
        return evaluations;
    }

    /** Accepted ÷ proposed, or 0 when nothing was proposed. */
    public double acceptanceRate() {
        return proposed == 0 ? 0.0 : (double) accepted / proposed;
    }
}
