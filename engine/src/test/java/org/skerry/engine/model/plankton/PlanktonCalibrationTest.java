package org.skerry.engine.model.plankton;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.distribution.BinomialDistribution;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * Simulation-based calibration of the sampler on the plankton model (Cook, Gelman &amp; Rubin
 * 2006, J. Comput. Graph. Stat. 15(3); Talts, Betancourt, Simpson, Vehtari &amp; Gelman 2018,
 * arXiv:1804.06788): draw the parameters from the prior, simulate a short season from them,
 * calibrate, and count how often the posterior intervals hold the drawn truth. If the posterior
 * is right, each count is Binomial(datasets, level) whatever the model; the bounds are that
 * binomial's exact 0.001 quantiles (Commons Math {@link BinomialDistribution}), so each check
 * fails by chance with probability at most 0.001 (0.018 over all 18 checks). For 24 datasets:
 * at least 19 of the 95 % intervals, and 5 to 19 of the 50 % intervals, which also catches
 * posteriors that are too wide. The datasets use the demo buoy's constants, sigmoidal grazing,
 * the default priors and a 10-week season (days 0 to 63: the spring bloom, its grazing-down and
 * the rebound).
 */
@Slow
class PlanktonCalibrationTest {

    private static final int DATASETS = 24;
    private static final int WEEKS = 10;
    private static final int PARTICLES = 200;
    private static final long SEED = 20240611L;

    @Test
    @DisplayName("95 % and 50 % posterior intervals cover prior-drawn truths as often as Binomial(24, level) allows")
    void coverage() {
        QuellmarBuoy buoy = QuellmarScenario.demoBuoy();
        IndependentPrior prior = PlanktonPriors.defaults();
        PlanktonDynamics dynamics = PlanktonDynamics.of(GrazingResponse.SIGMOIDAL, buoy.constants(),
                QuellmarScenario.seasonDays(WEEKS));
        double[] days = dynamics.days();
        int d = PlanktonModel.PARAMETER_NAMES.size();
        int[] covered95 = new int[d];
        int[] covered50 = new int[d];
        long evaluations = 0;
        long invalid = 0;
        long start = System.nanoTime();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int k = 0; k < DATASETS; k++) {
                double[] truth = new double[d];
                prior.sample(new RandomStream(SEED, StreamPurpose.TESTING, 0, k), truth);
                double[] chlorophyll = QuellmarData.simulate(dynamics, truth,
                        new RandomStream(SEED, StreamPurpose.TESTING, 1, k));
                PlanktonModel model = PlanktonModel.of(GrazingResponse.SIGMOIDAL, buoy.constants(), prior, days,
                        chlorophyll);
                // A 10 % chance of a particle never moving per iteration, rather than the default 1 %,
                // cuts the MH steps by about a third to fit the time budget; coverage is checked for
                // exactly these settings.
                SamplerSettings settings = SamplerSettings.builder().particles(PARTICLES).seed(SEED + k)
                        .stayProbability(0.1).build();
                SamplerResult result = new SmcSampler(settings).run(model, backend);
                evaluations += result.evaluations().evaluations();
                invalid += result.evaluations().invalid();
                for (int i = 0; i < d; i++) {
                    ParameterSummary s = result.parameters().get(i);
                    if (s.q2_5() <= truth[i] && truth[i] <= s.q97_5()) {
                        covered95[i]++;
                    }
                    if (s.q25() <= truth[i] && truth[i] <= s.q75()) {
                        covered50[i]++;
                    }
                }
            }
        }
        BinomialDistribution at95 = new BinomialDistribution(DATASETS, 0.95);
        BinomialDistribution at50 = new BinomialDistribution(DATASETS, 0.5);
        // inverseCumulativeProbability(p) is the smallest x with P(X <= x) >= p, so
        // P(X < low) < 0.001 and P(X > high) <= 0.001.
        int low95 = at95.inverseCumulativeProbability(0.001);
        int low50 = at50.inverseCumulativeProbability(0.001);
        int high50 = at50.inverseCumulativeProbability(0.999);
        StringBuilder report = new StringBuilder();
        for (int i = 0; i < d; i++) {
            report.append(PlanktonModel.PARAMETER_NAMES.get(i)).append(": 95% ").append(covered95[i])
                    .append(", 50% ").append(covered50[i]).append("; ");
        }
        String counts = report + "bounds: 95% >= " + low95 + ", 50% in [" + low50 + ", " + high50 + "]";
        assertEquals(0, invalid, "no solve fails at the parameter values the sampler visits");
        for (int i = 0; i < d; i++) {
            assertTrue(covered95[i] >= low95, counts);
            assertTrue(covered50[i] >= low50 && covered50[i] <= high50, counts);
        }
        System.out.println("plankton calibration: " + DATASETS + " datasets, " + evaluations + " likelihood evaluations ("
                + invalid + " invalid), " + (System.nanoTime() - start) / 1e9 + " s; " + counts);
    }
}
