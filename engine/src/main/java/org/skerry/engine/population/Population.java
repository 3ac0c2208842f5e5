package org.skerry.engine.population;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.abc.AbcBlocks;
import org.skerry.engine.abc.AbcTarget;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.MetropolisHastingsMover;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockReports.Drawn;
import org.skerry.engine.population.BlockReports.Moved;
import org.skerry.engine.population.BlockReports.Resampled;
import org.skerry.engine.population.BlockReports.Totals;
import org.skerry.engine.population.BlockReports.Weights;
import org.skerry.engine.population.block.BlockReading;
import org.skerry.engine.population.block.InitialDraw;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.population.block.MomentCollector;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.IslandResampling;
import org.skerry.engine.resample.OffspringCounter;
import org.skerry.engine.resample.ParticleExpansion;
import org.skerry.engine.resample.Redistribution;
import org.skerry.engine.resample.ResamplingPlanner;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualSplit;
import org.skerry.engine.resample.ResidualTotals;
import org.skerry.engine.resample.WeightQuantiser;
import org.skerry.engine.target.Target;
import org.skerry.engine.weight.LogWeights;

/**
 * A population of particles, seen from the driver: each step of an iteration written once, as
 * block steps a {@link BlockExecutor} runs where the blocks live. Every operation returns only
 * scalars per particle or sums per block; parameter vectors stay with the blocks until the
 * final population streams out ({@link #forEachRun}, {@link #column}). Results do not depend on how particles are grouped into blocks or on the
 * order in which blocks finish.
 *
 * <p>A change whose result the driver does not need at once (a reweighting) is held and run as
 * part of the next block step, so it costs no round trip of its own.
 */
public final class Population implements AutoCloseable {

    private final BlockExecutor blocks;
    private final int size;
    private final int dimension;
    private final long seed;
    private final int retries;
    /** A change to run on every block before the next step, or null. */
    private BlockStep<?> pending;

    /**
     * @param blocks    where the blocks live
     * @param size      particles N
     * @param dimension parameters d
     * @param seed      the run's seed, which keys every random stream
     * @param retries   how often an invalid likelihood evaluation is repeated
     */
    public Population(BlockExecutor blocks, int size, int dimension, long seed, int retries) {
        if (size < 1) {
            throw new IllegalArgumentException("size must be >= 1, was " + size);
        }
        if (retries < 0) {
            throw new IllegalArgumentException("retries must be >= 0, was " + retries);
        }
        this.blocks = blocks;
        this.size = size;
        this.dimension = dimension;
        this.seed = seed;
        this.retries = retries;
    }

    /** Number of particles N. */
    public int size() {
        return size;
    }

    /** Where the blocks live (for tests and diagnostics). */
    public BlockExecutor executor() {
        return blocks;
    }

    /** Number of blocks. */
    public int blockCount() {
        return blocks.blockCount();
    }

    /** The initial draw's counts and the tempering inputs of the drawn population. */
    public record Start(EvaluationTally tally, TemperingInputs inputs) {
    }

    /**
     * Draws the initial particles (from the prior, or from {@code proposal} with importance weights
     * prior / proposal) in blocks of ⌊N/K⌋ or ⌈N/K⌉ particles (the first N mod K larger), and
     * evaluates the log-likelihood {@code target} uses.
     */
    public Start initialise(Prior proposal, Target target) {
        int count = blocks.blockCount();
        long[] first = new long[count];
        int[] sizes = new int[count];
        long running = 0;
        for (int b = 0; b < count; b++) {
            sizes[b] = size / count + (b < size % count ? 1 : 0);
            first[b] = running;
            running += sizes[b];
        }
        long streamSeed = seed;
        int tries = retries;
        List<Drawn> drawn = blocks.create(first, sizes, cursor -> {
            ParticleBlock block = cursor.block();
            // An ABC target simulates instead of evaluating, and keeps each particle's summaries.
            EvaluationTally tally = target instanceof AbcTarget abc
                    ? AbcBlocks.draw(block, proposal, abc, cursor.model(), streamSeed, tries)
                    : InitialDraw.draw(block, proposal,
                            new LikelihoodEvaluator(cursor.model(), streamSeed, tries, target), streamSeed);
            return new Drawn(tally, Weights.of(block));
        });
        EvaluationTally total = EvaluationTally.NONE;
        List<Weights> weights = new ArrayList<>(drawn.size());
        for (Drawn block : drawn) {
            total = total.plus(block.tally());
            weights.add(block.weights());
        }
        return new Start(total, TemperingInputs.of(weights, size));
    }

    /** Current log-weights and log-likelihoods of all particles (16 bytes a particle). */
    public TemperingInputs temperingInputs() {
        return TemperingInputs.of(read(cursor -> Weights.of(cursor.current())), size);
    }

    /**
     * Holds {@code change} and runs it on every block at the start of the next step (it must
     * not need the driver to see its result).
     */
    public void defer(BlockStep<?> change) {
        pending = pending == null ? change : pending.then(change);
    }

    /** Runs {@code step} on every block (after any deferred change); results in block order. */
    public <R> List<R> update(BlockStep<R> step) {
        BlockStep<R> whole = pending == null ? step : pending.then(step);
        pending = null;
        return blocks.update(whole);
    }

    /** Runs {@code query}, which changes nothing, on every block (after any deferred change). */
    public <R> List<R> read(BlockStep<R> query) {
        return pending == null ? blocks.read(query) : update(query);
    }

    /** Weighted moment sums on the unconstrained scale, weights normalised by {@code logTotal}. */
    public MomentSums moments(double logTotal) {
        MomentSums total = new MomentSums(dimension);
        for (MomentSums part : read(cursor -> MomentCollector.collect(cursor.current(),
                cursor.model().parameters(), logTotal))) {
            total.merge(part);
        }
        return total;
    }

    /** What resampling did, and the moment sums of the survivors at their new log total. */
    public record Resampling(ResamplingReport report, MomentSums moments) {
    }

    /**
     * Resamples by normalised weight with {@code scheme}, gives every survivor weight 1 (log 0),
     * renumbers particles canonically (ancestor order, then copy number) and rebalances the
     * blocks. Blocks quantise their weights and report totals; the driver plans; blocks count
     * offspring, expand and sum the survivors' moments at log N; only the runs of surplus
     * copies then move between blocks.
     *
     * @param logTotal log of the current weight total, as computed by the driver
     */
    public Resampling resample(ResamplingScheme scheme, double logTotal, int iteration) {
        List<Totals> totals = read(cursor -> {
            ParticleBlock block = cursor.current();
            return new Totals(block.size() == 0 ? -1 : block.index()[0], block.size(),
                    WeightQuantiser.quantise(block.logWeight(), block.size(), logTotal, new long[block.size()]));
        });
        int count = totals.size();
        long[] first = new long[count];
        int[] sizes = new int[count];
        long[] weightTotals = new long[count];
        long running = 0;
        for (int b = 0; b < count; b++) {
            Totals t = totals.get(b);
            sizes[b] = t.size();
            first[b] = t.size() == 0 ? running : t.firstIndex();
            weightTotals[b] = t.weightTotal();
            running = first[b] + sizes[b];
        }
        BlockLayout layout = BlockLayout.of(first, sizes);
        BlockResamplingPlan[] plans;
        ResidualSplit split = null;
        if (scheme == ResamplingScheme.RESIDUAL) {
            split = ResamplingPlanner.residualSplit(layout, weightTotals);
            ResidualSplit residual = split;
            List<ResidualTotals> parts = read(cursor -> {
                ParticleBlock block = cursor.current();
                long[] q = new long[block.size()];
                WeightQuantiser.quantise(block.logWeight(), block.size(), logTotal, q);
                return OffspringCounter.splitResidual(residual, q, block.size(), new int[block.size()]);
            });
            plans = ResamplingPlanner.planResidual(seed, iteration, layout, split, parts.toArray(new ResidualTotals[0]));
        } else {
            plans = ResamplingPlanner.plan(scheme, seed, iteration, layout, weightTotals);
        }
        BlockResamplingPlan[] sentPlans = plans;
        ResidualSplit sentSplit = split;
        double logN = StrictMath.log(size);
        long start = System.nanoTime();
        List<Resampled> expanded = update(cursor -> {
            ParticleBlock block = cursor.current();
            long[] q = new long[block.size()];
            WeightQuantiser.quantise(block.logWeight(), block.size(), logTotal, q);
            int[] offspring = new int[block.size()];
            if (sentSplit != null) {
                OffspringCounter.splitResidual(sentSplit, q, block.size(), offspring);
            }
            BlockResamplingPlan plan = sentPlans[cursor.number()];
            OffspringCounter.count(plan, q, block.size(), offspring);
            long distinct = ParticleExpansion.distinctAncestors(offspring, block.size());
            ParticleBlock children = ParticleExpansion.expand(block, offspring, plan.firstNewIndex());
            cursor.replace(children);
            // Exact sums: the same before and after the survivors are rebalanced.
            return new Resampled(distinct, MomentCollector.collect(children, cursor.model().parameters(), logN));
        });
        Redistribution redistribution = Redistribution.plan(ResamplingPlanner.expandedLayout(plans));
        if (redistribution.transferCount() > 0) {
            blocks.exchange(redistribution);
        }
        long distinct = 0;
        MomentSums moments = new MomentSums(dimension);
        for (Resampled block : expanded) {
            distinct += block.distinctAncestors();
            moments.merge(block.moments());
        }
        return new Resampling(new ResamplingReport(distinct, redistribution.movedCount(),
                (System.nanoTime() - start) * 1e-9), moments);
    }

    /**
     * Island resampling: every block (island) resamples its own particles by their weights within
     * the island, keeps its size and its run of global indices, and gives each survivor the
     * island's mean weight, so the island's total weight is carried on (Vergé, Dubarry, Del Moral
     * &amp; Moulines 2015, Statistics and Computing 25). No particle changes block.
     *
     * @param logTotal log of the weight total after island resampling, for the moment sums
     */
    public Resampling resampleIslands(ResamplingScheme scheme, int iteration, double logTotal) {
        long streamSeed = seed;
        List<Resampled> islands = update(cursor -> {
            IslandResampling.Result result = IslandResampling.resample(cursor.current(), scheme, streamSeed,
                    iteration);
            cursor.replace(result.block());
            return new Resampled(result.distinctAncestors(),
                    MomentCollector.collect(result.block(), cursor.model().parameters(), logTotal));
        });
        long distinct = 0;
        MomentSums moments = new MomentSums(dimension);
        for (Resampled island : islands) {
            distinct += island.distinctAncestors();
            moments.merge(island.moments());
        }
        return new Resampling(new ResamplingReport(distinct, 0), moments);
    }

    /** What moves did, and the tempering inputs afterwards when asked for (else null). */
    public record Moves(MoveTally tally, TemperingInputs inputs) {
    }

    /**
     * Metropolis–Hastings steps {@code firstStep … firstStep+steps−1} of every living particle,
     * invariant for {@code target} (ABC moves for an ABC target); with {@code withInputs} the blocks also send the tempering
     * inputs the next target's choice needs, so they cost no round trip of their own.
     */
    public Moves move(Proposal proposal, Target target, int iteration, int firstStep, int steps, boolean withInputs) {
        long streamSeed = seed;
        int tries = retries;
        List<Moved> moved = update(cursor -> {
            ParticleBlock block = cursor.block();
            MoveTally tally = target instanceof AbcTarget abc
                    ? AbcBlocks.move(block, proposal, abc, iteration, firstStep, steps, cursor.model(), streamSeed, tries)
                    : MetropolisHastingsMover.move(block, proposal, target, iteration, firstStep, steps,
                            new LikelihoodEvaluator(cursor.model(), streamSeed, tries, target), streamSeed);
            return new Moved(tally, withInputs ? Weights.of(block) : null);
        });
        MoveTally total = MoveTally.NONE;
        List<Weights> weights = new ArrayList<>(moved.size());
        for (Moved block : moved) {
            total = total.plus(block.tally());
            weights.add(block.weights());
        }
        return new Moves(total, withInputs ? TemperingInputs.of(weights, size) : null);
    }

    /**
     * {@code log Σ exp(logWeight)} over the whole population, the same double as
     * {@link LogWeights#logSum} over all log-weights in one array: the
     * maximum and then the exact sum of {@code exp(logWeight − max)} are gathered per block (two
     * queries of one scalar or one exact sum a block), and exact sums do not depend on grouping.
     */
    public double logWeightTotal() {
        double max = Double.NEGATIVE_INFINITY;
        for (double[] part : read(cursor -> new double[] {
                LogWeights.max(cursor.current().logWeight(), cursor.current().size())})) {
            max = Math.max(max, part[0]);
        }
        if (max == Double.NEGATIVE_INFINITY) {
            return max;
        }
        double shift = max;
        ExactSum sum = new ExactSum();
        for (long[] part : read(cursor -> {
            ParticleBlock block = cursor.current();
            ExactSum own = new ExactSum();
            for (int i = 0; i < block.size(); i++) {
                own.add(StrictMath.exp(block.logWeight()[i] - shift));
            }
            return own.toCompactArray();
        })) {
            sum.add(ExactSum.fromCompactArray(part));
        }
        return max + StrictMath.log(sum.doubleValue());
    }

    /** What {@link #forEachRun} hands on: the run as the blocks hold it, and the same run as rows. */
    @FunctionalInterface
    public interface RunVisitor {
        /** {@code run}'s arrays may be longer than {@code rows.count()}; only that many particles are the run's. */
        void accept(ParticleBlock run, ParticleRows rows);
    }

    /**
     * Streams the population in canonical order as runs of consecutive particles, a bounded number
     * in the driver's memory at a time (as {@link BlockExecutor#forEachBlock} fetches them), with
     * weights normalised by {@code logTotal} ({@link #logWeightTotal()}): {@code exp(logWeight −
     * logTotal)}, as {@link LogWeights#normalise} computes them.
     *
     * @throws IllegalStateException if the blocks do not hold particles 0 … N−1 in block order,
     *     which every step keeps
     */
    public void forEachRun(double logTotal, RunVisitor visitor) {
        if (pending != null) {
            update(cursor -> null);
        }
        int d = dimension;
        long[] next = {0};
        blocks.forEachBlock(block -> {
            int count = block.size();
            if (count == 0) {
                return;
            }
            long[] index = block.index();
            for (int i = 0; i < count; i++) {
                if (index[i] != next[0] + i) {
                    throw new IllegalStateException("the blocks are not in canonical order: particle "
                            + (next[0] + i) + " expected, " + index[i] + " found");
                }
            }
            double[] logWeight = block.logWeight();
            double[] weights = new double[count];
            for (int i = 0; i < count; i++) {
                weights[i] = StrictMath.exp(logWeight[i] - logTotal);
            }
            visitor.accept(block, new ParticleRows(next[0], count, d, block.values(), weights, block.logLikelihood(),
                    block.logPrior()));
            next[0] += count;
        });
        if (next[0] != size) {
            throw new IllegalStateException("the blocks hold " + next[0] + " particles, not " + size);
        }
    }

    /**
     * Parameter {@code k} of every particle, in canonical order: one query returning one double a
     * particle, so that summaries need one column in the driver at a time, never the whole population.
     * One job's results hold 8 bytes a particle, half of what each iteration's tempering inputs
     * already gather in one job, so this adds no limit on N that the iterations do not have.
     */
    public double[] column(int k) {
        if (k < 0 || k >= dimension) {
            throw new IllegalArgumentException("parameter must be in [0, " + dimension + "), was " + k);
        }
        int d = dimension;
        double[] column = new double[size];
        for (double[] part : read(cursor -> {
            ParticleBlock block = cursor.current();
            double[] own = new double[block.size() + 1];
            own[0] = block.size() == 0 ? 0 : block.index()[0];
            for (int i = 0; i < block.size(); i++) {
                own[i + 1] = block.values()[i * d + k];
            }
            return own;
        })) {
            System.arraycopy(part, 1, column, (int) part[0], part.length - 1);
        }
        return column;
    }

    /** All particles in canonical order, held whole in the driver: for tests and small populations. */
    public FinalParticles export() {
        if (pending != null) {
            update(cursor -> null);
        }
        double[] values = new double[size * dimension];
        double[] logWeight = new double[size];
        double[] logPrior = new double[size];
        double[] logLikelihood = new double[size];
        long[] index = new long[size];
        long[] eve = new long[size];
        int d = dimension;
        // Global indices are always a permutation of 0..N-1, so scattering by index sorts.
        blocks.forEachBlock(block -> {
            for (int i = 0; i < block.size(); i++) {
                int at = (int) block.index()[i];
                System.arraycopy(block.values(), i * d, values, at * d, d);
                logWeight[at] = block.logWeight()[i];
                logPrior[at] = block.logPrior()[i];
                logLikelihood[at] = block.logLikelihood()[i];
                index[at] = block.index()[i];
                eve[at] = block.eve()[i];
            }
        });
        return new FinalParticles(d, size, values, logWeight, logPrior, logLikelihood, index, eve);
    }

    /**
     * Writes every block through {@code store}, in parallel where the blocks live; from then on
     * a lost block is read back from those files instead of being recomputed.
     *
     * @return one entry per block, in block order
     * @throws java.io.UncheckedIOException when a block cannot be written
     */
    public List<StoredBlock> writeBlocks(BlockStore store) {
        if (pending != null) {
            update(cursor -> null);
        }
        return blocks.write(store);
    }

    /**
     * Replaces the population with the blocks of a checkpoint, in the checkpoint's layout (block
     * count and sizes), whatever the backend's own default layout.
     *
     * @return what is wrong with the checkpoint (one line per damaged or missing block, naming
     *         its file), empty when every block read back; when not empty the population is
     *         unchanged
     */
    public List<String> readBlocks(BlockStore store, List<StoredBlock> stored) {
        long[] first = StoredBlock.firstIndices(stored);
        long running = stored.stream().mapToLong(StoredBlock::particles).sum();
        if (running != size) {
            return List.of("the checkpoint's blocks hold " + running + " particles; the run has " + size);
        }
        int d = dimension;
        pending = null;
        return blocks.read(stored, (number, block) -> BlockReading.read(store, block, first[number], d));
    }

    /** Releases the blocks; the backend stays open. */
    @Override
    public void close() {
        pending = null;
        blocks.close();
    }
}
