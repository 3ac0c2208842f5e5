package org.skerry.checkpoint;

import java.util.Map;
import java.util.TreeMap;
import java.util.function.Consumer;
import org.skerry.engine.population.Population;
import org.skerry.engine.sampler.Checkpointer;
import org.skerry.engine.sampler.SamplerState;

/**
 * Checkpoints into a {@link CheckpointFolder} every k iterations, or every m minutes when a
 * time interval is set (then up to m minutes of work can be lost). After each checkpoint it
 * hands the state to a callback (the command line refreshes {@code iterations.csv} there).
 */
public final class FileCheckpointer implements Checkpointer {

    private final CheckpointFolder folder;
    private final int everyIterations;
    private final double everyMinutes;
    private final Map<String, String> answerSettings;
    private final Consumer<SamplerState> afterWrite;
    private long lastWriteNanos = System.nanoTime();

    /**
     * @param everyIterations write after every k-th iteration (k ≥ 1), unless a time interval is set
     * @param everyMinutes    when &gt; 0, write when this many minutes have passed since the last
     */
    public FileCheckpointer(CheckpointFolder folder, int everyIterations, double everyMinutes,
            Map<String, String> answerSettings, Consumer<SamplerState> afterWrite) {
        if (everyIterations < 1) {
            throw new IllegalArgumentException("everyIterations must be >= 1, was " + everyIterations);
        }
        if (!(everyMinutes >= 0)) {
            throw new IllegalArgumentException("everyMinutes must be >= 0, was " + everyMinutes);
        }
        this.folder = folder;
        this.everyIterations = everyIterations;
        this.everyMinutes = everyMinutes;
        this.answerSettings = new TreeMap<>(answerSettings);
        this.afterWrite = afterWrite;
    }

    @Override
    public boolean due(int iteration) {
        if (everyMinutes > 0) {
            return iteration == 0 || (System.nanoTime() - lastWriteNanos) * 1e-9 >= everyMinutes * 60;
        }
        return iteration % everyIterations == 0;
    }

    @Override
    public void write(SamplerState state, Population population) {
        try {
            folder.write(state, population, answerSettings);
        } catch (Exception e) {
            throw new CheckpointWriteException(state.iteration(), folder.files().root(), folder.newestComplete(), e);
        }
        lastWriteNanos = System.nanoTime();
        afterWrite.accept(state);
    }

}
