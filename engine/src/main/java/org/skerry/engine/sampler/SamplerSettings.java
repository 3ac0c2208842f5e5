package org.skerry.engine.sampler;

import org.skerry.engine.model.Prior;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.temper.AdaptiveTemperature;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.TemperatureRule;

/**
 * Everything that determines a run's answer besides the model and the data: population size,
 * seed, resampling, tempering and moves. Immutable; build with {@link #builder()}, which checks
 * every value and names the setting it refuses.
 */
public final class SamplerSettings {

    private final int particles;
    private final long seed;
    private final ResamplingScheme resamplingScheme;
    private final double resampleThreshold;
    private final boolean resampleEveryIteration;
    private final TemperatureRule temperatureRule;
    private final SequenceSettings targets;
    private final MoveKernel moveKernel;
    private final int fixedSteps;
    private final double stayProbability;
    private final int maxSteps;
    private final double initialScale;
    private final double targetAcceptance;
    private final int maxIterations;
    private final Prior startProposal;
    private final int minimumDistinctEves;
    private final int islands;
    private final int islandInteractionEvery;
    private final double islandInteractionThreshold;
    private final int evaluationRetries;
    private final double maxInvalidFraction;

    private SamplerSettings(Builder b) {
        this.particles = b.particles;
        this.seed = b.seed;
        this.resamplingScheme = b.resamplingScheme;
        this.resampleThreshold = b.resampleThreshold;
        this.resampleEveryIteration = b.resampleEveryIteration;
        this.temperatureRule = b.temperatureRule;
        this.targets = b.targets;
        this.moveKernel = b.moveKernel;
        this.fixedSteps = b.fixedSteps;
        this.stayProbability = b.stayProbability;
        this.maxSteps = b.maxSteps;
        this.initialScale = b.initialScale;
        this.targetAcceptance = b.targetAcceptance;
        this.maxIterations = b.maxIterations;
        this.startProposal = b.startProposal;
        this.minimumDistinctEves = b.minimumDistinctEves;
        this.islands = b.islands;
        this.islandInteractionEvery = b.islandInteractionEvery;
        this.islandInteractionThreshold = b.islandInteractionThreshold;
        this.evaluationRetries = b.evaluationRetries;
        this.maxInvalidFraction = b.maxInvalidFraction;
        if (islands > particles) {
            throw new IllegalArgumentException("islands (" + islands + ") must not exceed particles (" + particles + ")");
        }
    }

    public static Builder builder() {
        return new Builder();
    }

    /** A builder holding this object's values. */
    public Builder toBuilder() {
        Builder b = new Builder();
        b.particles = particles;
        b.seed = seed;
        b.resamplingScheme = resamplingScheme;
        b.resampleThreshold = resampleThreshold;
        b.resampleEveryIteration = resampleEveryIteration;
        b.temperatureRule = temperatureRule;
        b.targets = targets;
        b.moveKernel = moveKernel;
        b.fixedSteps = fixedSteps;
        b.stayProbability = stayProbability;
        b.maxSteps = maxSteps;
        b.initialScale = initialScale;
        b.targetAcceptance = targetAcceptance;
        b.maxIterations = maxIterations;
        b.startProposal = startProposal;
        b.minimumDistinctEves = minimumDistinctEves;
        b.islands = islands;
        b.islandInteractionEvery = islandInteractionEvery;
        b.islandInteractionThreshold = islandInteractionThreshold;
        b.evaluationRetries = evaluationRetries;
        b.maxInvalidFraction = maxInvalidFraction;
        return b;
    }

    /** Number of particles N (at least 2). */
    public int particles() {
        return particles;
    }

    public long seed() {
        return seed;
    }

    public ResamplingScheme resamplingScheme() {
        return resamplingScheme;
    }

    /** Resample when ESS < threshold·N; in (0, 1], default 0.5 (common practice). */
    public double resampleThreshold() {
        return resampleThreshold;
    }

    /** Whether to resample at every iteration regardless of the ESS. */
    public boolean resampleEveryIteration() {
        return resampleEveryIteration;
    }

    public TemperatureRule temperatureRule() {
        return temperatureRule;
    }

    /** Which sequence of targets to walk: likelihood tempering unless data tempering is asked for. */
    public SequenceSettings targets() {
        return targets;
    }

    public MoveKernel moveKernel() {
        return moveKernel;
    }

    /** A fixed number of MH steps per iteration, or 0 to adapt it. */
    public int fixedSteps() {
        return fixedSteps;
    }

    /** With adaptive steps: the accepted chance c that a particle never moves in an iteration. */
    public double stayProbability() {
        return stayProbability;
    }

    /** Cap on adaptive MH steps per iteration. */
    public int maxSteps() {
        return maxSteps;
    }

    /** Initial random-walk scale λ (multiplies 2.38/√d). */
    public double initialScale() {
        return initialScale;
    }

    /** Acceptance rate the random-walk scale is steered towards. */
    public double targetAcceptance() {
        return targetAcceptance;
    }

    /**
     * The acceptance rate the random walk is steered towards in {@code dimension} dimensions: the
     * set value, or when it is automatic (NaN) 0.44 in one dimension (Roberts &amp; Rosenthal 2001,
     * Statistical Science 16(4)), 0.234 from five dimensions on (Roberts, Gelman &amp; Gilks 1997),
     * and linear in between (common practice).
     */
    public double targetAcceptance(int dimension) {
        if (!Double.isNaN(targetAcceptance)) {
            return targetAcceptance;
        }
        if (dimension <= 1) {
            return 0.44;
        }
        if (dimension >= 5) {
            return 0.234;
        }
        return 0.44 + (0.234 - 0.44) * (dimension - 1) / 4.0;
    }

    /** The run stops with an error if tempering has not reached 1 after this many iterations. */
    public int maxIterations() {
        return maxIterations;
    }

    /** The user's start distribution q, or {@code null} to start from the prior. */
    public Prior startProposal() {
        return startProposal;
    }

    /** Fewer distinct Eve indices than this flags the single-run evidence error as unreliable. */
    public int minimumDistinctEves() {
        return minimumDistinctEves;
    }

    /** Number of islands K, or 0 for global resampling. */
    public int islands() {
        return islands;
    }

    /** Island mode: resample globally (all islands interact) every this many iterations; 0 never. */
    public int islandInteractionEvery() {
        return islandInteractionEvery;
    }

    /** Island mode: resample globally when the ESS of the island weights falls below this fraction of K; 0 never. */
    public double islandInteractionThreshold() {
        return islandInteractionThreshold;
    }

    /**
     * How many times an invalid likelihood call (NaN, {@code +Infinity}, an exception) is repeated,
     * with the same random stream, before it counts as invalid; default 0.
     */
    public int evaluationRetries() {
        return evaluationRetries;
    }

    /**
     * The run stops when more than this fraction of one iteration's likelihood evaluations are
     * invalid; in [0, 1], default 0.1 (1 never stops).
     */
    public double maxInvalidFraction() {
        return maxInvalidFraction;
    }

    /** Builder for {@link SamplerSettings}; each setter validates its argument. */
    public static final class Builder {
        private int particles = 1000;
        private long seed = 1;
        // Multinomial: the only scheme the single-run evidence error is calibrated for (EvidenceError).
        private ResamplingScheme resamplingScheme = ResamplingScheme.MULTINOMIAL;
        private double resampleThreshold = 0.5;
        private boolean resampleEveryIteration;
        private TemperatureRule temperatureRule = new AdaptiveTemperature(AdaptiveTemperature.DEFAULT_TARGET);
        private SequenceSettings targets = SequenceSettings.LIKELIHOOD_TEMPERING;
        private MoveKernel moveKernel = MoveKernel.RANDOM_WALK;
        private int fixedSteps;
        private double stayProbability = 0.01;
        private int maxSteps = 20;
        private double initialScale = 1.0;
        private double targetAcceptance = Double.NaN;
        private int maxIterations = 1000;
        private Prior startProposal;
        private int minimumDistinctEves = 20;
        private int islands;
        private int islandInteractionEvery;
        private double islandInteractionThreshold;
        private int evaluationRetries;
        private double maxInvalidFraction = 0.1;

        private Builder() {
        }

        /** Retries of an invalid likelihood call, in [0, 100]. */
        public Builder evaluationRetries(int value) {
            if (value < 0 || value > 100) {
                throw new IllegalArgumentException("evaluationRetries must be in [0, 100], was " + value);
            }
            evaluationRetries = value;
            return this;
        }

        /** Largest fraction of invalid evaluations an iteration may have, in [0, 1]. */
        public Builder maxInvalidFraction(double value) {
            if (!(value >= 0 && value <= 1)) {
                throw new IllegalArgumentException("maxInvalidFraction must be in [0, 1], was " + value);
            }
            maxInvalidFraction = value;
            return this;
        }

        /** K islands, each resampling on its own (0: global resampling). */
        public Builder islands(int value) {
            if (value < 0) {
                throw new IllegalArgumentException("islands must be >= 0, was " + value);
            }
            islands = value;
            return this;
        }

        public Builder islandInteractionEvery(int value) {
            if (value < 0) {
                throw new IllegalArgumentException("islandInteractionEvery must be >= 0, was " + value);
            }
            islandInteractionEvery = value;
            return this;
        }

        public Builder islandInteractionThreshold(double value) {
            if (!(value >= 0 && value <= 1)) {
                throw new IllegalArgumentException("islandInteractionThreshold must be in [0, 1], was " + value);
            }
            islandInteractionThreshold = value;
            return this;
        }

        public Builder particles(int value) {
            if (value < 2) {
                throw new IllegalArgumentException("particles must be >= 2, was " + value);
            }
            particles = value;
            return this;
        }

        public Builder seed(long value) {
            seed = value;
            return this;
        }

        public Builder resamplingScheme(ResamplingScheme value) {
            resamplingScheme = require("resamplingScheme", value);
            return this;
        }

        public Builder resampleThreshold(double value) {
            if (!(value > 0 && value <= 1)) {
                throw new IllegalArgumentException("resampleThreshold must be in (0, 1], was " + value);
            }
            resampleThreshold = value;
            return this;
        }

        public Builder resampleEveryIteration(boolean value) {
            resampleEveryIteration = value;
            return this;
        }

        public Builder targets(SequenceSettings value) {
            targets = require("targets", value);
            return this;
        }

        public Builder temperatureRule(TemperatureRule value) {
            temperatureRule = require("temperatureRule", value);
            return this;
        }

        public Builder moveKernel(MoveKernel value) {
            moveKernel = require("moveKernel", value);
            return this;
        }

        /** A fixed number of MH steps per iteration (>= 1), or 0 to adapt it. */
        public Builder fixedSteps(int value) {
            if (value < 0 || value >= 65536) {
                throw new IllegalArgumentException("fixedSteps must be in [0, 65535], was " + value);
            }
            fixedSteps = value;
            return this;
        }

        public Builder stayProbability(double value) {
            if (!(value > 0 && value < 1)) {
                throw new IllegalArgumentException("stayProbability must be in (0, 1), was " + value);
            }
            stayProbability = value;
            return this;
        }

        public Builder maxSteps(int value) {
            if (value < 1 || value >= 65536) {
                throw new IllegalArgumentException("maxSteps must be in [1, 65535], was " + value);
            }
            maxSteps = value;
            return this;
        }

        public Builder initialScale(double value) {
            if (!(value > 0) || !Double.isFinite(value)) {
                throw new IllegalArgumentException("initialScale must be positive and finite, was " + value);
            }
            initialScale = value;
            return this;
        }

        public Builder targetAcceptance(double value) {
            if (!Double.isNaN(value) && !(value > 0 && value < 1)) {
                throw new IllegalArgumentException("targetAcceptance must be in (0, 1) or NaN (automatic), was "
                        + value);
            }
            targetAcceptance = value;
            return this;
        }

        public Builder maxIterations(int value) {
            if (value < 1) {
                throw new IllegalArgumentException("maxIterations must be >= 1, was " + value);
            }
            maxIterations = value;
            return this;
        }

        /** Start from a user distribution q instead of the prior ({@code null} for the prior). */
        public Builder startProposal(Prior value) {
            startProposal = value;
            return this;
        }

        public Builder minimumDistinctEves(int value) {
            if (value < 1) {
                throw new IllegalArgumentException("minimumDistinctEves must be >= 1, was " + value);
            }
            minimumDistinctEves = value;
            return this;
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
