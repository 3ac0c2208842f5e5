package org.skerry.engine.population;

import org.skerry.engine.model.Model;
import org.skerry.engine.particle.ParticleBlock;

/**
 * A {@link BlockCursor} over one slot of an array of blocks held in this JVM: a step changes the
 * block in place or puts a replacement into the slot. For backends whose blocks nothing else
 * caches (the thread pool); a query gets a read-only slot.
 */
public final class BlockSlot implements BlockCursor {

    private final int number;
    private final ParticleBlock[] blocks;
    private final Model model;
    private final boolean readOnly;

    /**
     * @param number   the slot, {@code blocks[number]}
     * @param readOnly whether the step is a query, which must not change the block
     */
    public BlockSlot(int number, ParticleBlock[] blocks, Model model, boolean readOnly) {
        this.number = number;
        this.blocks = blocks;
        this.model = model;
        this.readOnly = readOnly;
    }

    @Override
    public int number() {
        return number;
    }

    @Override
    public ParticleBlock current() {
        return blocks[number];
    }

    @Override
    public ParticleBlock block() {
        if (readOnly) {
            throw new IllegalStateException("a query must not change block " + number);
        }
        return blocks[number];
    }

    @Override
    public void replace(ParticleBlock replacement) {
        if (readOnly) {
            throw new IllegalStateException("a query must not replace block " + number);
        }
        blocks[number] = replacement;
    }

    @Override
    public Model model() {
        return model;
    }
}
