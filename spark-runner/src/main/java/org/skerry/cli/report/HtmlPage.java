package org.skerry.cli.report;

import java.util.List;

/**
 * Writes a run's {@code index.html}: one self-contained page (inline CSS, no scripts, fonts or
 * network addresses; images referenced by file name beside it; the pieces every report shares in
 * {@link PageParts}) in the order a reader needs it — warnings, summary table, posteriors, pairs,
 * the fit against the data, per-iteration diagnostics, how to read them. Every text from the run
 * is escaped with Commons Text. Table cells carry the exact value in {@code
 * data-value}, figures the numbers behind them, so the page can be checked against the files.
 */
final class HtmlPage {

    private final StringBuilder html = new StringBuilder(64 * 1024);

    private HtmlPage() {
    }

    static String of(RunReport run, List<Warnings.Note> notes, List<PosteriorFigures.Figure> posteriors,
            PairSelection pairs, FigureFile.Written pairFigure, FitFigures.Written fit,
            List<IterationFigures.Figure> iterations) {
        HtmlPage page = new HtmlPage();
        page.head(run);
        page.warnings(notes);
        page.summary(run);
        page.posteriors(run, posteriors);
        page.pairs(run, pairs, pairFigure);
        page.fit(run, fit);
        page.iterations(iterations);
        PageParts.reading(page.html, "run");
        PageParts.end(page.html);
        return page.html.toString();
    }

    private void head(RunReport run) {
        SummaryFile s = run.summary();
        PageParts.head(html, "Run report: " + s.name());
        html.append("<p class=\"meta\">Model <b>").append(e(s.model())).append("</b>, N = ")
                .append(Readable.count(s.particles())).append(" particles, seed ").append(s.seed()).append(", ")
                .append(Readable.count(s.iterations())).append(s.isAbc() ? " ABC iterations, " : " tempering iterations, ")
                .append(Readable.count(s.likelihoodEvaluations()))
                .append(s.isAbc() ? " simulator evaluations. " : " likelihood evaluations. ")
                .append("Made from the files of the run folder <code>")
                .append(e(String.valueOf(run.folder().toAbsolutePath().normalize().getFileName())))
                .append("</code>; the exact numbers are in its summary.json.</p>\n");
    }

    private void warnings(List<Warnings.Note> notes) {
        html.append("<section id=\"warnings\">\n<h2>Warnings and checks</h2>\n");
        PageParts.notes(html, notes);
        html.append("</section>\n");
    }

    private void summary(RunReport run) {
        SummaryFile s = run.summary();
        html.append("<section id=\"summary\">\n<h2>Summary</h2>\n");
        if (s.isAbc()) {
            html.append("<table id=\"tolerance\">\n<tr><th>tolerance reached (scaled distance)</th>")
                    .append(cell("final_tolerance", s.abc().finalTolerance())).append("</tr>\n<tr><th>the final ")
                    .append("tolerance asked for reached</th><td data-key=\"reached_final_tolerance\">")
                    .append(s.abc().reachedFinalTolerance() ? "yes" : "no").append("</td></tr>\n<tr><th>simulations</th>")
                    .append("<td data-key=\"simulations\" data-value=\"").append(s.abc().simulations()).append("\">")
                    .append(Readable.count(s.abc().simulations())).append("</td></tr>\n<tr><th>log evidence</th><td>")
                    .append("not reported for an ABC run (see the warnings)</td></tr>\n");
        } else {
            html.append("<table id=\"evidence\">\n<tr><th>log evidence, log Ẑ")
                    .append(" (natural log)</th>").append(cell("log_evidence", s.logEvidence())).append("</tr>\n");
            if (s.errorReliable() && Double.isFinite(s.logEvidenceError())) {
                html.append("<tr><th>its single-run standard error (±)</th>")
                        .append(cell("log_evidence_error", s.logEvidenceError())).append("</tr>\n");
            } else {
                html.append("<tr><th>its single-run standard error</th><td>not shown: not reliable (see the ")
                        .append("warnings)</td></tr>\n");
            }
        }
        html.append("</table>\n<table id=\"parameters\">\n<thead><tr><th>parameter</th><th>mean</th><th>sd</th>");
        for (String q : s.quantileKeys()) {
            html.append("<th data-key=\"").append(e(q)).append("\">").append(e(quantileLabel(q))).append("</th>");
        }
        html.append("</tr></thead>\n<tbody>\n");
        s.parameters().forEach((name, p) -> {
            html.append("<tr data-parameter=\"").append(e(name)).append("\"><th>").append(e(name)).append("</th>")
                    .append(cell("mean", p.mean())).append(cell("sd", p.sd()));
            p.quantiles().forEach((key, value) -> html.append(cell(key, value)));
            html.append("</tr>\n");
        });
        html.append("</tbody>\n</table>\n<p>Weighted over the final particles, on the model's scale; a quantile is "
                + "the smallest particle value whose cumulative weight reaches its probability (2.5 % … 97.5 %). "
                + "Four significant digits here; the exact values are in summary.json.</p>\n</section>\n");
    }

    private void posteriors(RunReport run, List<PosteriorFigures.Figure> figures) {
        html.append("<section id=\"posteriors\">\n<h2>Posterior of each parameter</h2>\n<p>Weighted histogram of "
                + "the final particles with the 95 % interval of the summary (dashed).");
        if (run.prior().available()) {
            html.append(" The black line is the prior density: where the posterior looks like the prior, the data "
                    + "say little about that parameter.");
        } else {
            html.append(" No prior is drawn: ").append(e(run.prior().note())).append('.');
        }
        html.append("</p>\n");
        for (PosteriorFigures.Figure f : figures) {
            // The file's name, numbered, so two names that clean up alike still get distinct ids.
            String id = f.files().png().substring(0, f.files().png().length() - ".png".length());
            html.append("<figure id=\"").append(e(id)).append("\" data-parameter=\"")
                    .append(e(f.parameter())).append("\" data-bin-edges=\"").append(numbers(f.histogram().edges()))
                    .append("\" data-bin-mass=\"").append(numbers(f.histogram().mass())).append("\">\n");
            image(f.files(), "Posterior histogram of " + f.parameter());
            html.append("<figcaption>Posterior of <b>").append(e(f.parameter())).append("</b>; 95 % interval ")
                    .append(Readable.number(f.low())).append(" to ").append(Readable.number(f.high())).append(". ");
            links(f.files());
            html.append("</figcaption>\n</figure>\n");
        }
        html.append("</section>\n");
    }

    private void fit(RunReport run, FitFigures.Written figures) {
        html.append("<section id=\"fit\">\n<h2>Fit against the data</h2>\n");
        if (figures == null) {
            html.append("<p>No fit figure: ").append(e(run.fit().note())).append(".</p>\n</section>\n");
            return;
        }
        html.append("<p>The observed data with the posterior predictive: replicate datasets simulated from "
                + "weighted draws of the final particles. Points far outside the bands, or residuals that "
                + "run on one side or trend, mean the model misses something in the data; a good fit does "
                + "not prove the model right.</p>\n");
        html.append("<figure id=\"fit-data\">\n");
        image(figures.fit(), "Observed data with 50 % and 95 % posterior predictive bands");
        html.append("<figcaption>Observed data (points) with the predictive median and its 50 % and 95 % bands. ");
        links(figures.fit());
        html.append("</figcaption>\n</figure>\n<figure id=\"fit-residuals\">\n");
        image(figures.residuals(), "Standardised residuals");
        html.append("<figcaption>Standardised residuals, (observed − predictive mean) ÷ predictive sd. ");
        links(figures.residuals());
        html.append("</figcaption>\n</figure>\n</section>\n");
    }

    private void pairs(RunReport run, PairSelection pairs, FigureFile.Written figure) {
        if (figure == null) {
            return;
        }
        html.append("<section id=\"pairs\">\n<h2>Pairs of parameters</h2>\n<p>Below the diagonal, where the "
                + "posterior mass of two parameters lies together (darker = more); above it, their weighted "
                + "correlation. A narrow diagonal band means the data fix a combination of the two rather than each "
                + "one; curved or split shapes mean the posterior is far from Gaussian.");
        if (pairs.chosen().size() < run.parameters().size()) {
            html.append(" Shown: ").append(pairs.chosen().size()).append(" of ").append(run.parameters().size())
                    .append(" parameters, those with the strongest correlation with another.");
        }
        html.append("</p>\n<figure id=\"pairs-figure\" data-parameters=\"");
        StringBuilder names = new StringBuilder();
        for (int i : pairs.chosen()) {
            names.append(names.length() == 0 ? "" : " ").append(run.parameters().get(i));
        }
        html.append(e(names.toString())).append("\">\n");
        image(figure, "Pair plot of the posterior");
        html.append("<figcaption>");
        links(figure);
        html.append("</figcaption>\n</figure>\n</section>\n");
    }

    private void iterations(List<IterationFigures.Figure> figures) {
        html.append("<section id=\"iterations\">\n<h2>Diagnostics per iteration</h2>\n");
        for (IterationFigures.Figure f : figures) {
            html.append("<figure id=\"").append(e(f.id())).append("\">\n");
            image(f.files(), f.heading());
            html.append("<figcaption><b>").append(e(f.heading())).append(".</b> ").append(e(f.caption())).append(' ');
            links(f.files());
            html.append("</figcaption>\n</figure>\n");
        }
        html.append("</section>\n");
    }

    private void image(FigureFile.Written files, String alt) {
        PageParts.image(html, files, alt);
    }

    private void links(FigureFile.Written files) {
        PageParts.links(html, files);
    }

    private static String cell(String key, double value) {
        return PageParts.cell(key, value);
    }

    /** {@code q2_5} → {@code 2.5 %}. */
    private static String quantileLabel(String key) {
        return key.substring(1).replace('_', '.') + " %";
    }

    private static String numbers(double[] values) {
        return PageParts.numbers(values);
    }

    private static String e(String text) {
        return PageParts.e(text);
    }
}
