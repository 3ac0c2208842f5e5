package org.skerry.engine.population.threads;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.resample.BlockLayout;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.OffspringCounter;
import org.skerry.engine.resample.ParticleExpansion;
import org.skerry.engine.resample.Redistribution;
import org.skerry.engine.resample.ResamplingPlanner;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualSplit;
import org.skerry.engine.resample.ResidualTotals;
import org.skerry.engine.resample.WeightQuantiser;

/**
 * The thread backend's resampling step, in the same passes a distributed backend makes: blocks
 * quantise their weights and report totals; the driver plans; blocks count offspring and expand;
 * the driver plans the rebalancing, which moves runs of particles between blocks. The blocks list
 * is kept in canonical order (each block a contiguous run of global indices).
 */
final class BlockResampling {

    record Result(List<ParticleBlock> blocks, ResamplingReport report) {
    }

    private BlockResampling() {
    }

    static Result resample(ThreadPoolBackend backend, List<ParticleBlock> blocks, ResamplingScheme scheme,
            double logTotal, long seed, int iteration) {
        int count = blocks.size();
        List<Integer> numbers = new ArrayList<>(count);
        long[] first = new long[count];
        int[] size = new int[count];
        long running = 0;
        for (int b = 0; b < count; b++) {
            numbers.add(b);
            first[b] = running;
            size[b] = blocks.get(b).size();
            running += size[b];
        }
        BlockLayout layout = BlockLayout.of(first, size);
        long[][] quantised = new long[count][];
        int[][] offspring = new int[count][];
        long[] totals = new long[count];
        backend.map(numbers, b -> {
            ParticleBlock block = blocks.get(b);
            quantised[b] = new long[block.size()];
            offspring[b] = new int[block.size()];
            totals[b] = WeightQuantiser.quantise(block.logWeight(), block.size(), logTotal, quantised[b]);
            return null;
        });

        BlockResamplingPlan[] plans;
        if (scheme == ResamplingScheme.RESIDUAL) {
            ResidualSplit split = ResamplingPlanner.residualSplit(layout, totals);
            List<ResidualTotals> parts = backend.map(numbers,
                    b -> OffspringCounter.splitResidual(split, quantised[b], size[b], offspring[b]));
            plans = ResamplingPlanner.planResidual(seed, iteration, layout, split, parts.toArray(new ResidualTotals[0]));
        } else {
            plans = ResamplingPlanner.plan(scheme, seed, iteration, layout, totals);
        }

        long[] ancestors = new long[count];
        List<ParticleBlock> expanded = backend.map(numbers, b -> {
            OffspringCounter.count(plans[b], quantised[b], size[b], offspring[b]);
            ancestors[b] = ParticleExpansion.distinctAncestors(offspring[b], size[b]);
            return ParticleExpansion.expand(blocks.get(b), offspring[b], plans[b].firstNewIndex());
        });
        long redistributeStart = System.nanoTime();
        Redistribution redistribution = Redistribution.plan(ResamplingPlanner.expandedLayout(plans));
        ParticleBlock[] balanced = redistribution.apply(expanded.toArray(new ParticleBlock[0]));
        double redistributeSeconds = (System.nanoTime() - redistributeStart) * 1e-9;
        long distinct = Arrays.stream(ancestors).sum();
        return new Result(new ArrayList<>(Arrays.asList(balanced)),
                new ResamplingReport(distinct, redistribution.movedCount(), redistributeSeconds));
    }
}
