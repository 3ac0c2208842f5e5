package org.skerry.engine.abc;

import java.util.List;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.population.BlockReports;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.target.Target;
import org.skerry.engine.target.TargetSequence;

/**
 * Adaptive ABC-SMC as a sequence of targets (Del Moral, Doucet &amp; Jasra 2012, Statistics and
 * Computing 22): tolerances from +∞ (the prior) down to a final tolerance, each chosen so that the
 * ESS falls by a set factor, or so that a set share of the simulations stays within it
 * ({@link ToleranceChoice}, {@link ToleranceRule}), or taken from a fixed schedule. A step
 * gathers every particle's kept summaries (M·s numbers a particle: the one place an ABC run sends
 * more than a few scalars per particle to the driver), re-estimates the distance weights when
 * they adapt ({@link DistanceScales}, Prangle 2017, Bayesian Analysis 12(1)), chooses the
 * tolerance, and defers the blocks' reweighting, which recomputes each particle's kernel from its
 * summaries under the new distance, to their next step.
 *
 * <p>The sequence also owns what differs from a likelihood run around the loop: the number of MH
 * steps (fixed, or from the pilot's acceptance with a cap), and the early ends (an acceptance floor,
 * a budget of simulations). Runs on the driver; immutable.
 */
public final class AbcSequence implements TargetSequence {

    private final AbcSettings settings;
    private final List<String> names;
    private final double[] observed;
    /** Fixed distance weights in summary order, or null to estimate them. */
    private final double[] weights;

    /**
     * @throws IllegalArgumentException when the observed summaries are missing or their number
     *     differs from the simulator's, or the fixed weights' number does
     */
    public AbcSequence(SummarySimulator simulator, AbcSettings settings) {
        this.settings = settings;
        this.names = List.copyOf(simulator.summaryNames());
        if (names.isEmpty()) {
            throw new IllegalArgumentException("the simulator names no summaries");
        }
        double[] given = settings.observed() != null ? inOrder(settings.observed(), "observed summary")
                : simulator.observedSummaries();
        if (given == null) {
            throw new IllegalArgumentException("no observed summaries: the model holds none, and the run gives none");
        }
        if (given.length != names.size()) {
            throw new IllegalArgumentException("the model gives " + given.length + " observed summaries for its "
                    + names.size() + " summaries " + names);
        }
        for (int k = 0; k < given.length; k++) {
            if (!Double.isFinite(given[k])) {
                throw new IllegalArgumentException("observed summary '" + names.get(k) + "' is " + given[k]);
            }
        }
        this.observed = given;
        this.weights = settings.weights() == null ? null : inOrder(settings.weights(), "distance weight");
    }

    /**
     * The values of {@code named} in the order of the simulator's summaries.
     *
     * @throws IllegalArgumentException naming a summary the map lacks, or a name the simulator has not
     */
    private double[] inOrder(java.util.Map<String, Double> named, String what) {
        for (String name : named.keySet()) {
            if (!names.contains(name)) {
                throw new IllegalArgumentException(what + " '" + name + "': the simulator has no such summary; its "
                        + "summaries are " + names);
            }
        }
        double[] values = new double[names.size()];
        for (int k = 0; k < values.length; k++) {
            Double value = named.get(names.get(k));
            if (value == null) {
                throw new IllegalArgumentException(what + " missing for summary '" + names.get(k) + "' (the simulator's "
                        + "summaries are " + names + ")");
            }
            values[k] = value;
        }
        return values;
    }

    public AbcSettings settings() {
        return settings;
    }

    /** The summaries' names. */
    public List<String> summaryNames() {
        return names;
    }

    /** The observed summaries. */
    public double[] observed() {
        return observed.clone();
    }

    @Override
    public Target first() {
        return new AbcTarget(Double.POSITIVE_INFINITY, 0.0, weights, observed, settings.kernel(),
                settings.simulations());
    }

    @Override
    public Target at(double progress) {
        throw new UnsupportedOperationException("an ABC target is restored from its state, not its progress");
    }

    @Override
    public double[] state(Target target) {
        return ((AbcTarget) target).state();
    }

    @Override
    public Target restore(double progress, double[] state) {
        if (state == null || state.length < 1) {
            throw new IllegalArgumentException("the checkpoint holds no ABC tolerance");
        }
        double[] weights = state.length == 1 ? null : java.util.Arrays.copyOfRange(state, 1, state.length);
        return new AbcTarget(state[0], progress, weights, observed, settings.kernel(), settings.simulations());
    }

    @Override
    public Step advance(Target current, TemperingInputs inputs, double logTotal, Population population, int iteration) {
        AbcTarget from = (AbcTarget) current;
        int m = settings.simulations();
        int s = observed.length;
        int width = m * s;
        int n = inputs.size();
        List<BlockReports.Auxiliary> parts = population.read(cursor -> BlockReports.Auxiliary.of(cursor.current()));
        double[] logWeight = new double[n];
        double[] oldKernel = new double[n];
        double[] summaries = new double[n * width];
        int offset = 0;
        for (BlockReports.Auxiliary part : parts) {
            int size = part.weights().logWeight().length;
            System.arraycopy(part.weights().logWeight(), 0, logWeight, offset, size);
            System.arraycopy(part.weights().logLikelihood(), 0, oldKernel, offset, size);
            System.arraycopy(part.values(), 0, summaries, offset * width, size * width);
            offset += size;
        }
        boolean[] alive = new boolean[n];
        for (int i = 0; i < n; i++) {
            alive[i] = logWeight[i] > Double.NEGATIVE_INFINITY && oldKernel[i] > Double.NEGATIVE_INFINITY;
        }
        double[] weights = this.weights != null ? this.weights
                : DistanceScales.weights(summaries, alive, m, names, from.weights());
        double tolerance;
        double[] schedule = settings.schedule();
        if (schedule.length > 0) {
            tolerance = settings.finalTolerance();
            for (double value : schedule) {
                if (value < from.tolerance()) {
                    tolerance = value;
                    break;
                }
            }
        } else {
            double[] distances = new double[n * m];
            for (int i = 0; i < n; i++) {
                if (alive[i]) {
                    for (int k = 0; k < m; k++) {
                        distances[i * m + k] = Distance.of(summaries, i * width + k * s, observed, weights);
                    }
                }
            }
            // Under new distance weights the last tolerance is in other units. The new tolerance stays
            // within the one whose ball holds the last ball, ε·maxₖ(w′ₖ/wₖ), so it never loosens; within
            // that, the ESS rule chooses.
            double bound = from.tolerance();
            double[] last = from.weights();
            if (last != null && bound < Double.POSITIVE_INFINITY) {
                double ratio = 1.0;
                for (int k = 0; k < s; k++) {
                    ratio = Math.max(ratio, weights[k] / last[k]);
                }
                bound *= ratio;
            }
            double chosen = settings.toleranceRule() == ToleranceRule.SHARE
                    ? ToleranceChoice.byShare(alive, distances, m, bound, settings.shareFactor())
                    : ToleranceChoice.next(logWeight, oldKernel, distances, m, bound, settings.essFactor(),
                            settings.kernel());
            if (Double.isNaN(chosen)) {
                throw new ToleranceStalledException("the tolerance cannot fall below " + from.tolerance() + ": no "
                        + "living particle's simulation lies closer to the observed summaries; the final tolerance "
                        + settings.finalTolerance() + " was not reached (more particles or MH steps may get "
                        + "further)");
            }
            tolerance = Math.max(chosen, settings.finalTolerance());
        }
        AbcTarget next = new AbcTarget(tolerance, progress(from, tolerance), weights, observed, settings.kernel(), m);
        double[] increment = new double[n];
        long within = 0;
        long simulated = 0;
        for (int i = 0; i < n; i++) {
            increment[i] = AbcBlocks.increment(oldKernel[i], next.logMeanKernel(summaries, i * width));
            if (alive[i]) {
                simulated += m;
                for (int k = 0; k < m; k++) {
                    if (Distance.of(summaries, i * width + k * s, observed, weights) <= tolerance) {
                        within++;
                    }
                }
            }
        }
        population.defer(cursor -> {
            AbcBlocks.reweight(cursor.block(), next, null);
            return null;
        });
        double share = simulated == 0 ? 0.0 : (double) within / simulated;
        return new Step(next, increment, EvaluationTally.NONE, share);
    }

    /**
     * The progress at tolerance {@code tolerance} after {@code from}: 1 at the final tolerance,
     * else ε* ÷ ε, but always above the last progress (ε may grow when the distance weights change).
     */
    private double progress(AbcTarget from, double tolerance) {
        if (tolerance <= settings.finalTolerance()) {
            return 1.0;
        }
        double ratio = settings.finalTolerance() / tolerance;
        return Math.min(Math.max(ratio, Math.nextUp(from.progress())), Math.nextDown(1.0));
    }

    /** Simulations one evaluation makes: M. */
    public int simulationsPerEvaluation() {
        return settings.simulations();
    }

    /** The tolerance of {@code target}. */
    public double tolerance(Target target) {
        return ((AbcTarget) target).tolerance();
    }

    /** MH steps after a one-step pilot with acceptance {@code acceptance}: Drovandi &amp; Pettitt (2011)'s
     * count for the stay probability, at most the cap. */
    public int steps(double acceptance) {
        return org.skerry.engine.move.MoveAdaptation.steps(acceptance, settings.stayProbability(), settings.maxSteps());
    }

    /**
     * Why the run ends before the final tolerance, or null to go on: the last iteration's move
     * acceptance under the floor, or the budget of simulations spent.
     *
     * @param acceptance  the last iteration's move acceptance (NaN after the initial draw)
     * @param simulations simulations so far
     */
    public String endReason(Target target, double acceptance, long simulations) {
        double tolerance = tolerance(target);
        if (settings.acceptanceFloor() > 0 && acceptance < settings.acceptanceFloor()) {
            return "the move acceptance fell to " + acceptance + ", under the floor " + settings.acceptanceFloor()
                    + ", at tolerance " + tolerance + "; the final tolerance " + settings.finalTolerance()
                    + " was not reached";
        }
        if (settings.simulationBudget() > 0 && simulations >= settings.simulationBudget()) {
            return "the budget of " + settings.simulationBudget() + " simulations was spent (" + simulations
                    + ") at tolerance " + tolerance + "; the final tolerance " + settings.finalTolerance()
                    + " was not reached";
        }
        return null;
    }

    @Override
    public String description() {
        return "ABC tolerances down to " + settings.finalTolerance();
    }
}
