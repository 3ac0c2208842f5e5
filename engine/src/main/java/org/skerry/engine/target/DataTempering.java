package org.skerry.engine.target;

import java.util.Arrays;
import java.util.List;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ObservationLikelihood;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockReports.Increments;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * Data tempering: targets that add observations in batches, {@code prior × L(y_1 … y_k)} for
 * k = 0 … n (Chopin 2002, Biometrika 89(3)), for a model whose likelihood factorises over its
 * observations ({@link ObservationLikelihood}). A particle's incremental weight is the likelihood
 * of the batch added, evaluated where the blocks live; its log-likelihood then covers the first k
 * observations, and the moves keep {@code prior × L(y_1 … y_k)} invariant.
 *
 * <p>Batches are of a fixed size, or chosen adaptively: the blocks evaluate each particle's
 * per-observation terms over a window of the next observations, and the driver takes the
 * largest batch whose conditional ESS fraction stays at or above the target (Zhou, Johansen
 * &amp; Aston 2016, JCGS 25(3)), at least one observation. The window costs one evaluation pass
 * more per iteration than a fixed batch; its terms travel as {@code window} scalars per particle.
 */
public final class DataTempering implements TargetSequence {

    /** The random-stream step of a batch's evaluations: above every MH step, so no stream is shared. */
    static final int BATCH_STEP = RandomStream.MAX_STEP - 1;

    private final int count;
    private final int batch;
    private final int window;
    private final double target;
    private final int retries;
    private final long seed;

    /**
     * @param count    observations n of the model
     * @param settings fixed or adaptive batches (already checked by {@link SequenceSettings})
     * @param seed     the run's seed, which keys a stochastic model's streams
     * @param retries  how often an invalid evaluation is repeated
     */
    public DataTempering(int count, SequenceSettings settings, long seed, int retries) {
        if (count < 1) {
            throw new IllegalArgumentException("the model must have at least 1 observation, has " + count);
        }
        if (settings.kind() != SequenceSettings.Kind.DATA_TEMPERING) {
            throw new IllegalArgumentException("settings must ask for data tempering, were " + settings);
        }
        if (retries < 0) {
            throw new IllegalArgumentException("retries must be >= 0, was " + retries);
        }
        this.count = count;
        this.batch = settings.batch();
        this.window = settings.window();
        this.target = settings.target();
        this.seed = seed;
        this.retries = retries;
    }

    @Override
    public Target first() {
        return new DataTarget(0, count);
    }

    @Override
    public Target at(double progress) {
        if (!(progress >= 0 && progress <= 1)) {
            throw new IllegalArgumentException("progress must be in [0, 1], was " + progress);
        }
        return new DataTarget(progress >= 1.0 ? count : (int) Math.round(progress * count), count);
    }

    @Override
    public Step advance(Target current, TemperingInputs inputs, double logTotal, Population population,
            int iteration) {
        int from = ((DataTarget) current).observations();
        int to = batch > 0 ? Math.min(count, from + batch) : adaptiveEnd(from, inputs, logTotal, population, iteration);
        ObservationRange added = new ObservationRange(from, to, count);
        long streamSeed = seed;
        int tries = retries;
        List<Increments> blocks = population.update(cursor -> {
            ParticleBlock block = cursor.block();
            LikelihoodEvaluator evaluator = new LikelihoodEvaluator(cursor.model(), streamSeed, tries, added);
            double[] increment = new double[block.size()];
            double[] x = new double[block.dimension()];
            for (int i = 0; i < block.size(); i++) {
                if (block.logWeight()[i] == Double.NEGATIVE_INFINITY) {
                    continue;
                }
                System.arraycopy(block.values(), i * x.length, x, 0, x.length);
                increment[i] = evaluator.evaluate(x, block.index()[i], iteration, BATCH_STEP);
                block.logLikelihood()[i] += increment[i];
                block.logWeight()[i] += increment[i];
            }
            return new Increments(increment, evaluator.drainTally());
        });
        double[] increment = new double[inputs.size()];
        EvaluationTally tally = EvaluationTally.NONE;
        int offset = 0;
        for (Increments block : blocks) {
            System.arraycopy(block.logIncrement(), 0, increment, offset, block.logIncrement().length);
            offset += block.logIncrement().length;
            tally = tally.plus(block.tally());
        }
        return new Step(new DataTarget(to, count), increment, tally);
    }

    /**
     * The end of the largest batch from {@code from} whose conditional ESS fraction stays at or
     * above the target, at least {@code from + 1}.
     */
    private int adaptiveEnd(int from, TemperingInputs inputs, double logTotal, Population population, int iteration) {
        int width = Math.min(window, count - from);
        if (width == 1) {
            return from + 1;
        }
        long streamSeed = seed;
        List<double[]> parts = population.read(cursor -> windowTerms(cursor.current(), cursor.model(), from, width,
                streamSeed, iteration));
        int n = inputs.size();
        double[] cumulative = new double[n * width];
        int offset = 0;
        for (double[] part : parts) {
            System.arraycopy(part, 0, cumulative, offset, part.length);
            offset += part.length;
        }
        int chosen = 1;
        for (int m = 2; m <= width; m++) {
            if (conditionalFraction(inputs.logWeight(), logTotal, cumulative, width, m) < target) {
                break;
            }
            chosen = m;
        }
        return from + chosen;
    }

    /**
     * Block side: each particle's running sums of its per-observation log-likelihood terms over
     * {@code [from, from + width)}, {@code width} values a particle; an invalid term ends the
     * particle's sums at {@code -Infinity} (the batch's own evaluation then counts and reports it).
     */
    private static double[] windowTerms(ParticleBlock block, Model model, int from, int width, long seed,
            int iteration) {
        ObservationLikelihood observations = ObservationLikelihood.of(model);
        int d = block.dimension();
        double[] sums = new double[block.size() * width];
        double[] terms = new double[width];
        double[] x = new double[d];
        WindowContext context = new WindowContext(seed, iteration);
        for (int i = 0; i < block.size(); i++) {
            if (block.logWeight()[i] == Double.NEGATIVE_INFINITY) {
                continue;
            }
            System.arraycopy(block.values(), i * d, x, 0, d);
            context.at(block.index()[i]);
            try {
                observations.logLikelihoodTerms(x, from, from + width, terms, context);
            } catch (RuntimeException e) {
                Arrays.fill(terms, Double.NaN);
            }
            double running = 0;
            for (int j = 0; j < width; j++) {
                double term = terms[j];
                running = Double.isNaN(term) || term == Double.POSITIVE_INFINITY || running == Double.NEGATIVE_INFINITY
                        ? Double.NEGATIVE_INFINITY : running + term;
                sums[i * width + j] = running;
            }
        }
        return sums;
    }

    /** The conditional ESS fraction of adding the first {@code m} observations of the window. */
    static double conditionalFraction(double[] logWeight, double logTotal, double[] cumulative, int width, int m) {
        int n = logWeight.length;
        double max = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n; i++) {
            if (logWeight[i] != Double.NEGATIVE_INFINITY) {
                max = Math.max(max, cumulative[i * width + m - 1]);
            }
        }
        if (max == Double.NEGATIVE_INFINITY) {
            return 0.0;
        }
        ExactSum first = new ExactSum();
        ExactSum second = new ExactSum();
        for (int i = 0; i < n; i++) {
            if (logWeight[i] == Double.NEGATIVE_INFINITY) {
                continue;
            }
            double w = StrictMath.exp(logWeight[i] - logTotal);
            double g = StrictMath.exp(cumulative[i * width + m - 1] - max);
            first.add(w * g);
            second.add(w * g * g);
        }
        double numerator = first.doubleValue();
        double denominator = second.doubleValue();
        return denominator > 0 ? numerator * numerator / denominator : 0.0;
    }

    @Override
    public String description() {
        return "data tempering (" + (batch > 0 ? "batches of " + batch : "adaptive batches up to " + window
                + ", conditional ESS " + target) + ", " + count + " observations)";
    }

    /** The keyed stream a stochastic model sees while its window is evaluated. */
    private static final class WindowContext implements LikelihoodContext {
        private final long seed;
        private final int iteration;
        private final RandomStream stream;
        private long particle;

        WindowContext(long seed, int iteration) {
            this.seed = seed;
            this.iteration = iteration;
            this.stream = new RandomStream(seed, StreamPurpose.SIMULATOR, iteration, 0, BATCH_STEP);
        }

        /** Restarts the stream for the particle with global index {@code particle}, as the evaluator does. */
        void at(long particle) {
            this.particle = particle;
            stream.reset(seed, StreamPurpose.SIMULATOR, iteration, particle, BATCH_STEP);
        }

        @Override
        public RandomStream random() {
            return stream;
        }

        @Override
        public long particleIndex() {
            return particle;
        }

        @Override
        public int iteration() {
            return iteration;
        }
    }
}
