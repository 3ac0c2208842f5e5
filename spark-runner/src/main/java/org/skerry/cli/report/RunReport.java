package org.skerry.cli.report;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.skerry.cli.output.IterationsCsv;
import org.skerry.cli.output.ParticlesArrow;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.SummaryJson;
import org.skerry.cli.runfile.RunFile;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.cli.runfile.RunSpec;
import org.skerry.engine.sampler.MoveSettings;
import org.skerry.engine.settings.SettingsException;

/**
 * Everything a run report shows, read and checked before anything is written: {@code
 * summary.json}, {@code iterations.csv}, the parameter values and weights of {@code
 * particles.csv} (or of {@code particles.arrow} where a run wrote no CSV), the resampling threshold and MH step cap of {@code run.conf}, and the prior
 * marginals and the posterior predictive of the data when the model can be built again. Any file that is missing or does not fit the
 * others is bad input naming it.
 *
 * @param threshold    {@code sampler.resampling.threshold}: resample when ESS/N is at or below it
 * @param maxSteps     {@code sampler.moves.max-steps}, or 0 with a fixed step count (no cap applies)
 * @param values       per parameter (summary order), the particles' values
 * @param weights      the particles' normalised weights
 * @param fit          the posterior predictive of the observed data, or why there is none
 */
record RunReport(Path folder, SummaryFile summary, CsvColumns iterations, List<double[]> values, double[] weights,
        double threshold, int maxSteps, PriorMarginals prior, PredictiveFit fit) {

    /** The columns of {@code iterations.csv} the figures use. */
    static final List<String> ITERATION_COLUMNS = List.of("iteration", "temperature", "ess", "resampled",
            "acceptance", "mh_steps", "log_evidence_increment", "log_evidence", "evaluations", "zero_likelihood",
            "invalid");
    /** The further columns of an ABC run's {@code iterations.csv}. */
    static final List<String> ABC_COLUMNS = List.of("tolerance", "share_within_tolerance", "simulations");

    RunReport {
        values = List.copyOf(values);
    }

    List<String> parameters() {
        return List.copyOf(summary.parameters().keySet());
    }

    long particles() {
        return weights.length;
    }

    /** Reads {@code folder}; throws {@link ReportInputException} naming what is wrong. */
    static RunReport read(Path folder) {
        if (!Files.exists(folder)) {
            throw new ReportInputException("run folder " + folder + " does not exist");
        }
        if (!Files.isDirectory(folder)) {
            throw new ReportInputException(folder + " is not a folder (give the run folder, which holds summary.json)");
        }
        Path summaryFile = folder.resolve(SummaryJson.FILE_NAME);
        if (!Files.isRegularFile(summaryFile)) {
            throw new ReportInputException("run folder " + folder + " has no " + SummaryJson.FILE_NAME
                    + ": not a finished run (an unfinished one is continued with skerry resume)");
        }
        for (String name : List.of(IterationsCsv.FILE_NAME, RunConfFile.FILE_NAME)) {
            if (!Files.isRegularFile(folder.resolve(name))) {
                throw new ReportInputException("run folder " + folder + " has no " + name);
            }
        }
        // The CSV when there is one (it is what a person may have edited or checked), else Arrow.
        boolean csv = Files.isRegularFile(folder.resolve(ParticlesCsv.FILE_NAME));
        if (!csv && !Files.isRegularFile(folder.resolve(ParticlesArrow.FILE_NAME))) {
            throw new ReportInputException("run folder " + folder + " has no " + ParticlesCsv.FILE_NAME + " nor "
                    + ParticlesArrow.FILE_NAME);
        }
        Path reportFolder = folder.resolve(ReportWriter.FOLDER);
        if (Files.exists(reportFolder) && !Files.isDirectory(reportFolder)) {
            throw new ReportInputException(reportFolder + " is in the way: a file where the report folder goes");
        }
        SummaryFile summary = SummaryFile.read(summaryFile);
        List<String> columns = new ArrayList<>(ITERATION_COLUMNS);
        if (summary.isAbc()) {
            columns.addAll(ABC_COLUMNS);
        }
        CsvColumns iterations = CsvColumns.read(folder.resolve(IterationsCsv.FILE_NAME), columns);
        if (iterations.rows() == 0) {
            throw new ReportInputException(folder.resolve(IterationsCsv.FILE_NAME) + ": no iteration rows");
        }
        List<String> names = new ArrayList<>(summary.parameters().keySet());
        List<String> wanted = new ArrayList<>(names);
        wanted.add(ParticlesCsv.WEIGHT_COLUMN);
        Path particlesFile = folder.resolve(csv ? ParticlesCsv.FILE_NAME : ParticlesArrow.FILE_NAME);
        CsvColumns particles = csv ? CsvColumns.read(particlesFile, wanted) : ArrowColumns.read(particlesFile, wanted);
        if (particles.rows() != summary.particles()) {
            throw new ReportInputException(particlesFile + ": " + particles.rows() + " particles, summary.json says "
                    + summary.particles());
        }
        double[] weights = particles.column(ParticlesCsv.WEIGHT_COLUMN);
        for (int i = 0; i < weights.length; i++) {
            if (!(weights[i] >= 0) || Double.isInfinite(weights[i])) {
                throw new ReportInputException(particlesFile + (csv ? " line " + (i + 2) : " row " + (i + 1))
                        + " column weight: " + weights[i]
                        + " is not a weight (finite, 0 or more)");
            }
        }
        List<double[]> values = new ArrayList<>();
        names.forEach(n -> values.add(particles.column(n)));
        RunSpec spec = settings(folder.resolve(RunConfFile.FILE_NAME));
        MoveSettings moves = spec.sampler().moves();
        RebuiltModel rebuilt = RebuiltModel.of(spec, names);
        return new RunReport(folder, summary, iterations, values, weights, spec.sampler().resampling().threshold(),
                moves.fixedSteps() == 0 ? moves.maxSteps() : 0, PriorMarginals.of(rebuilt, names),
                PredictiveFit.remembered(folder, List.of(summaryFile, particlesFile, folder.resolve(RunConfFile.FILE_NAME)),
                        () -> PredictiveFit.of(rebuilt, names, values, weights, summary.seed())));
    }

    private static RunSpec settings(Path runConf) {
        try {
            return RunSpec.from(RunFile.load(runConf, List.of()));
        } catch (RunFileException | SettingsException e) {
            throw new ReportInputException(e.getMessage(), e);
        }
    }
}
