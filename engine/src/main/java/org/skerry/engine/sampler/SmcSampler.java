package org.skerry.engine.sampler;

import java.util.ArrayList;
import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.model.Prior;
import org.skerry.engine.move.MoveAdaptation;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.move.ProposalFit;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.Population;
import org.skerry.engine.population.PopulationBackend;
import org.skerry.engine.population.ResamplingReport;
import org.skerry.engine.population.TemperingInputs;
import org.skerry.engine.temper.TemperatureRule;
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

    public SmcSampler(SamplerSettings settings) {
        if (settings == null) {
            throw new IllegalArgumentException("settings must not be null");
        }
        this.settings = settings;
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
        Model model = source.create();
        checkModel(model);
        try (Population population = backend.create(source.withEvaluationRetries(settings.evaluationRetries()),
                settings.particles(), settings.seed(),
                settings.islands())) {
            return run(model, population, listener);
        }
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
        Prior proposal = settings.startProposal();
        if (proposal != null && proposal.dimension() != d) {
            throw new IllegalArgumentException("the start proposal has " + proposal.dimension()
                    + " dimensions but the model has " + d + " parameters " + model.parameters().names());
        }
    }

    private SamplerResult run(Model model, Population population, IterationListener listener) {
        int n = settings.particles();
        double logN = StrictMath.log(n);
        List<IterationRecord> records = new ArrayList<>();

        long start = System.nanoTime();
        EvaluationTally total = population.initialise(settings.startProposal());
        double evaluateSeconds = seconds(start);
        InvalidEvaluationsException.check(settings, 0, total, model.parameters());
        TemperingInputs inputs = population.temperingInputs();
        double logTotal = LogWeights.logSum(inputs.logWeight(), n);
        if (logTotal == Double.NEGATIVE_INFINITY) {
            throw new SamplingFailedException(0, "every particle's weight is zero after the initial draw ("
                    + n + " particles; " + total + ")");
        }
        double logEvidence = settings.startProposal() == null ? 0.0 : logTotal - logN;
        IslandLedger islands = settings.islands() > 0
                ? new IslandLedger(inputs.blockSizes(), inputs.logWeight(), settings.startProposal() != null) : null;
        double temperature = 0.0;
        double scale = settings.initialScale();
        int resamplings = 0;
        IterationRecord initial = new IterationRecord(0, 0.0, LogWeights.effectiveSampleSize(inputs.logWeight(), n),
                false, n, 0, Double.NaN, 0, scale, logEvidence, logEvidence, total.evaluations(),
                total.zeroLikelihood(), total.invalid(), total.firstInvalidIndex(), total.firstInvalidReason(),
                new PhaseTimes(evaluateSeconds, 0, 0, 0, 0, 0, 0, 0),
                total.retried(), total.failedAfterRetries(), IterationRecord.valuesOf(total));
        records.add(initial);
        listener.iterationFinished(initial);

        TemperatureRule rule = settings.temperatureRule();
        int iteration = 0;
        while (temperature < 1.0) {
            iteration++;
            if (iteration > settings.maxIterations()) {
                throw new SamplingFailedException(iteration, "tempering reached only φ = " + temperature
                        + " after " + settings.maxIterations() + " iterations (maxIterations)");
            }
            long phase = System.nanoTime();
            inputs = iteration == 1 ? inputs : population.temperingInputs();
            double next = rule.next(temperature, inputs, logTotal);
            if (!(next > temperature && next <= 1.0)) {
                throw new IllegalStateException("temperature rule " + rule + " returned " + next + " after " + temperature);
            }
            double[] newLogWeight = new double[n];
            double delta = next - temperature;
            for (int i = 0; i < n; i++) {
                newLogWeight[i] = inputs.logWeight()[i] + TemperedTarget.logIncrement(inputs.logLikelihood()[i], delta);
            }
            double newLogTotal = LogWeights.logSum(newLogWeight, n);
            double ess = LogWeights.effectiveSampleSize(newLogWeight, n);
            double temperatureSeconds = seconds(phase);
            if (newLogTotal == Double.NEGATIVE_INFINITY) {
                throw new SamplingFailedException(iteration, "every particle's weight is zero at temperature " + next
                        + " (" + n + " particles; " + total.invalid() + " invalid evaluations and "
                        + total.zeroLikelihood() + " zero likelihoods so far"
                        + (total.firstInvalidIndex() >= 0 ? "; first invalid: particle " + total.firstInvalidIndex()
                                + ": " + total.firstInvalidReason() : "") + ")");
            }
            double increment = newLogTotal - logTotal;
            logEvidence += increment;
            if (islands != null) {
                islands.advance(inputs.logWeight(), newLogWeight);
            }

            phase = System.nanoTime();
            population.reweight(temperature, next);
            double reweightSeconds = seconds(phase);
            temperature = next;
            logTotal = newLogTotal;

            phase = System.nanoTime();
            long ancestors = LogWeights.countAlive(newLogWeight, n);
            long moved = 0;
            double redistributeSeconds = 0;
            boolean resample;
            boolean global;
            if (islands == null) {
                resample = settings.resampleEveryIteration() || ess < settings.resampleThreshold() * n;
                global = true;
            } else {
                global = (settings.islandInteractionEvery() > 0 && iteration % settings.islandInteractionEvery() == 0)
                        || islands.islandWeightEssFraction(newLogWeight) < settings.islandInteractionThreshold();
                resample = global || settings.resampleEveryIteration()
                        || islands.withinIslandEssFraction(newLogWeight) < settings.resampleThreshold();
            }
            if (resample) {
                ResamplingReport report;
                if (global) {
                    report = population.resample(settings.resamplingScheme(), logTotal, iteration);
                    logTotal = logN;
                    if (islands != null) {
                        islands.interacted();
                    }
                } else {
                    report = population.resampleIslands(settings.resamplingScheme(), iteration);
                    logTotal = LogWeights.logSum(islands.afterIslandResampling(newLogWeight), n);
                }
                ancestors = report.distinctAncestors();
                moved = report.particlesMoved();
                redistributeSeconds = report.redistributeSeconds();
                resamplings++;
            }
            double resampleSeconds = seconds(phase) - redistributeSeconds;

            phase = System.nanoTime();
            MomentSums moments = population.moments(logTotal);
            Proposal proposal = ProposalFit.fit(settings.moveKernel(), moments, scale);
            double fitSeconds = seconds(phase);

            phase = System.nanoTime();
            MoveTally moves;
            int steps;
            if (settings.fixedSteps() > 0) {
                steps = settings.fixedSteps();
                moves = population.move(proposal, temperature, iteration, 0, steps);
            } else {
                MoveTally pilot = population.move(proposal, temperature, iteration, 0, 1);
                steps = MoveAdaptation.steps(pilot.acceptanceRate(), settings.stayProbability(), settings.maxSteps());
                moves = steps > 1 ? pilot.plus(population.move(proposal, temperature, iteration, 1, steps - 1)) : pilot;
            }
            double moveSeconds = seconds(phase);
            double usedScale = scale;
            if (settings.moveKernel() == MoveKernel.RANDOM_WALK) {
                scale = MoveAdaptation.nextScale(scale, moves.acceptanceRate(), settings.targetAcceptance());
            }
            EvaluationTally evaluations = moves.evaluations();
            InvalidEvaluationsException.check(settings, iteration, evaluations, model.parameters());
            total = total.followedBy(evaluations);

            IterationRecord record = new IterationRecord(iteration, temperature, ess, resample, ancestors, moved,
                    moves.acceptanceRate(), steps, usedScale, increment, logEvidence, evaluations.evaluations(),
                    evaluations.zeroLikelihood(), evaluations.invalid(), evaluations.firstInvalidIndex(),
                    evaluations.firstInvalidReason(),
                    new PhaseTimes(0, temperatureSeconds, reweightSeconds, resampleSeconds, redistributeSeconds,
                            fitSeconds, moveSeconds, 0),
                    evaluations.retried(), evaluations.failedAfterRetries(), IterationRecord.valuesOf(evaluations));
            records.add(record);
            listener.iterationFinished(record);
        }

        FinalParticles particles = population.export();
        double finalLogTotal = LogWeights.logSum(particles.logWeight(), n);
        double[] weights = new double[n];
        LogWeights.normalise(particles.logWeight(), n, finalLogTotal, weights);
        List<ParameterSummary> summaries = PosteriorSummaries.summarise(particles, weights, model.parameters());
        EvidenceEstimate evidence = EvidenceError.estimate(logEvidence, particles, weights, resamplings,
                settings.minimumDistinctEves());
        if (islands != null) {
            evidence = evidence.withIslands(islands.islands(), islands.standardError());
        }
        return new SamplerResult(evidence, summaries, List.copyOf(records), total, particles, weights);
    }

    private static double seconds(long startNanos) {
        return (System.nanoTime() - startNanos) * 1e-9;
    }
}
