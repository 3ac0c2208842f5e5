package org.skerry.engine.population;

/**
 * The two scalars per particle the driver needs to choose the next temperature and the evidence
 * increment: the current log-weight and the log-likelihood, in matching (but otherwise arbitrary)
 * order. This is the largest thing that crosses to the driver during a run: 16 bytes a particle.
 */
public final class TemperingInputs {

    /** The blocks' weights joined in block order, {@code size} particles in all. */
    public static TemperingInputs of(java.util.List<BlockReports.Weights> blocks, int size) {
        double[] logWeight = new double[size];
        double[] logLikelihood = new double[size];
        int[] blockSizes = new int[blocks.size()];
        int offset = 0;
        for (int b = 0; b < blocks.size(); b++) {
            BlockReports.Weights block = blocks.get(b);
            int count = block.logWeight().length;
            if (offset + count > size) {
                throw new IllegalArgumentException("the blocks hold more than " + size + " particles");
            }
            System.arraycopy(block.logWeight(), 0, logWeight, offset, count);
            System.arraycopy(block.logLikelihood(), 0, logLikelihood, offset, count);
            blockSizes[b] = count;
            offset += count;
        }
        return new TemperingInputs(logWeight, logLikelihood, size, blockSizes);
    }


    private final double[] logWeight;
    private final double[] logLikelihood;
    private final int size;
    private final int[] blockSizes;

    public TemperingInputs(double[] logWeight, double[] logLikelihood, int size) {
        this(logWeight, logLikelihood, size, new int[] {size});
    }

    /**
     * @param blockSizes the number of particles each block contributed, in the order of the
     *     arrays; in island mode the blocks are the islands, in island order
     */
    public TemperingInputs(double[] logWeight, double[] logLikelihood, int size, int[] blockSizes) {
        if (logWeight.length < size || logLikelihood.length < size) {
            throw new IllegalArgumentException("arrays shorter than size " + size);
        }
        long total = 0;
        for (int count : blockSizes) {
            total += count;
        }
        if (total != size) {
            throw new IllegalArgumentException("block sizes add up to " + total + ", not " + size);
        }
        this.logWeight = logWeight;
        this.logLikelihood = logLikelihood;
        this.size = size;
        this.blockSizes = blockSizes.clone();
    }

    /** Particles per block, in array order. */
    public int[] blockSizes() {
        return blockSizes.clone();
    }

    /** Log-weights; do not modify. */
    public double[] logWeight() {
        return logWeight;
    }

    /** Log-likelihoods; do not modify. */
    public double[] logLikelihood() {
        return logLikelihood;
    }

    public int size() {
        return size;
    }
}
