package org.skerry.engine.target;

import org.skerry.engine.abc.AbcSequence;
import org.skerry.engine.abc.AbcSettings;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.temper.LikelihoodTempering;
import org.skerry.engine.temper.TemperatureRule;

/**
 * Which sequence of targets a run walks, as settings: likelihood tempering (the default), data
 * tempering with fixed or adaptive batches, or ABC tolerances. Immutable; {@link #create} builds
 * the sequence for a model, refusing data tempering for a model whose likelihood does not
 * factorise over its observations, and ABC for a model that simulates no summaries.
 *
 * @param kind   the kind of sequence
 * @param batch  data tempering: observations added per step, 0 to choose adaptively
 * @param window data tempering with adaptive batches: the most observations one step may add
 * @param target data tempering with adaptive batches: the conditional ESS fraction to keep
 * @param abc    ABC: its settings (null for the other kinds)
 */
public record SequenceSettings(Kind kind, int batch, int window, double target, AbcSettings abc) {

    /** The kinds of sequence. */
    public enum Kind {
        /** {@code prior × likelihood^φ}, φ from 0 to 1. */
        LIKELIHOOD_TEMPERING,
        /** {@code prior × likelihood of the first k observations}, k from 0 to n. */
        DATA_TEMPERING,
        /** Approximate Bayesian computation: tolerances ε from +∞ down to a final tolerance. */
        ABC
    }

    /** Default window of adaptive data tempering: observations one step may add. */
    public static final int DEFAULT_WINDOW = 16;

    /** Likelihood tempering, with the sampler's temperature rule. */
    public static final SequenceSettings LIKELIHOOD_TEMPERING = new SequenceSettings(Kind.LIKELIHOOD_TEMPERING, 0, 0,
            Double.NaN, null);

    public SequenceSettings {
        if (kind == null) {
            throw new IllegalArgumentException("kind must not be null");
        }
        if (kind == Kind.DATA_TEMPERING) {
            if (batch < 0) {
                throw new IllegalArgumentException("batch must be >= 0 (0: adaptive), was " + batch);
            }
            if (batch == 0 && window < 1) {
                throw new IllegalArgumentException("window must be >= 1, was " + window);
            }
            if (batch == 0 && !(target > 0 && target < 1)) {
                throw new IllegalArgumentException("the conditional ESS target must be in (0, 1), was " + target);
            }
        }
        if ((kind == Kind.ABC) != (abc != null)) {
            throw new IllegalArgumentException("ABC settings go with the ABC kind and only with it");
        }
    }

    /** A sequence of ABC tolerances. */
    public static SequenceSettings abc(AbcSettings settings) {
        if (settings == null) {
            throw new IllegalArgumentException("settings must not be null");
        }
        return new SequenceSettings(Kind.ABC, 0, 0, Double.NaN, settings);
    }

    /** Data tempering with batches of {@code batch} observations. */
    public static SequenceSettings fixedBatches(int batch) {
        if (batch < 1) {
            throw new IllegalArgumentException("batch must be >= 1, was " + batch);
        }
        return new SequenceSettings(Kind.DATA_TEMPERING, batch, 0, Double.NaN, null);
    }

    /** Data tempering with batches chosen on the conditional ESS, at most {@code window} observations. */
    public static SequenceSettings adaptiveBatches(int window, double target) {
        return new SequenceSettings(Kind.DATA_TEMPERING, 0, window, target, null);
    }

    /**
     * The sequence for {@code model}.
     *
     * @throws IllegalArgumentException naming the model when data tempering is asked of a model
     *     without a likelihood per observation range
     */
    public TargetSequence create(Model model, TemperatureRule rule, long seed, int retries) {
        if (kind == Kind.LIKELIHOOD_TEMPERING) {
            return new LikelihoodTempering(rule);
        }
        if (kind == Kind.ABC) {
            return new AbcSequence(SummarySimulator.of(model), abc);
        }
        int count = ObservationLikelihood.of(model).observationCount();
        return new DataTempering(count, this, seed, retries);
    }
}
