package org.skerry.engine.sampler;

import java.util.List;
import org.skerry.engine.population.EvaluationTally;

/**
 * Everything the driver holds between two iterations besides the particles: enough, with the
 * population's blocks, to continue a run bit for bit (random streams are keyed by seed,
 * iteration and particle, so no generator state is needed). Immutable; this is what a
 * checkpoint saves for the driver.
 *
 * @param iteration          the last completed iteration (0: the initial draw)
 * @param temperature        φ reached
 * @param scale              random-walk scale λ for the next iteration
 * @param logEvidence        running log evidence estimate
 * @param logTotal           log of the current total weight, as the driver computed it
 * @param resamplings        resampling steps so far
 * @param evaluations        tally of every likelihood evaluation so far
 * @param records            one record per completed iteration, starting with the initial draw
 * @param islandSizes        particles per island, or null outside island mode
 * @param islandLogEvidence  each island's running log evidence, or null outside island mode
 * @param islandsIndependent whether the islands have never interacted
 * @param targetState        what the sequence keeps of the target besides its progress (ABC: the
 *                           tolerance and the distance weights), or null
 */
public record SamplerState(int iteration, double temperature, double scale, double logEvidence, double logTotal,
        int resamplings, EvaluationTally evaluations, List<IterationRecord> records, int[] islandSizes,
        double[] islandLogEvidence, boolean islandsIndependent, double[] targetState) {

    /** A state whose target its progress alone restores. */
    public SamplerState(int iteration, double temperature, double scale, double logEvidence, double logTotal,
            int resamplings, EvaluationTally evaluations, List<IterationRecord> records, int[] islandSizes,
            double[] islandLogEvidence, boolean islandsIndependent) {
        this(iteration, temperature, scale, logEvidence, logTotal, resamplings, evaluations, records, islandSizes,
                islandLogEvidence, islandsIndependent, null);
    }

    public SamplerState {
        if (iteration < 0) {
            throw new IllegalArgumentException("iteration must be >= 0, was " + iteration);
        }
        if (records == null || records.size() != iteration + 1) {
            throw new IllegalArgumentException("records must hold iterations 0.." + iteration + ", held "
                    + (records == null ? "null" : records.size()));
        }
        if ((islandSizes == null) != (islandLogEvidence == null)
                || (islandSizes != null && islandSizes.length != islandLogEvidence.length)) {
            throw new IllegalArgumentException("island sizes and island log evidences must both be given, of one length");
        }
        records = List.copyOf(records);
        islandSizes = islandSizes == null ? null : islandSizes.clone();
        islandLogEvidence = islandLogEvidence == null ? null : islandLogEvidence.clone();
        targetState = targetState == null ? null : targetState.clone();
    }

    @Override
    public double[] targetState() {
        return targetState == null ? null : targetState.clone();
    }

    @Override
    public int[] islandSizes() {
        return islandSizes == null ? null : islandSizes.clone();
    }

    @Override
    public double[] islandLogEvidence() {
        return islandLogEvidence == null ? null : islandLogEvidence.clone();
    }

    /** Whether the run has reached the posterior (φ = 1). */
    public boolean finished() {
        return temperature >= 1.0;
    }
}
