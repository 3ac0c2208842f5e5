package org.skerry.engine.abc;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.program.ProgramSettings;
import org.skerry.engine.program.ProgramSimulator;
import org.skerry.engine.program.PythonWorkers;
import org.skerry.engine.reference.AbcExact;
import org.skerry.engine.reference.SyntheticData;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;
import org.skerry.engine.target.SequenceSettings;

/**
 * ABC-SMC with a Python program as the simulator (worker protocol, reply kind summaries): the
 * normal mean with known σ = 1, n = 10, the sample mean as summary, uniform kernel, final
 * tolerance 0.1 with a fixed distance weight, against the exact ABC posterior by 1-D quadrature
 * (AbcExact; Pritchard et al. 1999), as AbcReferenceTest checks the Java simulator. Tolerances
 * are four standard errors of the estimates replicated over seeds (AbcReferenceTest.assertPosterior).
 */
@Slow
class ProgramSimulatorAbcTest {

    private static final double[] DATA = SyntheticData.column(
            SyntheticData.normalRows(31, 10, new double[] {1.2}, 1.0), 0);

    static ProgramSettings settings(int batch, String... more) {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON,
                PythonWorkers.SCRIPTS.resolve("normal_mean_summaries.py").toString(), "10", "1.0"));
        command.addAll(List.of(more));
        return new ProgramSettings(command, List.of(), PythonWorkers.environment(), Duration.ofSeconds(30),
                Duration.ofSeconds(60), ProgramSettings.Mode.WORKER, batch, List.of("mu"), List.of(Normal.of(0, 3)),
                null, null, List.of("mean"));
    }

    @Test
    @DisplayName("a Python summaries worker for the normal mean at ε = 0.1: posterior mean, sd and quantiles "
            + "against the exact ABC posterior (1-D quadrature), within 4 standard errors over 8 seeds")
    void normalMeanAgainstQuadrature() {
        double observed = 0;
        for (double y : DATA) {
            observed += y;
        }
        observed /= DATA.length;
        AbcSettings abc = AbcSettings.of(0.1).withWeights(Map.of("mean", 1.0)).withObserved(Map.of("mean", observed));
        List<SamplerResult> results = new ArrayList<>();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < 8; s++) {
                SamplerSettings sampler = SamplerSettings.builder().particles(500).seed(4000 + 7919L * s)
                        .targets(SequenceSettings.abc(abc)).build();
                // The backend closes the model (its workers) at the end of each run: a fresh one per seed.
                try (ProgramSimulator model = new ProgramSimulator(settings(1))) {
                    SamplerResult result = new SmcSampler(sampler).run(model, backend);
                    assertEquals(0, result.evaluations().invalid(), "no invalid simulation");
                    assertEquals(0.1, result.lastTolerance().tolerance(), "every run ends at the final tolerance");
                    results.add(result);
                }
            }
        }
        AbcReferenceTest.assertPosterior(AbcExact.normalMean(observed, 1.0, 10, 0.0, 3.0, 0.1), results);
    }
}
