package org.skerry.cli.runfile;

import com.typesafe.config.ConfigValue;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.SortedMap;
import java.util.TreeMap;

/**
 * The settings of a run that decide its answer, flattened to {@code key → value} text: every
 * resolved key except those that only say how or where the run goes (run name, output,
 * progress, backend and executors, checkpoints, limits, the invalid-evaluation limit). The data file enters by the SHA-256 of
 * its content rather than its path, so a moved data file is the same data and an edited one is
 * not; so do the files a program model reads ({@code model.program.files}). A checkpoint saves
 * this map and a resume compares it.
 */
public final class AnswerSettings {

    /**
     * Keys (or prefixes, ending in a dot) that never change the answer (see the design's "same
     * seed, same answer"). The invalid-evaluation limit only decides whether a run stops, so a run
     * stopped by it can be resumed with a higher limit. Where a program model's scratch folders go,
     * how long a worker may take to start and how many failed file-mode folders are kept decide
     * nothing either.
     */
    static final List<String> NEUTRAL = List.of("name", "output.", "backend.", "checkpoint.", "limits.",
            "sampler.max-invalid-fraction", "model.program.scratch", "model.program.start-timeout",
            "model.program.keep-failed");

    private AnswerSettings() {
    }

    public static SortedMap<String, String> of(RunSpec spec) {
        SortedMap<String, String> settings = new TreeMap<>();
        boolean dataTempering = spec.file().config().hasPath("sampler.sequence")
                && spec.file().config().getString("sampler.sequence").equals("data-tempering");
        for (Map.Entry<String, ConfigValue> entry : spec.file().config().entrySet()) {
            String key = entry.getKey();
            if (isNeutral(key) || key.startsWith(ModelSpec.PROGRAM_KEY + ".")) {
                continue;
            }
            // Likelihood tempering, the default, is what every run did before the sequence could be
            // chosen: leaving its keys out keeps older checkpoints resumable.
            if (!dataTempering && (key.equals("sampler.sequence") || key.startsWith("sampler.data-tempering."))) {
                continue;
            }
            settings.put(key, entry.getValue().render(com.typesafe.config.ConfigRenderOptions.concise()));
        }
        if (spec.model().dataFile() != null) {
            settings.put("data.file", "sha256:" + sha256(spec.model().dataFile()));
        }
        if (spec.model().program()) {
            // The program's settings with their paths made absolute, as run.conf saves them, so a
            // resume compares like with like; its files enter by content, in order, like the data file.
            for (Map.Entry<String, ConfigValue> entry : spec.model().settings().entrySet()) {
                String key = ModelSpec.PROGRAM_KEY + "." + entry.getKey();
                if (!isNeutral(key)) {
                    settings.put(key, entry.getValue().render(com.typesafe.config.ConfigRenderOptions.concise()));
                }
            }
            if (spec.model().settings().hasPath("files")) {
                List<String> hashes = new java.util.ArrayList<>();
                for (String file : spec.model().settings().getStringList("files")) {
                    hashes.add("sha256:" + sha256(Path.of(file)));
                }
                settings.put(ModelSpec.PROGRAM_KEY + ".files", String.join(",", hashes));
            }
            if (spec.model().settings().hasPath("input-template")) {
                settings.put(ModelSpec.PROGRAM_KEY + ".input-template",
                        "sha256:" + sha256(Path.of(spec.model().settings().getString("input-template"))));
            }
        }
        return settings;
    }

    /**
     * Each setting whose value differs between {@code saved} and {@code now}, as
     * "key was X, now Y" ("unset" for a missing one), in key order; empty when they agree.
     */
    public static List<String> differences(Map<String, String> saved, Map<String, String> now) {
        java.util.TreeSet<String> keys = new java.util.TreeSet<>(saved.keySet());
        keys.addAll(now.keySet());
        List<String> out = new java.util.ArrayList<>();
        for (String key : keys) {
            String before = saved.get(key);
            String after = now.get(key);
            if (!java.util.Objects.equals(before, after)) {
                out.add(key + " was " + (before == null ? "unset" : before) + ", now " + (after == null ? "unset" : after));
            }
        }
        return out;
    }

    /** Whether {@code key} only says how or where a run goes, never what it answers. */
    public static boolean isNeutral(String key) {
        for (String prefix : NEUTRAL) {
            if (prefix.endsWith(".") ? key.startsWith(prefix) : key.equals(prefix)) {
                return true;
            }
        }
        return false;
    }

    private static String sha256(Path file) {
        try (InputStream in = Files.newInputStream(file)) {
            MessageDigest digest = MessageDigest.getInstance("SHA-256");
            byte[] buffer = new byte[1 << 16];
            for (int n; (n = in.read(buffer)) > 0;) {
                digest.update(buffer, 0, n);
            }
            return HexFormat.of().formatHex(digest.digest());
        } catch (IOException e) {
            throw new RunFileException("cannot read the data file " + file + ": " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java runtime has SHA-256", e);
        }
    }
}
