package org.skerry.engine.model.builtin;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.settings.ModelFactory;
import org.skerry.engine.model.settings.ModelSettings;
import org.skerry.engine.model.settings.SettingDescription;

/**
 * Factories of the reference simulators (models that simulate summaries instead of giving a
 * likelihood, run with {@code sampler.sequence = abc}), one nested class per model.
 */
public final class SimulatorFactories {

    private SimulatorFactories() {
    }

    /** {@link NormalMeanSimulator}: data role {@code y}. */
    public static final class NormalMean implements ModelFactory {
        @Override
        public String name() {
            return "normal-mean-simulator";
        }

        @Override
        public String description() {
            return "simulator (for abc): normal observations with known sd, summarised by their mean; normal prior";
        }

        @Override
        public List<SettingDescription> settings() {
            return List.of(SettingDescription.optional("sigma", "known standard deviation of each observation", "1"),
                    SettingDescription.optional("prior.mean", "prior mean of mu", "0"),
                    SettingDescription.optional("prior.sd", "prior standard deviation of mu", "10"));
        }

        @Override
        public List<SettingDescription> dataRoles() {
            return List.of(SettingDescription.required("y", "observations"));
        }

        @Override
        public Model create(ModelSettings settings) {
            return NormalMeanSimulator.of(settings.column("y"), settings.getPositive("sigma", 1.0),
                    settings.getDouble("prior.mean", 0.0), settings.getPositive("prior.sd", 10.0));
        }
    }

    /** {@link PoissonSumSimulator}: data role {@code count}. */
    public static final class PoissonSum implements ModelFactory {
        @Override
        public String name() {
            return "poisson-sum-simulator";
        }

        @Override
        public String description() {
            return "simulator (for abc): Poisson counts summarised by their total; Gamma(shape, rate) prior on lambda";
        }

        @Override
        public List<SettingDescription> settings() {
            return List.of(SettingDescription.optional("prior.shape", "Gamma prior shape", "1"),
                    SettingDescription.optional("prior.rate", "Gamma prior rate", "0.1"));
        }

        @Override
        public List<SettingDescription> dataRoles() {
            return List.of(SettingDescription.required("count", "the counts (whole numbers >= 0)"));
        }

        @Override
        public Model create(ModelSettings settings) {
            double[] column = settings.column("count");
            long[] counts = new long[column.length];
            for (int j = 0; j < column.length; j++) {
                if (!(column[j] >= 0) || column[j] != Math.rint(column[j])) {
                    throw new IllegalArgumentException("poisson-sum-simulator: count " + (j + 1) + " is " + column[j]
                            + "; counts are whole numbers >= 0");
                }
                counts[j] = (long) column[j];
            }
            return PoissonSumSimulator.of(counts, settings.getPositive("prior.shape", 1.0),
                    settings.getPositive("prior.rate", 0.1));
        }
    }

    /** {@link MixtureToySimulator}: no data; the observation is a setting. */
    public static final class MixtureToy implements ModelFactory {
        @Override
        public String name() {
            return "mixture-toy-simulator";
        }

        @Override
        public String description() {
            return "simulator (for abc): the toy mixture of Sisson, Fan & Tanaka (2007), theta ~ U(-10, 10)";
        }

        @Override
        public List<SettingDescription> settings() {
            return List.of(SettingDescription.optional("observed", "the observation x", "0"));
        }

        @Override
        public List<SettingDescription> dataRoles() {
            return List.of();
        }

        @Override
        public Model create(ModelSettings settings) {
            return MixtureToySimulator.of(settings.getDouble("observed", 0.0));
        }
    }
}
