package org.skerry.cli.runfile;

import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.util.List;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.settings.SettingsReader;
import org.skerry.engine.target.SequenceSettings;
import org.skerry.engine.temper.AdaptiveTemperature;
import org.skerry.engine.temper.FixedSchedule;

/**
 * Reads a run file's {@code sampler} keys (and {@code model.retries}) into the engine's
 * {@link SamplerSettings}, naming the key of a value it refuses.
 */
final class SamplerSection {

    private SamplerSection() {
    }

    /** Reads and checks the sampler settings (a relative observed-summary file is read from {@code file}'s folder). */
    static SamplerSettings read(SettingsReader r, RunFile file) {
        SamplerSettings.Builder b = SamplerSettings.builder();
        b.particles(r.integer("sampler.particles", 2, 100_000_000));
        b.seed(r.seed("sampler.seed"));
        b.maxIterations(r.integer("sampler.max-iterations", 1, 1_000_000));
        b.minimumDistinctEves(r.integer("sampler.minimum-distinct-ancestors", 1, Integer.MAX_VALUE));
        b.evaluationRetries(r.integer(RunSpec.RETRIES_KEY, 0, 100));
        b.maxInvalidFraction(r.number(RunSpec.MAX_INVALID_FRACTION_KEY, 0, true, 1, true));
        String scheme = r.choice("sampler.resampling.scheme",
                List.of("multinomial", "stratified", "systematic", "residual"));
        b.resamplingScheme(ResamplingScheme.valueOf(scheme.toUpperCase(java.util.Locale.ROOT)));
        b.resampleThreshold(r.number("sampler.resampling.threshold", 0, false, 1, true));
        b.resampleEveryIteration(r.bool("sampler.resampling.every-iteration"));
        b.islands(r.integer("sampler.islands.count", 0, 10_000_000));
        b.islandInteractionEvery(r.integer("sampler.islands.interaction-every", 0, 1_000_000));
        b.islandInteractionThreshold(r.number("sampler.islands.interaction-threshold", 0, true, 1, true));
        String rule = r.choice("sampler.tempering.rule", List.of("adaptive", "fixed"));
        if (rule.equals("adaptive")) {
            b.temperatureRule(new AdaptiveTemperature(r.number("sampler.tempering.target", 0, false, 1, false)));
        } else {
            double[] schedule = r.numbers("sampler.tempering.schedule");
            try {
                b.temperatureRule(new FixedSchedule(schedule));
            } catch (IllegalArgumentException e) {
                throw r.error("sampler.tempering.schedule", e.getMessage());
            }
        }
        String sequence = r.choice("sampler.sequence", List.of("likelihood-tempering", "data-tempering", "abc"));
        if (sequence.equals("abc")) {
            b.targets(SequenceSettings.abc(AbcSection.read(r, file)));
        }
        if (sequence.equals("data-tempering")) {
            ConfigValue batch = r.config().getValue("sampler.data-tempering.batch");
            if (batch.valueType() == ConfigValueType.NUMBER) {
                b.targets(SequenceSettings.fixedBatches(r.integer("sampler.data-tempering.batch", 1, 100_000_000)));
            } else if ("adaptive".equals(batch.unwrapped())) {
                b.targets(SequenceSettings.adaptiveBatches(r.integer("sampler.data-tempering.window", 1, 10_000),
                        r.number("sampler.data-tempering.target", 0, false, 1, false)));
            } else {
                throw r.error("sampler.data-tempering.batch", "must be \"adaptive\" or a number of observations");
            }
        }
        String kernel = r.choice("sampler.moves.kernel", List.of("random-walk", "independence"));
        b.moveKernel(kernel.equals("random-walk") ? MoveKernel.RANDOM_WALK : MoveKernel.INDEPENDENCE);
        ConfigValue steps = r.config().getValue("sampler.moves.steps");
        if (steps.valueType() == ConfigValueType.NUMBER) {
            b.fixedSteps(r.integer("sampler.moves.steps", 1, 65535));
        } else if (!"adaptive".equals(steps.unwrapped())) {
            throw r.error("sampler.moves.steps", "must be \"adaptive\" or a number of steps");
        }
        b.stayProbability(r.number("sampler.moves.stay-probability", 0, false, 1, false));
        b.maxSteps(r.integer("sampler.moves.max-steps", 1, 65535));
        b.initialScale(r.number("sampler.moves.initial-scale", 0, false, 100, true));
        ConfigValue target = r.config().getValue("sampler.moves.target-acceptance");
        if (target.valueType() == ConfigValueType.NUMBER) {
            b.targetAcceptance(r.number("sampler.moves.target-acceptance", 0, false, 1, false));
        } else if ("auto".equals(target.unwrapped())) {
            b.targetAcceptance(Double.NaN);
        } else {
            throw r.error("sampler.moves.target-acceptance", "must be \"auto\" or a number in (0, 1)");
        }
        try {
            return b.build();
        } catch (IllegalArgumentException e) {
            throw r.error("sampler.islands.count", e.getMessage());
        }
    }
}
