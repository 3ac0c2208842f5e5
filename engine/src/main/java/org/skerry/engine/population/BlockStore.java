package org.skerry.engine.population;

import java.io.IOException;
import java.io.Serializable;
import org.skerry.engine.particle.ParticleBlock;

/**
 * The folder of one checkpoint, seen from wherever a block lives: a backend's worker threads or
 * Spark executors write and read their own blocks through it, in parallel. Implementations must
 * be serialisable (they travel to executors), write each file under a temporary name and rename
 * it, and check length and checksum on reading.
 */
public interface BlockStore extends Serializable {

    /** Writes block number {@code block} and says where and how it was written. */
    StoredBlock write(int block, ParticleBlock particles) throws IOException;

    /**
     * Reads a block back.
     *
     * @throws IOException when the file is missing, of another length, fails its checksum or does
     *                     not hold a block (the message names the file and what is wrong)
     */
    ParticleBlock read(StoredBlock stored) throws IOException;

    /** Where the checkpoint lives, for messages. */
    String location();
}
