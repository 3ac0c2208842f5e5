package org.skerry.engine.sampler;

import org.skerry.engine.model.Prior;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.TemperatureRule;

/**
 * Everything that determines a run's answer besides the model and the data, grouped by concern:
 * the population, islands, resampling, the sequence of targets, tempering, moves and the handling
 * of invalid evaluations.
 * Immutable; build with {@link #builder()}, whose setters check every value and name the setting
 * they refuse.
 */
public final class SamplerSettings {

    private final PopulationSettings population;
    private final IslandSettings islands;
    private final ResamplingSettings resampling;
    private final SequenceSettings targets;
    private final TemperingSettings tempering;
    private final MoveSettings moves;
    private final EvaluationSettings evaluation;

    private SamplerSettings(Builder b) {
        this.population = b.population;
        this.islands = b.islands;
        this.resampling = b.resampling;
        this.targets = b.targets;
        this.tempering = b.tempering;
        this.moves = b.moves;
        this.evaluation = b.evaluation;
        if (islands.count() > population.particles()) {
            throw new IllegalArgumentException("islands (" + islands.count() + ") must not exceed particles ("
                    + population.particles() + ")");
        }
    }

    public static Builder builder() {
        return new Builder();
    }

    /** A builder holding this object's values. */
    public Builder toBuilder() {
        return new Builder().population(population).islands(islands).resampling(resampling).targets(targets).tempering(tempering)
                .moves(moves).evaluation(evaluation);
    }

    /** Size, seed and start of the population. */
    public PopulationSettings population() {
        return population;
    }

    /** Island mode ({@link IslandSettings#NONE} for global resampling). */
    public IslandSettings islands() {
        return islands;
    }

    /** When and how to resample. */
    public ResamplingSettings resampling() {
        return resampling;
    }

    /** Which sequence of targets to walk: likelihood tempering unless data tempering is asked for. */
    public SequenceSettings targets() {
        return targets;
    }

    /** The temperature rule and the iteration limit. */
    public TemperingSettings tempering() {
        return tempering;
    }

    /** The Metropolis–Hastings moves. */
    public MoveSettings moves() {
        return moves;
    }

    /** Retries and the limit on invalid likelihood evaluations. */
    public EvaluationSettings evaluation() {
        return evaluation;
    }

    /**
     * Builder for {@link SamplerSettings}: set a whole group, or one value of a group; each setter
     * validates its argument.
     */
    public static final class Builder {
        private PopulationSettings population = PopulationSettings.DEFAULTS;
        private IslandSettings islands = IslandSettings.NONE;
        private ResamplingSettings resampling = ResamplingSettings.DEFAULTS;
        private SequenceSettings targets = SequenceSettings.LIKELIHOOD_TEMPERING;
        private TemperingSettings tempering = TemperingSettings.DEFAULTS;
        private MoveSettings moves = MoveSettings.DEFAULTS;
        private EvaluationSettings evaluation = EvaluationSettings.DEFAULTS;

        private Builder() {
        }

        public Builder population(PopulationSettings value) {
            population = require("population", value);
            return this;
        }

        public Builder islands(IslandSettings value) {
            islands = require("islands", value);
            return this;
        }

        public Builder resampling(ResamplingSettings value) {
            resampling = require("resampling", value);
            return this;
        }

        public Builder targets(SequenceSettings value) {
            targets = require("targets", value);
            return this;
        }

        public Builder tempering(TemperingSettings value) {
            tempering = require("tempering", value);
            return this;
        }

        public Builder moves(MoveSettings value) {
            moves = require("moves", value);
            return this;
        }

        public Builder evaluation(EvaluationSettings value) {
            evaluation = require("evaluation", value);
            return this;
        }

        // ---- one value of a group ---------------------------------------------------------------

        public Builder particles(int value) {
            PopulationSettings p = population;
            return population(new PopulationSettings(value, p.seed(), p.startProposal(), p.minimumDistinctEves()));
        }

        public Builder seed(long value) {
            PopulationSettings p = population;
            return population(new PopulationSettings(p.particles(), value, p.startProposal(), p.minimumDistinctEves()));
        }

        /** Start from a user distribution q instead of the prior ({@code null} for the prior). */
        public Builder startProposal(Prior value) {
            PopulationSettings p = population;
            return population(new PopulationSettings(p.particles(), p.seed(), value, p.minimumDistinctEves()));
        }

        public Builder minimumDistinctEves(int value) {
            PopulationSettings p = population;
            return population(new PopulationSettings(p.particles(), p.seed(), p.startProposal(), value));
        }

        /** K islands, each resampling on its own (0: global resampling). */
        public Builder islands(int value) {
            return islands(new IslandSettings(value, islands.interactionEvery(), islands.interactionThreshold()));
        }

        public Builder islandInteractionEvery(int value) {
            return islands(new IslandSettings(islands.count(), value, islands.interactionThreshold()));
        }

        public Builder islandInteractionThreshold(double value) {
            return islands(new IslandSettings(islands.count(), islands.interactionEvery(), value));
        }

        public Builder resamplingScheme(ResamplingScheme value) {
            return resampling(new ResamplingSettings(value, resampling.threshold(), resampling.everyIteration()));
        }

        public Builder resampleThreshold(double value) {
            return resampling(new ResamplingSettings(resampling.scheme(), value, resampling.everyIteration()));
        }

        public Builder resampleEveryIteration(boolean value) {
            return resampling(new ResamplingSettings(resampling.scheme(), resampling.threshold(), value));
        }

        public Builder temperatureRule(TemperatureRule value) {
            return tempering(new TemperingSettings(value, tempering.maxIterations()));
        }

        public Builder maxIterations(int value) {
            return tempering(new TemperingSettings(tempering.rule(), value));
        }

        public Builder moveKernel(MoveKernel value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(value, m.fixedSteps(), m.stayProbability(), m.maxSteps(), m.initialScale(),
                    m.targetAcceptance()));
        }

        /** A fixed number of MH steps per iteration (>= 1), or 0 to adapt it. */
        public Builder fixedSteps(int value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(m.kernel(), value, m.stayProbability(), m.maxSteps(), m.initialScale(),
                    m.targetAcceptance()));
        }

        public Builder stayProbability(double value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(m.kernel(), m.fixedSteps(), value, m.maxSteps(), m.initialScale(),
                    m.targetAcceptance()));
        }

        public Builder maxSteps(int value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(m.kernel(), m.fixedSteps(), m.stayProbability(), value, m.initialScale(),
                    m.targetAcceptance()));
        }

        public Builder initialScale(double value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(m.kernel(), m.fixedSteps(), m.stayProbability(), m.maxSteps(), value,
                    m.targetAcceptance()));
        }

        public Builder targetAcceptance(double value) {
            MoveSettings m = moves;
            return moves(new MoveSettings(m.kernel(), m.fixedSteps(), m.stayProbability(), m.maxSteps(),
                    m.initialScale(), value));
        }

        /** Retries of an invalid likelihood call, in [0, 100]. */
        public Builder evaluationRetries(int value) {
            return evaluation(new EvaluationSettings(value, evaluation.maxInvalidFraction()));
        }

        /** Largest fraction of invalid evaluations an iteration may have, in [0, 1]. */
        public Builder maxInvalidFraction(double value) {
            return evaluation(new EvaluationSettings(evaluation.retries(), value));
        }

        public SamplerSettings build() {
            return new SamplerSettings(this);
        }

        private static <T> T require(String name, T value) {
            if (value == null) {
                throw new IllegalArgumentException(name + " must not be null");
            }
            return value;
        }
    }
}
