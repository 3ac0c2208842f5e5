package org.skerry.engine.resample;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;

/**
 * Test helper: runs the driver and block sides over a population split into blocks, the way a
 * backend would, and gathers the offspring counts by global index.
 */
final class BlockPipeline {

    private BlockPipeline() {
    }

    /**
     * @param sizes block sizes in canonical order (zeros allowed)
     * @param blockIdOfPosition block number given to each canonical position (a permutation)
     */
    static int[] offspring(ResamplingScheme scheme, double[] logWeights, double reference, double logSumRelative, int[] sizes,
            int[] blockIdOfPosition, long seed, int iteration) {
        int blocks = sizes.length;
        long[] first = new long[blocks];
        int[] size = new int[blocks];
        long running = 0;
        for (int j = 0; j < blocks; j++) {
            int b = blockIdOfPosition[j];
            first[b] = running;
            size[b] = sizes[j];
            running += sizes[j];
        }
        assertEquals(logWeights.length, running, "sizes must cover the population");
        long[][] q = new long[blocks][];
        int[][] counts = new int[blocks][];
        long[] totals = new long[blocks];
        for (int b = 0; b < blocks; b++) {
            double[] local = Arrays.copyOfRange(logWeights, (int) first[b], (int) first[b] + size[b]);
            q[b] = new long[size[b]];
            counts[b] = new int[size[b]];
            totals[b] = WeightQuantiser.quantise(local, size[b], reference, logSumRelative, q[b]);
        }
        BlockLayout layout = BlockLayout.of(first, size);
        BlockResamplingPlan[] plans;
        if (scheme == ResamplingScheme.RESIDUAL) {
            ResidualSplit split = ResamplingPlanner.residualSplit(layout, totals);
            ResidualTotals[] reports = new ResidualTotals[blocks];
            for (int b = 0; b < blocks; b++) {
                reports[b] = OffspringCounter.splitResidual(split, q[b], size[b], counts[b]);
            }
            plans = ResamplingPlanner.planResidual(seed, iteration, layout, split, reports);
        } else {
            plans = ResamplingPlanner.plan(scheme, seed, iteration, layout, totals);
        }
        int[] all = new int[logWeights.length];
        long newIndex = 0;
        for (int j = 0; j < blocks; j++) {
            int b = blockIdOfPosition[j];
            OffspringCounter.count(plans[b], q[b], size[b], counts[b]);
            System.arraycopy(counts[b], 0, all, (int) first[b], size[b]);
            assertEquals(newIndex, plans[b].firstNewIndex(), "first new index of block " + b);
            for (int c : counts[b]) {
                newIndex += c;
            }
        }
        return all;
    }

    static int[] offspring(ResamplingScheme scheme, double[] logWeights, double logNormaliser, int[] sizes,
            int[] blockIdOfPosition, long seed, int iteration) {
        return offspring(scheme, logWeights, logNormaliser, 0, sizes, blockIdOfPosition, seed, iteration);
    }

    /** One block holding everything. */
    static int[] offspring(ResamplingScheme scheme, double[] logWeights, double logNormaliser, long seed,
            int iteration) {
        return offspring(scheme, logWeights, logNormaliser, 0, new int[] {logWeights.length}, new int[] {0}, seed,
                iteration);
    }
}
