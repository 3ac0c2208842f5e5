package org.skerry.checkpoint;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeSet;
import org.skerry.engine.population.Population;
import org.skerry.engine.sampler.Resumption;
import org.skerry.engine.sampler.SamplerState;

/**
 * Resumes from the newest valid checkpoint of a folder: a checkpoint whose manifest, driver
 * state or any block is missing or fails its checksum is skipped and reported, and the one
 * before it is used. Refuses to continue when the settings that decide the answer differ from
 * the checkpointed run's.
 */
public final class CheckpointResumption implements Resumption {

    private final CheckpointFolder folder;
    private final Map<String, String> answerSettings;
    private final List<String> skipped = new ArrayList<>();
    private int usedIteration = -1;

    public CheckpointResumption(CheckpointFolder folder, Map<String, String> answerSettings) {
        this.folder = folder;
        this.answerSettings = Map.copyOf(answerSettings);
    }

    @Override
    public SamplerState restore(Population population) {
        List<CheckpointFolder.Found> found;
        try {
            found = folder.list();
        } catch (IOException e) {
            throw new NoUsableCheckpointException("cannot list the checkpoints in " + folder.files().root() + ": " + e, e);
        }
        if (found.isEmpty()) {
            throw new NoUsableCheckpointException("no checkpoint in " + folder.files().root(), null);
        }
        for (CheckpointFolder.Found candidate : found) {
            if (candidate.problem() != null) {
                skipped.add(candidate.folder() + ": " + candidate.problem());
                continue;
            }
            CheckpointFolder.Loaded loaded;
            try {
                loaded = folder.load(candidate);
            } catch (IOException e) {
                skipped.add(candidate.folder() + ": " + e.getMessage());
                continue;
            }
            checkSettings(loaded.saved().answerSettings());
            List<String> problems = population.readBlocks(folder.blocks(candidate), candidate.manifest().blocks());
            if (!problems.isEmpty()) {
                skipped.add(candidate.folder() + ": " + String.join("; ", problems));
                continue;
            }
            usedIteration = candidate.iteration();
            return loaded.saved().state();
        }
        throw new NoUsableCheckpointException("no usable checkpoint in " + folder.files().root() + ": "
                + String.join(" | ", skipped), null);
    }

    private void checkSettings(Map<String, String> saved) {
        List<String> keys = new ArrayList<>();
        List<String> differences = new ArrayList<>();
        for (String key : new TreeSet<>(union(saved, answerSettings))) {
            String before = saved.get(key);
            String now = answerSettings.get(key);
            if (!Objects.equals(before, now)) {
                keys.add(key);
                differences.add(key + " was " + (before == null ? "unset" : before) + ", now "
                        + (now == null ? "unset" : now));
            }
        }
        if (!keys.isEmpty()) {
            throw new SettingsChangedException(keys, differences);
        }
    }

    private static TreeSet<String> union(Map<String, String> a, Map<String, String> b) {
        TreeSet<String> keys = new TreeSet<>(a.keySet());
        keys.addAll(b.keySet());
        return keys;
    }

    /** The checkpoints skipped as damaged or unfinished, each with why, newest first. */
    public List<String> skipped() {
        return List.copyOf(skipped);
    }

    /** The iteration resumed from, or −1 before {@link #restore}. */
    public int usedIteration() {
        return usedIteration;
    }
}
