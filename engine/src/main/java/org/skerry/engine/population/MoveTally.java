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
    private final long[] proposedByRung;
    private final long[] acceptedByRung;

    public MoveTally(long proposed, long accepted, long outsidePrior, EvaluationTally evaluations) {
        this(proposed, accepted, outsidePrior, evaluations, null, null);
    }

    /**
     * A tally with counts per rung of a ladder of step sizes ({@link org.skerry.engine.move.Proposal#withRungs});
     * the arrays may be null when the moves had no ladder.
     */
    public MoveTally(long proposed, long accepted, long outsidePrior, EvaluationTally evaluations,
            long[] proposedByRung, long[] acceptedByRung) {
        if ((proposedByRung == null) != (acceptedByRung == null)
                || (proposedByRung != null && proposedByRung.length != acceptedByRung.length)) {
            throw new IllegalArgumentException("proposedByRung and acceptedByRung must both be null or of one length");
        }
        this.proposed = proposed;
        this.accepted = accepted;
        this.outsidePrior = outsidePrior;
        this.evaluations = evaluations;
        this.proposedByRung = proposedByRung == null ? null : proposedByRung.clone();
        this.acceptedByRung = acceptedByRung == null ? null : acceptedByRung.clone();
    }

    public MoveTally plus(MoveTally other) {
        return new MoveTally(proposed + other.proposed, accepted + other.accepted,
                outsidePrior + other.outsidePrior, evaluations.plus(other.evaluations),
                addRungs(proposedByRung, other.proposedByRung), addRungs(acceptedByRung, other.acceptedByRung));
    }

    private static long[] addRungs(long[] a, long[] b) {
        if (a == null) {
            return b;
        }
        if (b == null) {
            return a;
        }
        if (a.length != b.length) {
            throw new IllegalArgumentException("rung counts of different ladders: " + a.length + " and " + b.length);
        }
        long[] sum = new long[a.length];
        for (int k = 0; k < a.length; k++) {
            sum[k] = a[k] + b[k];
        }
        return sum;
    }

    /** Proposals per ladder rung, or null when the moves had no ladder. */
    public long[] proposedByRung() {
        return proposedByRung == null ? null : proposedByRung.clone();
    }

    /** Accepted proposals per ladder rung, or null when the moves had no ladder. */
    public long[] acceptedByRung() {
        return acceptedByRung == null ? null : acceptedByRung.clone();
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
