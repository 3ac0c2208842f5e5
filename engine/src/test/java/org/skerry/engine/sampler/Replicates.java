package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.skerry.engine.model.Model;
import org.skerry.engine.population.threads.ThreadPoolBackend;

/**
 * Runs the sampler over several seeds and summarises the spread of its estimates: the yardstick
 * every statistical tolerance in these tests is built from.
 */
final class Replicates {

    final List<SamplerResult> results = new ArrayList<>();

    static Replicates run(Model model, SamplerSettings settings, int seeds) {
        Replicates replicates = new Replicates();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int s = 0; s < seeds; s++) {
                SamplerSettings seeded = settings.toBuilder().seed(1000 + 7919L * s).build();
                replicates.results.add(new SmcSampler(seeded).run(model, backend));
            }
        }
        return replicates;
    }

    SummaryStatistics logEvidence() {
        SummaryStatistics stats = new SummaryStatistics();
        results.forEach(r -> stats.addValue(r.evidence().logEvidence()));
        return stats;
    }

    SummaryStatistics mean(int parameter) {
        SummaryStatistics stats = new SummaryStatistics();
        results.forEach(r -> stats.addValue(r.parameters().get(parameter).mean()));
        return stats;
    }

    SummaryStatistics sd(int parameter) {
        SummaryStatistics stats = new SummaryStatistics();
        results.forEach(r -> stats.addValue(r.parameters().get(parameter).sd()));
        return stats;
    }

    SummaryStatistics quantile(int parameter, java.util.function.ToDoubleFunction<ParameterSummary> which) {
        SummaryStatistics stats = new SummaryStatistics();
        results.forEach(r -> stats.addValue(which.applyAsDouble(r.parameters().get(parameter))));
        return stats;
    }

    /** Standard error of the mean of a replicated statistic. */
    static double standardError(SummaryStatistics stats) {
        return stats.getStandardDeviation() / Math.sqrt(stats.getN());
    }

    /**
     * The bias-corrected evidence statistic: mean(log Ẑ) + Var(log Ẑ)/2, since log Ẑ is biased low
     * by about half its variance (Del Moral 2004; a log-normal approximation).
     */
    double correctedLogEvidence() {
        SummaryStatistics stats = logEvidence();
        return stats.getMean() + 0.5 * stats.getVariance();
    }
}
