package org.skerry.engine.population.threads;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Consumer;
import org.skerry.engine.model.Model;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockExecutor;
import org.skerry.engine.population.BlockSlot;
import org.skerry.engine.population.BlockStep;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.population.block.BlockReading;
import org.skerry.engine.resample.Redistribution;

/**
 * A population's blocks held in this JVM, one task per block on the backend's thread pool.
 * Steps change blocks in place: nothing is cached that a failure would make stale.
 */
final class ThreadBlocks implements BlockExecutor {

    private final ThreadPoolBackend backend;
    private final Model model;
    private final int count;
    private List<ParticleBlock> blocks = new ArrayList<>();

    ThreadBlocks(ThreadPoolBackend backend, Model model, int count) {
        this.backend = backend;
        this.model = model;
        this.count = count;
    }

    @Override
    public int blockCount() {
        return blocks.isEmpty() ? count : blocks.size();
    }

    @Override
    public <R> List<R> create(long[] first, int[] sizes, BlockStep<R> step) {
        List<ParticleBlock> made = new ArrayList<>(sizes.length);
        for (int b = 0; b < sizes.length; b++) {
            made.add(ParticleBlock.indexed(model.dimension(), first[b], sizes[b]));
        }
        blocks = made;
        return update(step);
    }

    @Override
    public <R> List<R> update(BlockStep<R> step) {
        List<ParticleBlock> current = blocks;
        ParticleBlock[] next = current.toArray(new ParticleBlock[0]);
        List<R> results = backend.map(numbers(current.size()), b -> step.apply(new BlockSlot(b, next, model, false)));
        blocks = new ArrayList<>(List.of(next));
        return results;
    }

    @Override
    public <R> List<R> read(BlockStep<R> query) {
        ParticleBlock[] current = blocks.toArray(new ParticleBlock[0]);
        return backend.map(numbers(current.length), b -> query.apply(new BlockSlot(b, current, model, true)));
    }

    @Override
    public void exchange(Redistribution plan) {
        blocks = new ArrayList<>(List.of(plan.apply(blocks.toArray(new ParticleBlock[0]))));
    }

    @Override
    public void forEachBlock(Consumer<ParticleBlock> sink) {
        blocks.forEach(sink);
    }

    @Override
    public List<StoredBlock> write(BlockStore store) {
        List<ParticleBlock> current = blocks;
        return backend.map(numbers(current.size()), b -> {
            try {
                return store.write(b, current.get(b));
            } catch (IOException e) {
                throw new UncheckedIOException("cannot write block " + b + " to " + store.location() + ": " + e, e);
            }
        });
    }

    @Override
    public List<String> read(List<StoredBlock> stored, BlockReader reader) {
        List<BlockReading.Outcome> outcomes = backend.map(numbers(stored.size()), b -> reader.read(b, stored.get(b)));
        List<String> problems = new ArrayList<>();
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
    public void close() {
        blocks = new ArrayList<>();
        // A model holding processes or connections (a program model's workers) ends with its population.
        if (model instanceof AutoCloseable) {
            try {
                ((AutoCloseable) model).close();
            } catch (Exception e) {
                throw new IllegalStateException("cannot close the model: " + e.getMessage(), e);
            }
        }
    }

    private static List<Integer> numbers(int count) {
        List<Integer> numbers = new ArrayList<>(count);
        for (int b = 0; b < count; b++) {
            numbers.add(b);
        }
        return numbers;
    }
}
