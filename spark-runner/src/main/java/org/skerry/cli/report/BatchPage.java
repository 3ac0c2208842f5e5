package org.skerry.cli.report;

import static org.skerry.cli.report.PageParts.e;

import java.util.ArrayList;
import java.util.List;
import org.skerry.cli.batch.BatchRunner;

/**
 * Writes a batch's (or the demo comparison's) {@code index.html} with the shared pieces of
 * {@link PageParts}: warnings first (failed analyses with their reasons), the analyses table
 * (status, log evidence ± error, log Bayes factor ± error, a link to each run's report), the
 * Bayes factors with their "not a preference" zones, each dataset's variants' fits side by side,
 * a forest plot per parameter with its numbers, and how to read it all. Table cells carry the
 * exact value of batch-summary.json or summary.json in {@code data-value}.
 */
final class BatchPage {

    private final StringBuilder html = new StringBuilder(64 * 1024);
    private final BatchReport batch;

    private BatchPage(BatchReport batch) {
        this.batch = batch;
    }

    static String of(BatchReport batch, BatchReportWriter.RunSide runs, BayesFactorFigure.Written factors,
            List<ComparisonFitFigures.Written> fits, List<String> fitNotes, List<ForestFigures.Figure> forests) {
        BatchPage page = new BatchPage(batch);
        page.head();
        page.warnings(runs);
        page.analyses(runs);
        page.factors(factors);
        page.fits(fits, fitNotes);
        page.forests(forests);
        PageParts.reading(page.html, batch.kind() == FolderKind.BATCH ? "batch" : "comparison");
        PageParts.end(page.html);
        return page.html.toString();
    }

    private String folderName() {
        return String.valueOf(batch.folder().toAbsolutePath().normalize().getFileName());
    }

    private void head() {
        boolean comparison = batch.kind() == FolderKind.COMPARISON;
        PageParts.head(html, (comparison ? "Comparison report: " : "Batch report: ") + folderName());
        long succeeded = batch.rows().stream().filter(BatchReport.Row::succeeded).count();
        html.append("<p class=\"meta\">").append(batch.rows().size()).append(" analyses: ")
                .append(batch.datasets().size()).append(batch.datasets().size() == 1 ? " dataset" : " datasets")
                .append(" (").append(e(String.join(", ", batch.datasets()))).append(") under ")
                .append(batch.variants().size()).append(batch.variants().size() == 1 ? " variant" : " variants")
                .append(" (").append(e(String.join(", ", batch.variants()))).append("); ").append(succeeded)
                .append(" succeeded. Bayes factors are against the reference variant <b>")
                .append(e(batch.referenceVariant())).append("</b>. Made from <code>batch-summary.json</code> of the ")
                .append(comparison ? "comparison" : "batch").append(" folder <code>").append(e(folderName()))
                .append("</code> and each run's <code>summary.json</code>; the exact numbers are in those files.</p>\n");
    }

    private void warnings(BatchReportWriter.RunSide runs) {
        List<Warnings.Note> notes = new ArrayList<>();
        for (BatchReport.Row row : batch.rows()) {
            String name = row.dataset() + "/" + row.variant();
            if (BatchRunner.FAILED.equals(row.status())) {
                notes.add(new Warnings.Note(true, name + " failed: " + row.reason()));
            } else if (!row.succeeded()) {
                notes.add(new Warnings.Note(true, name + " has not finished (" + row.status() + "): the batch was "
                        + "interrupted; run the same skerry batch command again to finish it"));
            } else if (row.note() != null) {
                notes.add(new Warnings.Note(true, name + ": " + row.note()));
            } else if (row.abc()) {
                notes.add(new Warnings.Note(true, name + " is an ABC run: it has no evidence and no Bayes factor. The "
                        + "ABC approximation of the evidence is not a likelihood evidence, and summaries sufficient "
                        + "within each model are in general not sufficient for choosing between models (Robert, "
                        + "Cornuet, Marin & Pillai 2011, PNAS 108(37)); compare its variants by their fits and "
                        + "posteriors instead"));
            } else if (Double.isNaN(row.logEvidenceError())) {
                notes.add(new Warnings.Note(true, name + ": its evidence error is not reliable (its run report says "
                        + "why), so its Bayes factor has no error to judge it by"));
            }
        }
        notes.addAll(runs.notes());
        if (notes.isEmpty()) {
            notes.add(new Warnings.Note(false, "all " + batch.rows().size() + " analyses succeeded, each with an "
                    + "evidence error its run considers reliable"));
        }
        html.append("<section id=\"warnings\">\n<h2>Warnings and checks</h2>\n");
        PageParts.notes(html, notes);
        html.append("</section>\n");
    }

    private void analyses(BatchReportWriter.RunSide runs) {
        html.append("<section id=\"analyses\">\n<h2>Analyses</h2>\n<table id=\"analyses-table\">\n<thead><tr>")
                .append("<th>dataset</th><th>variant</th><th>status</th><th>log evidence</th><th>± error</th>")
                .append("<th>log Bayes factor vs ").append(e(batch.referenceVariant())).append("</th><th>± error</th>")
                .append("<th>iterations</th><th>likelihood evaluations</th><th>ABC final tolerance</th>")
                .append("<th>ABC simulations</th><th>run report</th><th>note</th>")
                .append("</tr></thead>\n<tbody>\n");
        for (int i = 0; i < batch.rows().size(); i++) {
            BatchReport.Row row = batch.rows().get(i);
            boolean reference = row.variant().equals(batch.referenceVariant());
            // An ABC run has no evidence: its cells say so rather than "unreliable", which would
            // suggest a likelihood evidence with a doubtful error.
            String noEvidence = row.abc() ? "none (ABC)" : null;
            html.append("<tr data-dataset=\"").append(e(row.dataset())).append("\" data-variant=\"")
                    .append(e(row.variant())).append("\" data-status=\"").append(e(row.status())).append('"')
                    .append(row.succeeded() ? "" : " class=\"failed\"").append("><th>").append(e(row.dataset()))
                    .append("</th><td class=\"text\">").append(e(row.variant())).append("</td><td class=\"text\">")
                    .append(e(row.status())).append("</td>")
                    .append(PageParts.cell("log_evidence", row.logEvidence(), noEvidence != null ? noEvidence : "–"))
                    .append(PageParts.cell("log_evidence_error", row.logEvidenceError(),
                            noEvidence != null ? noEvidence : row.succeeded() ? "unreliable" : "–"))
                    .append(PageParts.cell("log_bayes_factor", row.logBayesFactor(),
                            noEvidence != null ? noEvidence : reference ? "reference" : "–"))
                    .append(PageParts.cell("log_bayes_factor_error", row.logBayesFactorError(),
                            noEvidence != null ? noEvidence
                                    : reference || !Double.isFinite(row.logBayesFactor()) ? "–" : "unreliable"))
                    .append(PageParts.countCell("iterations", row.iterations()))
                    .append(PageParts.countCell("likelihood_evaluations", row.likelihoodEvaluations()))
                    .append(PageParts.cell("final_tolerance", row.finalTolerance(), "–"))
                    .append(PageParts.countCell("simulations", row.simulations()))
                    .append("<td class=\"text\">");
            if (runs.pages()[i] != null) {
                html.append("<a class=\"run-report\" href=\"").append(e(runs.pages()[i])).append("\">report</a>");
            } else {
                html.append("–");
            }
            html.append("</td><td class=\"reason\">");
            if (row.reason() != null) {
                html.append(e(row.reason()));
            }
            html.append("</td></tr>\n");
        }
        html.append("</tbody>\n</table>\n<p>Log evidence is the natural log of each run's marginal likelihood "
                + "estimate Ẑ; its error is the run's own single-run standard error, shown only where the run "
                + "considers it reliable. A log Bayes factor is log Ẑ(variant) − log Ẑ(")
                .append(e(batch.referenceVariant())).append(") on the same dataset, its error √(se² + se_ref²) for "
                        + "two independent runs. An ABC run has neither: it gives the tolerance it reached and the "
                        + "simulations it spent instead. Four significant digits here; batch-summary.csv and .json "
                        + "hold the exact values.</p>\n</section>\n");
    }

    private void factors(BayesFactorFigure.Written figure) {
        html.append("<section id=\"bayes-factors\">\n<h2>Bayes factors</h2>\n");
        if (figure == null) {
            html.append("<p>No Bayes factor to show: it needs two variants of a dataset that both succeeded")
                    .append(batch.rows().stream().anyMatch(BatchReport.Row::abc) ? " with a likelihood; ABC runs have "
                            + "none (see the warnings)" : "").append(".</p>\n")
                    .append("</section>\n");
            return;
        }
        html.append("<p>Each marker is a dataset's log Bayes factor of a variant against <b>")
                .append(e(batch.referenceVariant())).append("</b>, the bar ± one combined standard error. The grey "
                        + "zone around 0 spans ± 2 combined errors: a marker inside it is <em>not a preference</em> — "
                        + "the two evidences differ by less than their Monte Carlo error can explain. Outside it, the "
                        + "sign says which variant the data favour; by a common rule of thumb (Kass &amp; Raftery "
                        + "1995, JASA 90) a log Bayes factor above 1 is positive, above 3 strong evidence — but only "
                        + "if the runs are trustworthy: the error is a single-run estimate, so repeat with other seeds "
                        + "before relying on it.</p>\n");
        PageParts.figure(html, "bayes-factors-figure", figure.files(), "Log Bayes factors per dataset with error bars",
                "Log Bayes factors against " + batch.referenceVariant() + " with ± 1 combined standard error; grey: "
                        + "± 2 combined errors around 0.");
        html.append("</section>\n");
    }

    private void fits(List<ComparisonFitFigures.Written> fits, List<String> notes) {
        html.append("<section id=\"fits\">\n<h2>Fits of the variants side by side</h2>\n");
        if (fits.isEmpty()) {
            html.append("<p>No side-by-side fits: they need a dataset with two succeeded variants whose model "
                    + "offers predictions of its data.");
        } else {
            html.append("<p>For each dataset, the observed data over each variant's 50 % and 95 % posterior "
                    + "predictive bands, on the same axes. A variant whose bands miss the points, or whose points "
                    + "run along one edge of the band, fits that dataset worse; a better fit alone does not make a "
                    + "variant right.");
        }
        if (!notes.isEmpty()) {
            html.append(" No fit for: ").append(e(String.join("; ", notes))).append('.');
        }
        html.append("</p>\n");
        for (ComparisonFitFigures.Written fit : fits) {
            String id = fit.files().png().substring(0, fit.files().png().length() - ".png".length());
            List<String> variants = fit.panels().stream().map(p -> p.row().variant()).toList();
            PageParts.figure(html, id, fit.files(), "Fit against " + fit.dataset() + " under each variant",
                    "Dataset " + fit.dataset() + ": the observed data with the posterior predictive of "
                            + String.join(" (left), ", variants) + " (right); the panel titles give each log evidence.");
        }
        html.append("</section>\n");
    }

    private void forests(List<ForestFigures.Figure> figures) {
        html.append("<section id=\"forest\">\n<h2>Parameters across analyses</h2>\n<p>One forest plot per "
                + "parameter: for each analysis its posterior mean (marker, by variant), median (black tick) and 95 % "
                + "interval (bar, 2.5 % to 97.5 % quantile). Intervals that do not overlap between datasets point at "
                + "real differences between them; between variants on one dataset, at a parameter whose meaning "
                + "the variant changes. Each plot's numbers are in the table below it.</p>\n");
        for (ForestFigures.Figure figure : figures) {
            String id = figure.files().png().substring(0, figure.files().png().length() - ".png".length());
            PageParts.figure(html, id, figure.files(), "Forest plot of " + figure.parameter(),
                    "Posterior of " + figure.parameter() + " per analysis.");
            html.append("<details>\n<summary>Numbers of ").append(e(figure.parameter()))
                    .append("</summary>\n<table class=\"forest-table\" data-parameter=\"").append(e(figure.parameter()))
                    .append("\">\n<thead><tr><th>analysis</th><th>mean</th><th>median</th><th>2.5 %</th>")
                    .append("<th>97.5 %</th></tr></thead>\n<tbody>\n");
            for (BatchReport.Row row : figure.rows()) {
                double[] v = ForestFigures.values(row, figure.parameter());
                html.append("<tr data-dataset=\"").append(e(row.dataset())).append("\" data-variant=\"")
                        .append(e(row.variant())).append("\"><th>").append(e(row.dataset() + " · " + row.variant()))
                        .append("</th>");
                if (v == null) {
                    html.append("<td colspan=\"4\" class=\"text\">").append(e(row.succeeded() ? "not in its summary"
                            : row.status())).append("</td>");
                } else {
                    html.append(PageParts.cell("mean", v[0])).append(PageParts.cell("q50", v[1]))
                            .append(PageParts.cell("q2_5", v[2])).append(PageParts.cell("q97_5", v[3]));
                }
                html.append("</tr>\n");
            }
            html.append("</tbody>\n</table>\n</details>\n");
        }
        html.append("</section>\n");
    }
}
