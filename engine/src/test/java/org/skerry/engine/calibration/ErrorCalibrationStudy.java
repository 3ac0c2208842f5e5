package org.skerry.engine.calibration;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.apache.commons.math3.stat.descriptive.SummaryStatistics;
import org.skerry.engine.population.threads.ThreadPoolBackend;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.SamplerSettings;
import org.skerry.engine.sampler.SmcSampler;

/**
 * Replicates runs over seeds and compares the reported single-run evidence variance with the
 * observed variance of log Ẑ ("calibration of a reported error": over R seeds, reported ÷
 * observed ≈ 1, bounded by the chi-square interval with R − 1 degrees of freedom). Prints one
 * table row per case and the pooled ratio. Run from engine/ after test-compile:
 * {@code java -cp target/classes:target/test-classes:$(cat cp) org.skerry.engine.calibration.ErrorCalibrationStudy SCHEME SEEDS [case...]}.
 */
public final class ErrorCalibrationStudy {

    /** One case's replicated outcome. */
    public record Row(CalibrationCase calibrationCase, ResamplingScheme scheme, int seeds, double meanReportedVariance,
            double observedVariance, double meanLogEvidenceError, double evaluationsPerRun, double capShare,
            double resamplingsPerRun, int unreliable, double[] bootstrap) {

        /** Reported ÷ observed standard deviation. */
        public double ratio() {
            return Math.sqrt(meanReportedVariance / observedVariance);
        }
    }

    private ErrorCalibrationStudy() {
    }

    public static Row run(CalibrationCase c, SamplerSettings base, int seeds, long firstSeed, ThreadPoolBackend backend) {
        SummaryStatistics logZ = new SummaryStatistics();
        SummaryStatistics reported = new SummaryStatistics();
        SummaryStatistics evaluations = new SummaryStatistics();
        SummaryStatistics resamplings = new SummaryStatistics();
        double[] logZs = new double[seeds];
        double[] variances = new double[seeds];
        long capped = 0;
        long iterations = 0;
        int unreliable = 0;
        for (int s = 0; s < seeds; s++) {
            SamplerSettings settings = base.toBuilder().particles(c.particles()).seed(firstSeed + 7919L * s).build();
            SamplerResult result = new SmcSampler(settings).run(c.model(), backend);
            double error = result.evidence().standardError();
            logZ.addValue(result.evidence().logEvidence());
            reported.addValue(error * error);
            logZs[s] = result.evidence().logEvidence();
            variances[s] = error * error;
            evaluations.addValue(result.evaluations().evaluations());
            if (!result.evidence().reliable()) {
                unreliable++;
            }
            int r = 0;
            for (IterationRecord record : result.iterations()) {
                if (record.iteration() == 0) {
                    continue;
                }
                iterations++;
                if (record.mhSteps() >= settings.moves().maxSteps() && settings.moves().fixedSteps() == 0) {
                    capped++;
                }
                if (record.resampled()) {
                    r++;
                }
            }
            resamplings.addValue(r);
        }
        return new Row(c, base.resampling().scheme(), seeds, reported.getMean(), logZ.getVariance(),
                logZ.getMean() - c.logEvidence(), evaluations.getMean(), (double) capped / iterations,
                resamplings.getMean(), unreliable, bootstrap(logZs, variances, 0.99));
    }

    /**
     * Percentile bootstrap over seeds (2 000 resamples, fixed generator seed) of the reported ÷
     * observed sd ratio: log Ẑ is skewed at small N, so the chi-square band is only approximate.
     */
    static double[] bootstrap(double[] logZ, double[] reported, double level) {
        int n = logZ.length;
        int draws = 2000;
        double[] ratios = new double[draws];
        java.util.SplittableRandom random = new java.util.SplittableRandom(20261202L);
        for (int b = 0; b < draws; b++) {
            SummaryStatistics z = new SummaryStatistics();
            double sum = 0;
            for (int i = 0; i < n; i++) {
                int k = random.nextInt(n);
                z.addValue(logZ[k]);
                sum += reported[k];
            }
            ratios[b] = Math.sqrt(sum / n / z.getVariance());
        }
        java.util.Arrays.sort(ratios);
        double tail = (1 - level) / 2;
        return new double[] {ratios[(int) Math.floor(tail * (draws - 1))], ratios[(int) Math.ceil((1 - tail) * (draws - 1))]};
    }

    /** The pooled reported ÷ observed sd ratio, each case's variance ratio weighted by its degrees of freedom. */
    public static double pooledRatio(List<Row> rows) {
        double weighted = 0;
        double df = 0;
        for (Row row : rows) {
            weighted += (row.seeds() - 1) * row.observedVariance() / row.meanReportedVariance();
            df += row.seeds() - 1;
        }
        return Math.sqrt(df / weighted);
    }

    /** The two-sided band of a calibrated ratio for {@code df} degrees of freedom at {@code level}. */
    public static double[] band(int df, double level) {
        ChiSquaredDistribution chi = new ChiSquaredDistribution(df);
        double tail = (1 - level) / 2;
        return new double[] {Math.sqrt(df / chi.inverseCumulativeProbability(1 - tail)),
                Math.sqrt(df / chi.inverseCumulativeProbability(tail))};
    }

    public static List<CalibrationCase> standardCases() {
        return List.of(CalibrationCase.normalMeanSmall(200), CalibrationCase.normalMean(1000),
                CalibrationCase.normalMean3(2000), CalibrationCase.linearRegression(1000),
                CalibrationCase.betaBinomial(1000), CalibrationCase.shells(2, 2000), CalibrationCase.shells(5, 2000),
                CalibrationCase.mixture(2000));
    }

    public static String header() {
        return "| case | N | scheme | seeds | sd of log Ẑ | mean reported sd | ratio (rms reported ÷ observed) | its 99 % band | bootstrap 99 % interval"
                + " | mean log Ẑ − exact | evaluations per run | iterations at step cap | resamplings | unreliable |\n"
                + "|---|---|---|---|---|---|---|---|---|---|---|---|---|---|";
    }

    public static String format(Row row) {
        double[] band = band(row.seeds() - 1, 0.99);
        return String.format(Locale.ROOT, "| %s | %d | %s | %d | %.4f | %.4f | %.3f | [%.2f, %.2f] | [%.2f, %.2f] | %+.4f | %.0f | %.2f | %.1f | %d |",
                row.calibrationCase().name(), row.calibrationCase().particles(),
                row.scheme().name().toLowerCase(Locale.ROOT), row.seeds(), Math.sqrt(row.observedVariance()),
                Math.sqrt(row.meanReportedVariance()), row.ratio(), band[0], band[1], row.bootstrap()[0],
                row.bootstrap()[1], row.meanLogEvidenceError(),
                row.evaluationsPerRun(), row.capShare(), row.resamplingsPerRun(), row.unreliable());
    }

    public static void main(String[] args) {
        ResamplingScheme scheme = ResamplingScheme.valueOf(args[0].toUpperCase(Locale.ROOT));
        int seeds = Integer.parseInt(args[1]);
        List<CalibrationCase> cases = standardCases();
        List<Integer> chosen = new ArrayList<>();
        for (int k = 2; k < args.length; k++) {
            chosen.add(Integer.parseInt(args[k]));
        }
        SamplerSettings base = SamplerSettings.builder().resamplingScheme(scheme).build();
        List<Row> rows = new ArrayList<>();
        System.out.println(header());
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            for (int k = 0; k < cases.size(); k++) {
                if (!chosen.isEmpty() && !chosen.contains(k)) {
                    continue;
                }
                Row row = run(cases.get(k), base, seeds, 5000, backend);
                rows.add(row);
                System.out.println(format(row));
            }
        }
        int df = rows.stream().mapToInt(r -> r.seeds() - 1).sum();
        double[] band = band(df, 0.99);
        System.out.printf(Locale.ROOT, "pooled ratio %.3f over %d df, 99 %% band [%.3f, %.3f]%n", pooledRatio(rows), df,
                band[0], band[1]);
    }
}
