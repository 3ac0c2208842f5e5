package org.skerry.spark;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.skerry.engine.particle.ParticleBlock;

/** Cutting a block into runs of particles and joining runs back into one block, in index order. */
final class BlockSlices {

    private BlockSlices() {
    }

    /** Particles {@code [from, from+count)} of {@code block} (positions, not indices), copied. */
    static ParticleBlock slice(ParticleBlock block, int from, int count) {
        ParticleBlock piece = ParticleBlock.shapedLike(block, count);
        piece.resize(count);
        for (int i = 0; i < count; i++) {
            piece.copyParticle(block, from + i, i);
        }
        return piece;
    }

    /** The runs joined in order of their first global index. */
    static ParticleBlock join(int dimension, List<ParticleBlock> pieces) {
        List<ParticleBlock> sorted = new ArrayList<>();
        int total = 0;
        int width = 0;
        for (ParticleBlock piece : pieces) {
            // Every block of a population has the same auxiliary width; an empty piece may not know it.
            width = Math.max(width, piece.auxiliaryWidth());
            if (piece.size() > 0) {
                sorted.add(piece);
                total += piece.size();
            }
        }
        sorted.sort(Comparator.comparingLong(piece -> piece.index()[0]));
        ParticleBlock block = new ParticleBlock(dimension, total);
        block.attachAuxiliary(width);
        block.resize(total);
        int at = 0;
        for (ParticleBlock piece : sorted) {
            for (int i = 0; i < piece.size(); i++) {
                block.copyParticle(piece, i, at++);
            }
        }
        return block;
    }
}
