package org.skerry.cli.batch;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.function.Function;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.runfile.AnswerSettings;
import org.skerry.cli.runfile.BatchSpec;
import org.skerry.cli.runfile.RunFileException;

/**
 * Refuses to resume a batch whose answers would change: for every analysis that an earlier run
 * finished or left interrupted, its saved {@code run.conf} must agree with the run file the batch
 * file gives now, and its data file must have the same content. Keys that cannot alter an answer
 * are left out (those of {@link AnswerSettings#isNeutral}: backend, output, checkpoints, limits…), and
 * {@code data.file} itself (the content is compared instead, so a moved batch still resumes).
 * Analyses that failed are run afresh from the batch file as it is now, so changing what made
 * them fail is allowed.
 */
final class ResumeCheck {

    private static final int SHOWN = 8;

    private ResumeCheck() {
    }

    /**
     * @param saved    the batch's state when it was last started
     * @param now      the state of the batch file now
     * @param previous the analyses an earlier run finished or interrupted
     * @throws RunFileException naming the analyses and the keys that differ
     */
    static void verify(Path batchFolder, BatchState saved, BatchState now, List<BatchSpec.Planned> previous,
            Function<BatchSpec.Planned, Path> runFolder) {
        List<String> problems = new ArrayList<>();
        for (BatchSpec.Planned p : previous) {
            Path runConf = runFolder.apply(p).resolve(RunConfFile.FILE_NAME);
            Config savedRun;
            try {
                savedRun = ConfigFactory.parseFile(runConf.toFile());
            } catch (ConfigException e) {
                problems.add(p.label() + ": cannot read its " + runConf + ": " + e.getMessage());
                continue;
            }
            Map<String, String> before = answerKeys(savedRun);
            Map<String, String> after = answerKeys(p.run().file().config());
            Set<String> keys = new TreeSet<>(before.keySet());
            keys.addAll(after.keySet());
            for (String key : keys) {
                String was = before.get(key);
                String is = after.get(key);
                if (was == null ? is != null : !was.equals(is)) {
                    problems.add(p.label() + ": " + key + " = " + (is == null ? "(unset)" : is) + ", was "
                            + (was == null ? "(unset)" : was));
                }
            }
            String hash = saved.dataHash(p.dataset().name());
            if (hash != null && !hash.equals(now.dataHash(p.dataset().name()))) {
                problems.add(p.label() + ": the content of data file " + p.dataset().file() + " changed");
            }
        }
        if (problems.isEmpty()) {
            return;
        }
        Set<String> batchKeys = new TreeSet<>();
        Map<String, String> before = BatchState.flatten(saved.settings());
        Map<String, String> after = BatchState.flatten(now.settings());
        Set<String> all = new TreeSet<>(before.keySet());
        all.addAll(after.keySet());
        for (String key : all) {
            if (!String.valueOf(before.get(key)).equals(String.valueOf(after.get(key)))) {
                batchKeys.add(key);
            }
        }
        List<String> shown = problems.subList(0, Math.min(SHOWN, problems.size()));
        throw new RunFileException("batch folder " + batchFolder + " holds analyses run with other settings; resuming"
                + " would mix answers: " + String.join("; ", shown)
                + (problems.size() > SHOWN ? "; and " + (problems.size() - SHOWN) + " more" : "")
                + (batchKeys.isEmpty() ? "" : " (batch-file keys changed since " + BatchState.FILE_NAME + ": "
                        + String.join(", ", batchKeys) + ")")
                + ". Restore them, or run the batch into a new folder (--out DIR); nothing was changed");
    }

    private static Map<String, String> answerKeys(Config runConfig) {
        Map<String, String> keys = BatchState.flatten(runConfig);
        keys.keySet().removeIf(k -> AnswerSettings.isNeutral(k) || k.equals("data.file"));
        return keys;
    }
}
