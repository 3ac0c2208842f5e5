package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.abc.AbcSequence;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.LadderChoice;
import org.skerry.engine.move.MoveAdaptation;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.move.ProposalFit;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.ParticleSink;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.resample.ResamplingThreshold;
import org.skerry.engine.target.Target;
import org.skerry.engine.target.TargetSequence;
import org.skerry.engine.temper.TemperedTarget;
import org.skerry.engine.weight.LogWeights;

/**
 * The sequential Monte Carlo sampler: the one loop, run on the driver, that walks tempered
 * targets {@code prior × likelihood^φ} from φ = 0 to 1 over a {@link Population} held by any
 * backend (Del Moral, Doucet &amp; Jasra 2006, JRSS-B 68(3); Chopin 2002, Biometrika 89(3);
 * Neal 2001, Statistics and Computing 11).
 *
 * <p>Each iteration: choose the next temperature from the particles' log-weights and
 * log-likelihoods; add the log of the weighted mean incremental weight to the log evidence;
 * reweight; resample when the ESS falls below the threshold; fit a proposal to the weighted
 * population; make Metropolis–Hastings steps invariant for the new target, their number adapted
 * from a one-step pilot's acceptance. The driver only ever sees scalars per particle and sums per
 * block.
 */
public final class SmcSampler {

    private final SamplerSettings settings;
    /** Where the final population streams, or null to keep it whole in the result. */
    private final ParticleSink sink;

    public SmcSampler(SamplerSettings settings) {
        this(settings, null);
    }

    private SmcSampler(SamplerSettings settings, ParticleSink sink) {
        if (settings == null) {
            throw new IllegalArgumentException("settings must not be null");
        }
        this.settings = settings;
        this.sink = sink;
    }

    /**
     * The same sampler, streaming the final population to {@code sink} in canonical order instead
     * of keeping it: its results' {@link SamplerResult#particles()} is then null, and the driver
     * never holds more than one run of particles, their weights and Eve indices, and one
     * parameter's column at a time.
     */
    public SmcSampler streamingTo(ParticleSink sink) {
        if (sink == null) {
            throw new IllegalArgumentException("sink must not be null");
        }
        return new SmcSampler(settings, sink);
    }

    public SamplerSettings settings() {
        return settings;
    }

    /** Runs to φ = 1 on a new population of {@code backend}. */
    public SamplerResult run(Model model, PopulationBackend backend) {
        return run(model, backend, IterationListener.NONE);
    }

    /** Runs to φ = 1 on a new population of {@code backend}, telling {@code listener} about each iteration. */
    public SamplerResult run(Model model, PopulationBackend backend, IterationListener listener) {
        return run(ModelSource.local(model), backend, listener);
    }

    /**
     * Runs to φ = 1 with the model {@code source} builds; a distributed backend builds it again on
     * each executor.
     */
    public SamplerResult run(ModelSource source, PopulationBackend backend, IterationListener listener) {
        return run(source, backend, listener, Checkpointer.NONE, StopCondition.NEVER);
    }

    /**
     * Runs to φ = 1, checkpointing as {@code checkpointer} says and stopping early (after a final
     * checkpoint, with {@link RunStoppedException}) when {@code stop} gives a reason.
     */
    public SamplerResult run(ModelSource source, PopulationBackend backend, IterationListener listener,
            Checkpointer checkpointer, StopCondition stop) {
        Model model = source.create();
        checkModel(model);
        TargetSequence sequence = sequenceFor(model);
        try (Population population = open(source, model, backend)) {
            Walk walk = new Walk(model, sequence, population, listener, checkpointer, stop);
            walk.start();
            return walk.toEnd();
        }
    }

    /**
     * Continues a run from a checkpoint: {@code from} fills a new population with the saved blocks
     * and returns the saved driver state; the result is bit for bit the one the undisturbed run
     * would have given (timings aside).
     */
    public SamplerResult resume(ModelSource source, PopulationBackend backend, IterationListener listener,
            Checkpointer checkpointer, StopCondition stop, Resumption from) {
        Model model = source.create();
        checkModel(model);
        TargetSequence sequence = sequenceFor(model);
        try (Population population = open(source, model, backend)) {
            Walk walk = new Walk(model, sequence, population, listener, checkpointer, stop);
            walk.restore(from.restore(population));
            return walk.toEnd();
        }
    }

    /**
     * The sequence of targets the settings ask for on {@code model}.
     *
     * @throws IllegalArgumentException when the model cannot walk it (data tempering needs a
     *     likelihood per observation range)
     */
    public TargetSequence sequenceFor(Model model) {
        return settings.targets().create(model, settings.tempering().rule(), settings.population().seed(),
                settings.evaluation().retries());
    }

    private Population open(ModelSource source, Model model, PopulationBackend backend) {
        int islands = settings.islands().count();
        if (islands < 0 || islands > settings.population().particles()) {
            throw new IllegalArgumentException("islands must be in [0, " + settings.population().particles() + "], was " + islands);
        }
        return new Population(backend.open(source, settings.population().particles(), islands), settings.population().particles(),
                model.dimension(), settings.population().seed(), settings.evaluation().retries());
    }

    private void checkModel(Model model) {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        int d = model.parameters().dimension();
        if (model.prior().dimension() != d) {
            throw new IllegalArgumentException("the prior has " + model.prior().dimension()
                    + " dimensions but the model has " + d + " parameters " + model.parameters().names());
        }
        Prior proposal = settings.population().startProposal();
        if (proposal != null && proposal.dimension() != d) {
            throw new IllegalArgumentException("the start proposal has " + proposal.dimension()
                    + " dimensions but the model has " + d + " parameters " + model.parameters().names());
        }
    }

    /** One run's walk from prior to posterior: the loop's state between iterations. */
    private final class Walk {

        private final Model model;
        private final TargetSequence sequence;
        private final Population population;
        private final IterationListener listener;
        private final Checkpointer checkpointer;
        private final StopCondition stop;
        private final int n = settings.population().particles();
        private final double logN = StrictMath.log(n);
        private final List<IterationRecord> records = new ArrayList<>();
        /** Why an ABC run's tolerance could not fall further, or null. */
        private String stalled;
        /** The ABC sequence when the run walks tolerances, else null. */
        private final AbcSequence abc;

        private TemperingInputs inputs;
        private int iteration;
        private Target target;
        private double scale;
        private double logEvidence;
        private double logTotal;
        private int resamplings;
        private EvaluationTally total;
        private IslandLedger islands;
        private int checkpointed = -1;

        Walk(Model model, TargetSequence sequence, Population population, IterationListener listener,
                Checkpointer checkpointer, StopCondition stop) {
            this.model = model;
            this.sequence = sequence;
            this.population = population;
            this.listener = listener;
            this.checkpointer = checkpointer;
            this.stop = stop;
            this.abc = sequence instanceof AbcSequence tolerances ? tolerances : null;
        }

        /** The initial draw: iteration 0. */
        void start() {
            long start = System.nanoTime();
            target = sequence.first();
            Population.Start drawn = population.initialise(settings.population().startProposal(), target);
            total = drawn.tally();
            double evaluateSeconds = seconds(start);
            InvalidEvaluationsException.check(settings, 0, total, model.parameters());
            inputs = drawn.inputs();
            logTotal = LogWeights.logSum(inputs.logWeight(), n);
            if (logTotal == Double.NEGATIVE_INFINITY) {
                throw new SamplingFailedException(0, "every particle's weight is zero after the initial draw ("
                        + n + " particles; " + total + ")");
            }
            logEvidence = settings.population().startProposal() == null ? 0.0 : logTotal - logN;
            islands = settings.islands().count() > 0
                    ? new IslandLedger(inputs.blockSizes(), inputs.logWeight(), settings.population().startProposal() != null) : null;
            scale = settings.moves().initialScale();
            resamplings = 0;
            iteration = 0;
            finishIteration(new IterationRecord(0, target.progress(), LogWeights.effectiveSampleSize(inputs.logWeight(), n),
                    false, n, 0, Double.NaN, 0, scale, logEvidence, logEvidence, total.evaluations(),
                    total.zeroLikelihood(), total.invalid(), total.firstInvalidIndex(), total.firstInvalidReason(),
                    new PhaseTimes(evaluateSeconds, 0, 0, 0, 0, 0, 0, 0),
                    total.retried(), total.failedAfterRetries(), IterationRecord.valuesOf(total),
                    abc == null ? null : new ToleranceRecord(abc.tolerance(target), 1.0,
                            total.evaluations() * abc.simulationsPerEvaluation())));
        }

        /** Continues from a saved state, the population already holding the saved blocks. */
        void restore(SamplerState state) {
            if (state.islandSizes() != null && settings.islands().count() != state.islandSizes().length) {
                throw new IllegalArgumentException("the checkpoint has " + state.islandSizes().length
                        + " islands; the settings ask for " + settings.islands().count());
            }
            iteration = state.iteration();
            target = sequence.restore(state.temperature(), state.targetState());
            scale = state.scale();
            logEvidence = state.logEvidence();
            logTotal = state.logTotal();
            resamplings = state.resamplings();
            total = state.evaluations();
            records.addAll(state.records());
            islands = state.islandSizes() == null ? null
                    : IslandLedger.restored(state.islandSizes(), state.islandLogEvidence(), state.islandsIndependent());
            checkpointed = iteration;
            inputs = null;
        }

        SamplerResult toEnd() {
            boolean progressed = false;
            while (!sequence.isLast(target) && endedEarly() == null) {
                String reason = stop.reasonToStop(state(), predictedSeconds());
                // A resumed run makes at least one iteration before a wall-time stop, so that a job
                // requeued again and again always gets further.
                if (reason != null && (progressed || stop.urgent())) {
                    if (checkpointer.enabled() && checkpointed != iteration) {
                        checkpointer.write(state(), population);
                    }
                    throw new RunStoppedException(iteration, reason);
                }
                try {
                    step();
                } catch (org.skerry.engine.abc.ToleranceStalledException e) {
                    // Nothing of the iteration was done: the population stays at the last tolerance.
                    iteration--;
                    stalled = e.reason();
                    break;
                }
                progressed = true;
            }
            return result();
        }

        private SamplerState state() {
            return new SamplerState(iteration, target.progress(), scale, logEvidence, logTotal, resamplings, total, records,
                    islands == null ? null : islands.sizes(), islands == null ? null : islands.logEvidences(),
                    islands == null || islands.independent(), sequence.state(target));
        }

        /**
         * Why an ABC run ends before its final tolerance (its acceptance floor, its budget of
         * simulations), from the recorded iterations alone, so a resumed run decides alike, or a
         * tolerance that cannot fall (which a resumed run meets again at the same iteration); null
         * to go on, and always for other runs.
         */
        private String endedEarly() {
            if (stalled != null) {
                return stalled;
            }
            if (abc == null || records.isEmpty()) {
                return null;
            }
            IterationRecord last = records.get(records.size() - 1);
            long simulations = 0;
            for (IterationRecord record : records) {
                simulations += record.abc().simulations();
            }
            return abc.endReason(target, last.iteration() == 0 ? Double.NaN : last.acceptanceRate(), simulations);
        }

        /** The longest of the last three iterations: a cautious guess at the next one's wall time. */
        private double predictedSeconds() {
            double longest = 0;
            for (int k = Math.max(1, records.size() - 3); k < records.size(); k++) {
                longest = Math.max(longest, records.get(k).seconds().total());
            }
            return longest;
        }

        /** Records an iteration, checkpoints when due (and at the end), then tells the listener. */
        private void finishIteration(IterationRecord record) {
            records.add(record);
            boolean ending = sequence.isLast(target) || endedEarly() != null;
            if (checkpointer.due(iteration) || (ending && checkpointer.enabled())) {
                long phase = System.nanoTime();
                checkpointer.write(state(), population);
                checkpointed = iteration;
                record = record.withSeconds(record.seconds().withCheckpoint(seconds(phase)));
                records.set(records.size() - 1, record);
            }
            listener.iterationFinished(record);
        }

        private void step() {
            iteration++;
            if (iteration > settings.tempering().maxIterations()) {
                throw new SamplingFailedException(iteration, (target instanceof TemperedTarget tempered
                        ? "tempering reached only φ = " + tempered.temperature()
                        : sequence.description() + " reached only " + target)
                        + " after " + settings.tempering().maxIterations() + " iterations (maxIterations)");
            }
            long phase = System.nanoTime();
            inputs = inputs != null ? inputs : population.temperingInputs();
            Target from = target;
            TargetSequence.Step advance = sequence.advance(from, inputs, logTotal, population, iteration);
            Target next = advance.next();
            if (!(next.progress() > from.progress() && next.progress() <= 1.0)) {
                throw new IllegalStateException(sequence.description() + " went from " + from + " to " + next);
            }
            double[] logWeight = inputs.logWeight();
            double[] logIncrement = advance.logIncrement();
            inputs = null;
            double[] newLogWeight = new double[n];
            for (int i = 0; i < n; i++) {
                newLogWeight[i] = logWeight[i] + logIncrement[i];
            }
            double newLogTotal = LogWeights.logSum(newLogWeight, n);
            double ess = LogWeights.effectiveSampleSize(newLogWeight, n);
            double temperatureSeconds = seconds(phase);
            EvaluationTally stepEvaluations = advance.evaluations();
            if (newLogTotal == Double.NEGATIVE_INFINITY) {
                EvaluationTally sofar = total.followedBy(stepEvaluations);
                throw new SamplingFailedException(iteration, "every particle's weight is zero at "
                        + describeTarget(next) + " (" + n + " particles; " + sofar.invalid()
                        + " invalid evaluations and " + sofar.zeroLikelihood() + " zero likelihoods so far"
                        + (sofar.firstInvalidIndex() >= 0 ? "; first invalid: particle " + sofar.firstInvalidIndex()
                                + ": " + sofar.firstInvalidReason() : "") + ")");
            }
            double increment = newLogTotal - logTotal;
            logEvidence += increment;
            if (islands != null) {
                islands.advance(logWeight, newLogWeight);
            }
            target = next;
            logTotal = newLogTotal;
            double reweightSeconds = 0;

            phase = System.nanoTime();
            long ancestors = LogWeights.countAlive(newLogWeight, n);
            long moved = 0;
            double redistributeSeconds = 0;
            boolean resample;
            boolean global;
            if (islands == null) {
                resample = settings.resampling().everyIteration() || ResamplingThreshold.reached(ess, n, settings.resampling().threshold());
                global = true;
            } else {
                global = (settings.islands().interactionEvery() > 0 && iteration % settings.islands().interactionEvery() == 0)
                        || islands.islandWeightEssFraction(newLogWeight) < settings.islands().interactionThreshold();
                resample = global || settings.resampling().everyIteration()
                        || ResamplingThreshold.reached(islands.withinIslandEssFraction(newLogWeight), 1.0,
                                settings.resampling().threshold());
            }
            MomentSums moments = null;
            if (resample) {
                Population.Resampling resampling;
                if (global) {
                    resampling = population.resample(settings.resampling().scheme(), logTotal, iteration);
                    logTotal = logN;
                    if (islands != null) {
                        islands.interacted();
                    }
                } else {
                    logTotal = LogWeights.logSum(islands.afterIslandResampling(newLogWeight), n);
                    resampling = population.resampleIslands(settings.resampling().scheme(), iteration, logTotal);
                }
                ResamplingReport report = resampling.report();
                moments = resampling.moments();
                ancestors = report.distinctAncestors();
                moved = report.particlesMoved();
                redistributeSeconds = report.redistributeSeconds();
                resamplings++;
            }
            double resampleSeconds = seconds(phase) - redistributeSeconds;

            phase = System.nanoTime();
            if (moments == null) {
                moments = population.moments(logTotal);
            }
            Proposal proposal = ProposalFit.fit(settings.moves().kernel(), moments, scale);
            double fitSeconds = seconds(phase);

            phase = System.nanoTime();
            MoveTally moves;
            int steps;
            double usedScale = scale;
            boolean randomWalk = settings.moves().kernel() == MoveKernel.RANDOM_WALK;
            double targetAcceptance = settings.moves().targetAcceptance(model.parameters().dimension());
            boolean more = !sequence.isLast(target);
            if (abc != null) {
                // ABC: the scale stays as set (its acceptance is held down by the tolerance, not the
                // step size), and the step count follows ABC's own rule, never the likelihood runs'.
                int fixed = abc.settings().fixedSteps();
                if (fixed > 0) {
                    steps = fixed;
                    Population.Moves all = population.move(proposal, target, iteration, 0, steps, more);
                    moves = all.tally();
                    inputs = all.inputs();
                } else {
                    Population.Moves pilot = population.move(proposal, target, iteration, 0, 1, more);
                    moves = pilot.tally();
                    inputs = pilot.inputs();
                    steps = abc.steps(moves.acceptanceRate());
                    if (steps > 1) {
                        Population.Moves rest = population.move(proposal, target, iteration, 1, steps - 1, more);
                        moves = moves.plus(rest.tally());
                        inputs = rest.inputs();
                    }
                }
            } else if (settings.moves().fixedSteps() > 0) {
                steps = settings.moves().fixedSteps();
                Population.Moves last = population.move(proposal, target, iteration, 0, steps, more);
                moves = last.tally();
                inputs = last.inputs();
                if (randomWalk) {
                    scale = MoveAdaptation.nextScale(scale, moves.acceptanceRate(), targetAcceptance);
                }
            } else if (randomWalk) {
                // The pilot step tries four scales at once; the rest of the iteration uses the one
                // whose acceptance is nearest the target, and its step count follows from it.
                MoveTally pilot = population.move(proposal.withRungs(MoveAdaptation.ladder()), target,
                        iteration, 0, 1, false).tally();
                LadderChoice chosen = MoveAdaptation.scaleFromLadder(scale, pilot.proposedByRung(),
                        pilot.acceptedByRung(), targetAcceptance);
                usedScale = chosen.scale();
                steps = MoveAdaptation.steps(chosen.expectedAcceptance(), settings.moves().stayProbability(),
                        settings.moves().maxSteps());
                moves = pilot;
                if (steps > 1) {
                    Proposal tuned = ProposalFit.fit(settings.moves().kernel(), moments, usedScale);
                    Population.Moves rest = population.move(tuned, target, iteration, 1, steps - 1, more);
                    moves = pilot.plus(rest.tally());
                    inputs = rest.inputs();
                    scale = MoveAdaptation.nextScale(usedScale, rest.tally().acceptanceRate(), targetAcceptance);
                } else {
                    scale = usedScale;
                }
            } else {
                MoveTally pilot = population.move(proposal, target, iteration, 0, 1, false).tally();
                steps = MoveAdaptation.steps(pilot.acceptanceRate(), settings.moves().stayProbability(), settings.moves().maxSteps());
                moves = pilot;
                if (steps > 1) {
                    Population.Moves rest = population.move(proposal, target, iteration, 1, steps - 1, more);
                    moves = pilot.plus(rest.tally());
                    inputs = rest.inputs();
                }
            }
            double moveSeconds = seconds(phase);
            EvaluationTally evaluations = stepEvaluations.followedBy(moves.evaluations());
            InvalidEvaluationsException.check(settings, iteration, evaluations, model.parameters());
            total = total.followedBy(evaluations);

            finishIteration(new IterationRecord(iteration, target.progress(), ess, resample, ancestors, moved,
                    moves.acceptanceRate(), steps, usedScale, increment, logEvidence, evaluations.evaluations(),
                    evaluations.zeroLikelihood(), evaluations.invalid(), evaluations.firstInvalidIndex(),
                    evaluations.firstInvalidReason(),
                    new PhaseTimes(0, temperatureSeconds, reweightSeconds, resampleSeconds, redistributeSeconds,
                            fitSeconds, moveSeconds, 0),
                    evaluations.retried(), evaluations.failedAfterRetries(), IterationRecord.valuesOf(evaluations),
                    abc == null ? null : new ToleranceRecord(abc.tolerance(target), advance.shareWithin(),
                            evaluations.evaluations() * abc.simulationsPerEvaluation())));
        }

        private String describeTarget(Target next) {
            return next instanceof TemperedTarget tempered ? "temperature " + tempered.temperature() : next.toString();
        }

        private SamplerResult result() {
            long exportStart = System.nanoTime();
            // The population streams past once, in canonical order: to the sink, or into one
            // FinalParticles when none was given. The driver keeps 16 bytes a particle (weight,
            // Eve) and later one parameter's column at a time.
            double finalLogTotal = population.logWeightTotal();
            double[] weights = new double[n];
            long[] eve = new long[n];
            int d = model.dimension();
            FinalParticles whole = sink == null ? new FinalParticles(d, n, new double[n * d], new double[n],
                    new double[n], new double[n], new long[n], eve) : null;
            population.forEachRun(finalLogTotal, (run, rows) -> {
                int at = (int) rows.firstIndex();
                int count = rows.count();
                System.arraycopy(rows.weights(), 0, weights, at, count);
                System.arraycopy(run.eve(), 0, eve, at, count);
                if (whole == null) {
                    sink.accept(rows);
                } else {
                    System.arraycopy(run.values(), 0, whole.values(), at * d, count * d);
                    System.arraycopy(run.logWeight(), 0, whole.logWeight(), at, count);
                    System.arraycopy(run.logPrior(), 0, whole.logPrior(), at, count);
                    System.arraycopy(run.logLikelihood(), 0, whole.logLikelihood(), at, count);
                    System.arraycopy(run.index(), 0, whole.index(), at, count);
                }
            });
            List<ParameterSummary> summaries = whole != null
                    ? PosteriorSummaries.summarise(whole, weights, model.parameters())
                    : PosteriorSummaries.summarise(population::column, n, d, weights, model.parameters());
            EvidenceEstimate evidence = EvidenceError.estimate(logEvidence, eve, n, weights,
                    settings.resampling().scheme(), resamplings,
                    settings.population().minimumDistinctEves());
            if (islands != null) {
                evidence = evidence.withIslands(islands.islands(), islands.standardError());
            }
            return new SamplerResult(evidence, summaries, List.copyOf(records), total, whole, weights,
                    abc == null ? StepCapReport.of(records, settings) : StepCapReport.ofAbc(records, abc.settings()),
                    endedEarly(), seconds(exportStart));
        }
    }

    private static double seconds(long startNanos) {
        return (System.nanoTime() - startNanos) * 1e-9;
    }
}
