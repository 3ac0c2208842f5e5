package org.skerry.engine.calibration;

import java.util.Locale;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.skerry.engine.model.plankton.GrazingResponse;
import org.skerry.engine.model.plankton.PlanktonModel;
import org.skerry.engine.model.plankton.QuellmarBuoy;
import org.skerry.engine.model.plankton.QuellmarData;
import org.skerry.engine.model.plankton.QuellmarScenario;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * The demo's calibration (buoy-07 of the invented Lake Quellmar, synthetic data regenerated with
 * the demo's seed, N = 400) replicated over seeds with default settings: spread of log Ẑ, likelihood
 * evaluations, share of iterations at the MH step cap. Prints one line per grazing variant.
 * Arguments: seeds.
 */
public final class DemoMoveStudy {

    private DemoMoveStudy() {
    }

    public static void main(String[] args) {
        int seeds = Integer.parseInt(args[0]);
        QuellmarBuoy buoy = QuellmarScenario.demoBuoy();
        double[][] rows = QuellmarData.generate(buoy, 20261201L);
        for (GrazingResponse grazing : GrazingResponse.values()) {
            PlanktonModel model = QuellmarScenario.model(buoy, rows, grazing);
            SummaryStatistics logZ = new SummaryStatistics();
            SummaryStatistics evaluations = new SummaryStatistics();
            long iterations = 0;
            long atCap = 0;
            SamplerSettings base = SamplerSettings.builder().particles(400).build();
            try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
                for (int s = 0; s < seeds; s++) {
                    SamplerResult r = new SmcSampler(base.toBuilder().seed(2026 + s).build()).run(model, backend);
                    logZ.addValue(r.evidence().logEvidence());
                    evaluations.addValue(r.evaluations().evaluations());
                    for (IterationRecord record : r.iterations()) {
                        if (record.iteration() > 0) {
                            iterations++;
                            if (record.mhSteps() >= base.moves().maxSteps()) {
                                atCap++;
                            }
                        }
                    }
                }
            }
            System.out.printf(Locale.ROOT, "demo %s N=400 seeds=%d: mean log Z %.3f, sd %.4f, evaluations %.0f,"
                    + " var x evaluations %.1f, iterations at cap %d of %d%n", grazing, seeds, logZ.getMean(),
                    logZ.getStandardDeviation(), evaluations.getMean(), logZ.getVariance() * evaluations.getMean(),
                    atCap, iterations);
        }
    }
}
