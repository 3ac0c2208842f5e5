package org.skerry.engine.temper;

import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.target.Target;
import org.skerry.engine.target.TargetSequence;

/**
 * Likelihood tempering: targets {@code prior × likelihood^φ} from φ = 0 to 1, the next φ chosen
 * by a {@link TemperatureRule} (Neal 2001, Statistics and Computing 11; Jasra, Stephens,
 * Doucet &amp; Tsagaris 2011, Scandinavian Journal of Statistics 38). Particles carry the whole
 * log-likelihood, so a step costs no likelihood calls: the increment {@code Δφ·log L} is
 * computed on the driver and the blocks' reweighting joins their next step.
 */
public final class LikelihoodTempering implements TargetSequence {

    private final TemperatureRule rule;

    public LikelihoodTempering(TemperatureRule rule) {
        if (rule == null) {
            throw new IllegalArgumentException("rule must not be null");
        }
        this.rule = rule;
    }

    public TemperatureRule rule() {
        return rule;
    }

    @Override
    public Target first() {
        return new TemperedTarget(0.0);
    }

    @Override
    public Target at(double progress) {
        return new TemperedTarget(progress);
    }

    @Override
    public Step advance(Target current, TemperingInputs inputs, double logTotal, Population population,
            int iteration) {
        double from = ((TemperedTarget) current).temperature();
        double to = rule.next(from, inputs, logTotal);
        if (!(to > from && to <= 1.0)) {
            throw new IllegalStateException("temperature rule " + rule + " returned " + to + " after " + from);
        }
        int n = inputs.size();
        double[] logLikelihood = inputs.logLikelihood();
        double[] increment = new double[n];
        double delta = to - from;
        for (int i = 0; i < n; i++) {
            increment[i] = TemperedTarget.logIncrement(logLikelihood[i], delta);
        }
        population.defer(cursor -> {
            Reweighting.reweight(cursor.block(), from, to);
            return null;
        });
        return new Step(new TemperedTarget(to), increment, EvaluationTally.NONE);
    }

    @Override
    public String description() {
        return "likelihood tempering (" + rule + ")";
    }
}
