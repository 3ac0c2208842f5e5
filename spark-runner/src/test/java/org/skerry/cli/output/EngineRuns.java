package org.skerry.cli.output;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/** Small real runs of the engine, to write outputs from. */
final class EngineRuns {

    static final String REASON = "solver diverged, code \"7\"";

    private EngineRuns() {
    }

    /** The two-dimensional normal mean model on 12 synthetic observations. */
    static SamplerResult normalMean(long seed, int threads) {
        double[][] data = SyntheticData.normalRows(21, 12, new double[] {0.5, -0.5}, 1.0);
        return run(NormalMeanModel.of(data, 1.0, 0.0, 2.0), seed, threads);
    }

    /** A model whose likelihood throws for θ above 2.5 (about a tenth of its prior). */
    static SamplerResult fragile(long seed) {
        Model model = new Model() {
            private final Prior prior = IndependentPrior.of(Normal.of(0.0, 2.0));

            @Override
            public ParameterSpace parameters() {
                return ParameterSpace.of(List.of("theta"), List.of(Support.real()));
            }

            @Override
            public Prior prior() {
                return prior;
            }

            @Override
            public double logLikelihood(double[] x, LikelihoodContext context) {
                if (x[0] > 2.5) {
                    throw new IllegalStateException(REASON);
                }
                return -0.5 * (x[0] - 1) * (x[0] - 1);
            }
        };
        // About a tenth of the prior fails, near the default stop limit of 10 %: lift it.
        return run(model, SamplerSettings.builder().particles(400).seed(seed).maxInvalidFraction(0.5).build(), 2);
    }

    private static SamplerResult run(Model model, long seed, int threads) {
        return run(model, SamplerSettings.builder().particles(400).seed(seed).build(), threads);
    }

    private static SamplerResult run(Model model, SamplerSettings settings, int threads) {
        try (ThreadPoolBackend backend = new ThreadPoolBackend(threads, 0)) {
            return new SmcSampler(settings).run(model, backend);
        }
    }
}
