package org.skerry.cli.runfile;

import java.util.Objects;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.settings.SettingsException;
import org.skerry.engine.settings.SettingsReader;

/**
 * The typed, checked content of a run file, grouped by concern: the run's name and file, the model
 * and its data, the sampler settings, the backend, the outputs, checkpoints and limits. Every value
 * is checked by {@link #from}, so a bad one is reported with its file, line and key before anything
 * runs.
 *
 * @param file        the loaded run file
 * @param name        the run's name (it names the run folder)
 * @param model       the model and its data
 * @param sampler     the engine's settings, which with the model and data decide the answer
 * @param backend     the thread pool or Spark, and their setup
 * @param outputs     the output folder and progress display
 * @param checkpoints when and where checkpoints are written
 * @param limits      when one invocation stops early on a checkpoint
 */
public record RunSpec(RunFile file, String name, ModelSpec model, SamplerSettings sampler, BackendSpec backend,
        OutputSpec outputs, CheckpointSpec checkpoints, LimitSpec limits) {

    /** The run-file key of the largest fraction of invalid evaluations an iteration may have. */
    public static final String MAX_INVALID_FRACTION_KEY = "sampler.max-invalid-fraction";

    /** The run-file key of the number of retries of an invalid likelihood call. */
    public static final String RETRIES_KEY = "model.retries";

    public RunSpec {
        Objects.requireNonNull(file, "file");
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(sampler, "sampler");
        Objects.requireNonNull(backend, "backend");
        Objects.requireNonNull(outputs, "outputs");
        Objects.requireNonNull(checkpoints, "checkpoints");
        Objects.requireNonNull(limits, "limits");
    }

    /** Checks every setting of a loaded run file. */
    public static RunSpec from(RunFile file) {
        try {
            return read(file, SettingsReader.of(file.config()));
        } catch (SettingsException e) {
            throw new RunFileException(e.getMessage(), e);
        }
    }

    // The groups are read in the order of the run file's sections, so a file with several mistakes
    // reports the same first one as it always has.
    private static RunSpec read(RunFile file, SettingsReader r) {
        String name = r.text("name");
        if (name == null || !name.matches("[A-Za-z0-9][A-Za-z0-9._-]*")) {
            throw r.error("name", "must be letters, digits, '.', '_' or '-' (it names the run folder)");
        }
        ModelSpec model = ModelSpec.read(r, file);
        SamplerSettings sampler = SamplerSection.read(r, file);
        BackendSpec backend = BackendSpec.read(r);
        OutputSpec outputs = OutputSpec.read(r);
        CheckpointSpec checkpoints = CheckpointSpec.read(r);
        LimitSpec limits = LimitSpec.read(r);
        return new RunSpec(file, name, model, sampler, backend, outputs, checkpoints, limits);
    }
}
