package org.skerry.cli.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.skerry.cli.batch.BatchRunner;
import org.skerry.cli.output.BatchSummary;
import org.skerry.cli.output.SummaryJson;

/**
 * Everything a batch (or comparison) report shows, read and checked before anything is written:
 * the rows of {@code batch-summary.json} as the batch computed them (status, evidence, Bayes
 * factors against the reference variant), each succeeded analysis's {@code summary.json} for the
 * forest plots, and each failed one's reason from its {@code failure.txt}. A summary that does
 * not read back is bad input naming the file and key; one analysis whose own files do not read
 * back is a note on the page, not a failed report.
 *
 * @param kind             {@link FolderKind#BATCH} or {@link FolderKind#COMPARISON}
 * @param referenceVariant the variant every Bayes factor is against
 * @param rows             the analyses in the summary's order
 */
record BatchReport(Path folder, FolderKind kind, String referenceVariant, List<Row> rows) {

    /**
     * One analysis. Numbers absent from the summary are NaN, counts −1.
     *
     * @param finalTolerance an ABC run's tolerance reached; NaN for a likelihood run
     * @param simulations an ABC run's simulations; −1 for a likelihood run
     * @param runFolder the analysis's run folder (inside the batch folder)
     * @param relative  that folder relative to the batch folder, as the summary names it
     * @param reason    why it failed (failure.txt, else the summary's message); null otherwise
     * @param summary   its summary.json when it succeeded and the file reads back; else null
     * @param note      why a succeeded analysis has no summary on the page; null otherwise
     */
    record Row(String dataset, String variant, String status, double logEvidence, double logEvidenceError,
            double logBayesFactor, double logBayesFactorError, long iterations, long likelihoodEvaluations,
            double finalTolerance, long simulations, long seed, String relative, Path runFolder, String reason,
            SummaryFile summary, String note) {

        /** An ABC run: it has a tolerance and no evidence. */
        boolean abc() {
            return !Double.isNaN(finalTolerance) || simulations >= 0 || (summary != null && summary.abc() != null);
        }

        boolean succeeded() {
            return BatchRunner.SUCCEEDED.equals(status);
        }

        String label() {
            return dataset + " · " + variant;
        }
    }

    BatchReport {
        rows = List.copyOf(rows);
    }

    /** The datasets in order of first appearance. */
    List<String> datasets() {
        Set<String> names = new LinkedHashSet<>();
        rows.forEach(r -> names.add(r.dataset()));
        return List.copyOf(names);
    }

    /** The variants in order of first appearance. */
    List<String> variants() {
        Set<String> names = new LinkedHashSet<>();
        rows.forEach(r -> names.add(r.variant()));
        return List.copyOf(names);
    }

    /** Every parameter of the succeeded analyses, in order of first appearance. */
    List<String> parameters() {
        Set<String> names = new LinkedHashSet<>();
        rows.forEach(r -> {
            if (r.summary() != null) {
                names.addAll(r.summary().parameters().keySet());
            }
        });
        return List.copyOf(names);
    }

    /** The analyses of each dataset, in order. */
    Map<String, List<Row>> byDataset() {
        Map<String, List<Row>> out = new LinkedHashMap<>();
        rows.forEach(r -> out.computeIfAbsent(r.dataset(), d -> new ArrayList<>()).add(r));
        return out;
    }

    /** Reads {@code folder}'s batch summary and the run folders it names. */
    static BatchReport read(Path folder, FolderKind kind) {
        Path file = folder.resolve(BatchSummary.JSON_NAME);
        Path reportFolder = folder.resolve(ReportWriter.FOLDER);
        if (Files.exists(reportFolder) && !Files.isDirectory(reportFolder)) {
            throw new ReportInputException(reportFolder + " is in the way: a file where the report folder goes");
        }
        JsonFields r = new JsonFields(file, JsonValues.readObject(file));
        String reference = r.text("reference_variant");
        List<Object> analyses = r.list(r.json(), "analyses", "analyses");
        if (analyses.isEmpty()) {
            throw new ReportInputException(file + ": key analyses lists no analysis");
        }
        Path home = folder.toAbsolutePath().normalize();
        List<Row> rows = new ArrayList<>();
        for (int i = 0; i < analyses.size(); i++) {
            String where = "analyses[" + i + "]";
            if (!(analyses.get(i) instanceof Map)) {
                throw r.wrong(where, analyses.get(i), "an object");
            }
            @SuppressWarnings("unchecked")
            Map<String, Object> a = (Map<String, Object>) analyses.get(i);
            String relative = r.text(a, "folder", where + ".folder");
            Path runFolder = home.resolve(relative).normalize();
            if (!runFolder.startsWith(home) || runFolder.equals(home)) {
                throw r.wrong(where + ".folder", relative, "a run folder inside the batch folder " + folder);
            }
            String status = r.text(a, "status", where + ".status");
            String message = r.optionalText(a, "message", where + ".message");
            String reason = null;
            SummaryFile summary = null;
            String note = null;
            if (BatchRunner.FAILED.equals(status)) {
                reason = failureReason(runFolder, message);
            } else if (BatchRunner.SUCCEEDED.equals(status)) {
                try {
                    summary = SummaryFile.read(runFolder.resolve(SummaryJson.FILE_NAME));
                } catch (ReportInputException e) {
                    note = e.getMessage();
                }
            }
            rows.add(new Row(r.text(a, "dataset", where + ".dataset"), r.text(a, "variant", where + ".variant"), status,
                    r.number(a, "log_evidence", where + ".log_evidence"),
                    r.number(a, "log_evidence_error", where + ".log_evidence_error"),
                    r.number(a, "log_bayes_factor", where + ".log_bayes_factor"),
                    r.number(a, "log_bayes_factor_error", where + ".log_bayes_factor_error"),
                    r.optionalCount(a, "iterations", where + ".iterations"),
                    r.optionalCount(a, "likelihood_evaluations", where + ".likelihood_evaluations"),
                    // Absent from the files of batches run before ABC runs had these columns.
                    a.containsKey("final_tolerance") ? r.number(a, "final_tolerance", where + ".final_tolerance")
                            : Double.NaN,
                    a.containsKey("simulations") ? r.optionalCount(a, "simulations", where + ".simulations") : -1,
                    r.whole(a, "seed", where + ".seed"), relative, runFolder, reason, summary, note));
        }
        return new BatchReport(folder, kind, reference, rows);
    }

    /** The run folder's failure.txt (what the batch wrote when the analysis failed), else the summary's message. */
    private static String failureReason(Path runFolder, String message) {
        Path file = runFolder.resolve(BatchRunner.FAILURE_FILE);
        if (Files.isRegularFile(file)) {
            try {
                String text = Files.readString(file).strip();
                if (!text.isEmpty()) {
                    return text;
                }
            } catch (IOException e) {
                // the summary's message says the same
            }
        }
        return message != null ? message : "no reason recorded";
    }
}
