package org.skerry.benchmarks;

import java.util.Locale;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;
import org.skerry.engine.sampler.SamplerResult;

/**
 * The sampler's own phase times ({@link IterationRecord#seconds()}) summed over the iterations of
 * a run, beside the run's wall time: it says where a backend's time goes. Whatever the phases do
 * not cover (creating the population, exporting the particles, summaries) shows as "outside".
 */
final class PhaseTotals {

    private double evaluate;
    private double temperature;
    private double reweight;
    private double resample;
    private double fit;
    private double move;
    private double wall;
    private int runs;

    /** Adds one run's phases and its wall time. */
    void add(SamplerResult result, double wallSeconds) {
        for (IterationRecord record : result.iterations()) {
            PhaseTimes t = record.seconds();
            evaluate += t.evaluate();
            temperature += t.temperature();
            reweight += t.reweight();
            resample += t.resample() + t.redistribute();
            fit += t.fit();
            move += t.move();
        }
        wall += wallSeconds;
        runs++;
    }

    int runs() {
        return runs;
    }

    /** One line: mean seconds per run in each phase. */
    String describe(String label) {
        double n = Math.max(1, runs);
        double phases = evaluate + temperature + reweight + resample + fit + move;
        return String.format(Locale.ROOT, "phases %s (mean s/run over %d runs): evaluate %.3f, temperature %.3f, "
                + "reweight %.3f, resample %.3f, fit %.3f, move %.3f, sum %.3f, outside phases %.3f, wall %.3f",
                label, runs, evaluate / n, temperature / n, reweight / n, resample / n, fit / n, move / n,
                phases / n, (wall - phases) / n, wall / n);
    }
}
