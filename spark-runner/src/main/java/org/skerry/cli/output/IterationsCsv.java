package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import org.apache.commons.csv.CSVPrinter;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;

/**
 * Writes {@code iterations.csv}: one row per iteration record, iteration 0 (the initial draw)
 * first.
 *
 * <p>Columns: {@code iteration, temperature, ess, resampled, distinct_ancestors, particles_sent_to_other_partitions,
 * acceptance, mh_steps, scale, log_evidence_increment, log_evidence, evaluations,
 * zero_likelihood, invalid, first_invalid_particle, first_invalid_reason, seconds_evaluate,
 * seconds_temperature, seconds_reweight, seconds_resample, seconds_redistribute, seconds_fit,
 * seconds_move, seconds_checkpoint, retried, failed_after_retries, first_invalid_parameters}:
 * {@code retried} counts evaluations whose first call was invalid and that were retried,
 * {@code failed_after_retries} those of them still invalid after the last retry, and
 * {@code first_invalid_parameters} holds the values of the particle {@code first_invalid_particle}
 * names as {@code name=value;name=value} (see {@link ParameterValues}). Doubles
 * are written by {@link DoubleText} ({@code NaN} for the acceptance of iteration 0, which makes no
 * moves); {@code resampled} is {@code true} or {@code false}; the three {@code first_invalid}
 * fields, and the seconds of a record without phase times, are empty when there is nothing to
 * report.
 *
 * <p>An ABC run (approximate Bayesian computation) adds the columns {@code tolerance} (the
 * tolerance reached; {@code Infinity} for the initial draw), {@code share_within_tolerance} (the
 * share of the particles' kept simulations within it when it was chosen) and {@code simulations}
 * (simulations made in the iteration); its {@code temperature} column holds the progress along
 * the tolerance sequence (1 at the final tolerance), and its two evidence columns are empty: an
 * ABC evidence is not a likelihood evidence, and skerry does not report one.
 */
public final class IterationsCsv {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "iterations.csv";

    static final String[] COLUMNS = {
        "iteration", "temperature", "ess", "resampled", "distinct_ancestors", "particles_sent_to_other_partitions",
        "acceptance", "mh_steps", "scale", "log_evidence_increment", "log_evidence", "evaluations",
        "zero_likelihood", "invalid", "first_invalid_particle", "first_invalid_reason", "seconds_evaluate",
        "seconds_temperature", "seconds_reweight", "seconds_resample", "seconds_redistribute", "seconds_fit",
        "seconds_move", "seconds_checkpoint", "retried", "failed_after_retries", "first_invalid_parameters",
    };

    static final String[] ABC_COLUMNS = {"tolerance", "share_within_tolerance", "simulations"};

    private IterationsCsv() {
    }

    /**
     * Writes {@code iterations.csv} in {@code folder}, atomically, naming failing particles'
     * parameters by position ({@code x0, x1 …}).
     *
     * @return the file written
     */
    public static Path write(Path folder, List<IterationRecord> records) throws IOException {
        return write(folder, records, null);
    }

    /**
     * Writes {@code iterations.csv} in {@code folder}, atomically.
     *
     * @param parameterNames the model's parameter names, for {@code first_invalid_parameters}
     * @return the file written
     */
    public static Path write(Path folder, List<IterationRecord> records, List<String> parameterNames)
            throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (records == null) {
            throw new IllegalArgumentException("records must not be null");
        }
        Path file = folder.resolve(FILE_NAME);
        boolean abc = !records.isEmpty() && records.get(0).abc() != null;
        String[] header = COLUMNS;
        if (abc) {
            header = java.util.Arrays.copyOf(COLUMNS, COLUMNS.length + ABC_COLUMNS.length);
            System.arraycopy(ABC_COLUMNS, 0, header, COLUMNS.length, ABC_COLUMNS.length);
        }
        String[] columns = header;
        AtomicFile.writeText(file, out -> {
            CSVPrinter printer = new CSVPrinter(out, CsvOutput.withHeader(columns));
            for (IterationRecord r : records) {
                boolean invalid = r.firstInvalidIndex() >= 0;
                PhaseTimes t = r.seconds();
                java.util.List<Object> row = new java.util.ArrayList<>(java.util.Arrays.asList(r.iteration(),
                        DoubleText.format(r.temperature()), DoubleText.format(r.ess()),
                        r.resampled(), r.distinctAncestors(), r.particlesMoved(), DoubleText.format(r.acceptanceRate()),
                        r.mhSteps(), DoubleText.format(r.scale()),
                        abc ? null : DoubleText.format(r.logEvidenceIncrement()),
                        abc ? null : DoubleText.format(r.logEvidence()), r.evaluations(), r.zeroLikelihood(),
                        r.invalidEvaluations(),
                        invalid ? r.firstInvalidIndex() : null, invalid ? r.firstInvalidReason() : null,
                        seconds(t, 0), seconds(t, 1), seconds(t, 2), seconds(t, 3), seconds(t, 4), seconds(t, 5),
                        seconds(t, 6), seconds(t, 7), r.retriedEvaluations(), r.failedAfterRetries(),
                        invalid ? ParameterValues.text(parameterNames, r.firstInvalidParameters(), ";") : null));
                if (abc) {
                    row.add(DoubleText.format(r.abc().tolerance()));
                    row.add(DoubleText.format(r.abc().shareWithin()));
                    row.add(r.abc().simulations());
                }
                printer.printRecord(row);
            }
            printer.flush();
        });
        return file;
    }

    private static String seconds(PhaseTimes t, int phase) {
        if (t == null) {
            return null;
        }
        double[] all = {t.evaluate(), t.temperature(), t.reweight(), t.resample(), t.redistribute(), t.fit(),
            t.move(), t.checkpoint()};
        return DoubleText.format(all[phase]);
    }
}
