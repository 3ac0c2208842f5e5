package org.skerry.engine.population.threads;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.PopulationSnapshot;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.population.block.BlockReading;
import org.skerry.engine.population.block.InitialDraw;
import org.skerry.engine.population.block.IslandResampling;
import org.skerry.engine.population.block.LikelihoodEvaluator;
import org.skerry.engine.population.block.MetropolisHastingsMover;
import org.skerry.engine.population.block.MomentCollector;
import org.skerry.engine.population.block.Reweighting;
import org.skerry.engine.resample.ResamplingScheme;

/**
 * A population held as blocks in this JVM. Each operation runs the shared block-side code on
 * every block through the backend's thread pool, then merges the per-block results with
 * order-independent sums.
 */
final class ThreadPopulation implements Population {

    private final ThreadPoolBackend backend;
    private final Model model;
    private final int size;
    private final long seed;
    private final int retries;
    private List<ParticleBlock> blocks;

    ThreadPopulation(ThreadPoolBackend backend, Model model, int size, long seed, int blockCount, int retries) {
        this.backend = backend;
        this.retries = retries;
        this.model = model;
        this.size = size;
        this.seed = seed;
        this.blocks = new ArrayList<>(blockCount);
        int d = model.dimension();
        long first = 0;
        for (int b = 0; b < blockCount; b++) {
            int count = size / blockCount + (b < size % blockCount ? 1 : 0);
            ParticleBlock block = new ParticleBlock(d, count);
            block.resize(count);
            for (int i = 0; i < count; i++) {
                block.index()[i] = first + i;
            }
            first += count;
            blocks.add(block);
        }
    }

    @Override
    public int size() {
        return size;
    }

    /** Number of blocks (for tests). */
    int blockCount() {
        return blocks.size();
    }

    @Override
    public EvaluationTally initialise(Prior proposal) {
        List<EvaluationTally> tallies = backend.map(blocks,
                block -> InitialDraw.draw(block, proposal, new LikelihoodEvaluator(model, seed, retries), seed));
        EvaluationTally total = EvaluationTally.NONE;
        for (EvaluationTally tally : tallies) {
            total = total.plus(tally);
        }
        return total;
    }

    @Override
    public TemperingInputs temperingInputs() {
        double[] logWeight = new double[size];
        double[] logPrior = new double[size];
        double[] logLikelihood = new double[size];
        int[] blockSizes = new int[blocks.size()];
        int offset = 0;
        for (int b = 0; b < blocks.size(); b++) {
            ParticleBlock block = blocks.get(b);
            System.arraycopy(block.logWeight(), 0, logWeight, offset, block.size());
            System.arraycopy(block.logLikelihood(), 0, logLikelihood, offset, block.size());
            blockSizes[b] = block.size();
            offset += block.size();
        }
        return new TemperingInputs(logWeight, logLikelihood, size, blockSizes);
    }

    @Override
    public void reweight(double fromTemperature, double toTemperature) {
        backend.map(blocks, block -> {
            Reweighting.reweight(block, fromTemperature, toTemperature);
            return null;
        });
    }

    @Override
    public ResamplingReport resample(ResamplingScheme scheme, double logTotal, int iteration) {
        BlockResampling.Result result = BlockResampling.resample(backend, blocks, scheme, logTotal, seed, iteration);
        blocks = result.blocks();
        return result.report();
    }

    @Override
    public ResamplingReport resampleIslands(ResamplingScheme scheme, int iteration) {
        List<IslandResampling.Result> results = backend.map(blocks,
                block -> IslandResampling.resample(block, scheme, seed, iteration));
        List<ParticleBlock> next = new ArrayList<>(results.size());
        long distinct = 0;
        for (IslandResampling.Result result : results) {
            next.add(result.block());
            distinct += result.distinctAncestors();
        }
        blocks = next;
        return new ResamplingReport(distinct, 0);
    }

    @Override
    public MomentSums moments(double logTotal) {
        List<MomentSums> parts = backend.map(blocks,
                block -> MomentCollector.collect(block, model.parameters(), logTotal));
        MomentSums total = new MomentSums(model.dimension());
        for (MomentSums part : parts) {
            total.merge(part);
        }
        return total;
    }

    @Override
    public MoveTally move(Proposal proposal, double temperature, int iteration, int firstStep, int steps) {
        List<MoveTally> tallies = backend.map(blocks, block -> MetropolisHastingsMover.move(block, proposal,
                temperature, iteration, firstStep, steps, new LikelihoodEvaluator(model, seed, retries), seed));
        MoveTally total = MoveTally.NONE;
        for (MoveTally tally : tallies) {
            total = total.plus(tally);
        }
        return total;
    }

    @Override
    public FinalParticles export() {
        int d = model.dimension();
        double[] values = new double[size * d];
        double[] logWeight = new double[size];
        double[] logPrior = new double[size];
        double[] logLikelihood = new double[size];
        long[] index = new long[size];
        long[] eve = new long[size];
        // Global indices are always a permutation of 0..N-1, so scattering by index sorts.
        for (ParticleBlock block : blocks) {
            for (int i = 0; i < block.size(); i++) {
                int at = (int) block.index()[i];
                System.arraycopy(block.values(), i * d, values, at * d, d);
                logWeight[at] = block.logWeight()[i];
                logPrior[at] = block.logPrior()[i];
                logLikelihood[at] = block.logLikelihood()[i];
                index[at] = block.index()[i];
                eve[at] = block.eve()[i];
            }
        }
        return new FinalParticles(d, size, values, logWeight, logPrior, logLikelihood, index, eve);
    }

    @Override
    public List<StoredBlock> writeBlocks(BlockStore store) {
        List<Integer> numbers = new ArrayList<>(blocks.size());
        for (int b = 0; b < blocks.size(); b++) {
            numbers.add(b);
        }
        List<ParticleBlock> current = blocks;
        return backend.map(numbers, b -> {
            try {
                return store.write(b, current.get(b));
            } catch (IOException e) {
                throw new UncheckedIOException("cannot write block " + b + " to " + store.location() + ": " + e, e);
            }
        });
    }

    @Override
    public List<String> readBlocks(BlockStore store, List<StoredBlock> stored) {
        long[] first = new long[stored.size()];
        long running = 0;
        List<Integer> numbers = new ArrayList<>(stored.size());
        for (int b = 0; b < stored.size(); b++) {
            first[b] = running;
            running += stored.get(b).particles();
            numbers.add(b);
        }
        List<String> problems = new ArrayList<>();
        if (running != size) {
            problems.add("the checkpoint's blocks hold " + running + " particles; the run has " + size);
            return problems;
        }
        int d = model.dimension();
        List<BlockReading.Outcome> outcomes = backend.map(numbers,
                b -> BlockReading.read(store, stored.get(b), first[b], d));
        List<ParticleBlock> read = new ArrayList<>(outcomes.size());
        for (BlockReading.Outcome outcome : outcomes) {
            if (outcome.problem() != null) {
                problems.add(outcome.problem());
            }
            read.add(outcome.block());
        }
        if (problems.isEmpty()) {
            blocks = read;
        }
        return problems;
    }

    @Override
    public PopulationSnapshot snapshot() {
        return new PopulationSnapshot(blocks);
    }

    @Override
    public void restore(PopulationSnapshot snapshot) {
        if (snapshot.size() != size) {
            throw new IllegalArgumentException("snapshot holds " + snapshot.size() + " particles, population has " + size);
        }
        blocks = new ArrayList<>(snapshot.blocks());
    }

    @Override
    public void close() {
        blocks = new ArrayList<>();
    }
}
