package org.skerry.engine.calibration;

import java.util.Locale;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * Island mode without interaction: the islands' spread error and the Lee–Whiteley error of the
 * same runs against the observed sd of log Ẑ over seeds. Arguments: islands, seeds.
 */
public final class IslandErrorStudy {

    private IslandErrorStudy() {
    }

    public static void main(String[] args) {
        int islands = Integer.parseInt(args[0]);
        int seeds = Integer.parseInt(args[1]);
        for (CalibrationCase c : new CalibrationCase[] {CalibrationCase.normalMean(1000),
                CalibrationCase.linearRegression(1000), CalibrationCase.shells(2, 2000)}) {
            SummaryStatistics logZ = new SummaryStatistics();
            SummaryStatistics island = new SummaryStatistics();
            SummaryStatistics genealogy = new SummaryStatistics();
            try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
                for (int s = 0; s < seeds; s++) {
                    SamplerResult r = new SmcSampler(SamplerSettings.builder().particles(c.particles()).islands(islands)
                            .seed(900 + s).build()).run(c.model(), backend);
                    logZ.addValue(r.evidence().logEvidence());
                    double e = r.evidence().islandStandardError();
                    island.addValue(e * e);
                    double g = r.evidence().standardError();
                    if (!Double.isNaN(g)) {
                        genealogy.addValue(g * g);
                    }
                }
            }
            double sd = logZ.getStandardDeviation();
            System.out.printf(Locale.ROOT, "%s, K=%d, %d seeds: sd %.4f, island error (rms) %.4f (ratio %.3f),"
                    + " Lee-Whiteley (rms) %.4f (ratio %.3f)%n", c, islands, seeds, sd, Math.sqrt(island.getMean()),
                    Math.sqrt(island.getMean()) / sd, Math.sqrt(genealogy.getMean()), Math.sqrt(genealogy.getMean()) / sd);
        }
    }
}
