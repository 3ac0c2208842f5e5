package org.skerry.cli.report;

import static org.skerry.cli.report.PageParts.e;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Writes a scaling study's {@code index.html} with the shared pieces of {@link PageParts}: the
 * setup, a table per point (median over repeats with the range), the speed-up, efficiency and
 * phase figures, every run's numbers with a link to its own report where it has one, and how to
 * read timings measured on a shared machine. Cells carry scaling.csv's values in {@code data-value}.
 */
final class StudyPage {

    private final StringBuilder html = new StringBuilder(32 * 1024);
    private final StudyReport study;

    private StudyPage(StudyReport study) {
        this.study = study;
    }

    static String of(StudyReport study, ScalingFigures.Written figures) {
        StudyPage page = new StudyPage(study);
        page.head();
        page.points();
        page.figures(figures);
        page.runs();
        page.reading();
        PageParts.end(page.html);
        return page.html.toString();
    }

    private void head() {
        PageParts.head(html, "Scaling study report: " + study.name());
        html.append("<p class=\"meta\">").append(e(study.scaling())).append(" scaling, ")
                .append(study.byPoint().size()).append(" point(s), ").append(study.repeats())
                .append(" repeat(s) per point, ").append(study.runs().size()).append(" runs");
        if (!study.base().isEmpty()) {
            html.append("; base run file <code>").append(e(String.valueOf(Path.of(study.base()).getFileName())))
                    .append("</code>");
        }
        html.append(". Made from the study folder's <a href=\"../scaling.csv\">scaling.csv</a> (one row per run, "
                + "exact values)");
        if (Files.isRegularFile(study.folder().resolve("summary.md"))) {
            html.append(" — <a href=\"../summary.md\">summary.md</a> says what each column measures");
        }
        html.append(".</p>\n");
    }

    private void points() {
        html.append("<section id=\"points\">\n<h2>Points</h2>\n<table id=\"points-table\">\n<thead><tr>")
                .append("<th>point</th><th>cores</th><th>N</th><th>sampler loop (s)</th><th>speed-up</th>")
                .append("<th>efficiency</th><th>evaluations per second</th><th>move share</th></tr></thead>\n<tbody>\n");
        study.byPoint().forEach((point, runs) -> {
            StudyReport.Run first = runs.get(0);
            List<Double> loop = new ArrayList<>();
            List<Double> speedup = new ArrayList<>();
            List<Double> efficiency = new ArrayList<>();
            List<Double> rate = new ArrayList<>();
            List<Double> move = new ArrayList<>();
            for (StudyReport.Run run : runs) {
                loop.add(run.loopSeconds());
                speedup.add(run.speedup());
                efficiency.add(run.efficiency());
                rate.add(run.evaluationsPerSecond());
                move.add(run.phases()[StudyReport.PHASES.indexOf("move")] / run.loopSeconds());
            }
            html.append("<tr data-point=\"").append(e(point)).append("\"><th>").append(e(point)).append("</th>")
                    .append(first.cores() == 0 ? "<td data-key=\"cores\">–</td>"
                            : PageParts.countCell("cores", first.cores()))
                    .append(PageParts.countCell("particles", first.particles()))
                    .append(spread("loop_seconds", loop)).append(spread("speedup", speedup))
                    .append(spread("efficiency", efficiency)).append(spread("evaluations_per_second", rate))
                    .append(spread("move_share", move)).append("</tr>\n");
        });
        html.append("</tbody>\n</table>\n<p>Median over the repeats, the range in brackets. Speed-up and efficiency "
                + "pair each run with the run of the same repeat at the point of its group (same values on every "
                + "axis but cores) with the fewest cores; the move share is the part of the sampler loop spent in "
                + "the MH moves, where the likelihood calls are.</p>\n</section>\n");
    }

    /** A cell with the median in {@code data-value} and, over several repeats, the range in brackets. */
    private static String spread(String key, List<Double> values) {
        double[] s = StudyReport.spread(values);
        String cell = PageParts.cell(key, s[0]);
        if (values.size() == 1) {
            return cell;
        }
        return cell.replace("</td>", " [" + e(Readable.number(s[1])) + "–" + e(Readable.number(s[2])) + "]</td>")
                .replace("<td ", "<td data-min=\"" + org.skerry.cli.output.DoubleText.format(s[1]) + "\" data-max=\""
                        + org.skerry.cli.output.DoubleText.format(s[2]) + "\" ");
    }

    private void figures(ScalingFigures.Written figures) {
        html.append("<section id=\"figures\">\n<h2>How the runs scale</h2>\n");
        if (figures.speedup() == null) {
            html.append("<p>The study has no cores axis: every point is its own baseline, so there is no speed-up "
                    + "to plot.</p>\n");
        } else {
            PageParts.figure(html, "speedup", figures.speedup(), "Speed-up against cores",
                    "Speed-up against cores per group of points, with the ideal dashed.");
            PageParts.figure(html, "efficiency", figures.efficiency(), "Parallel efficiency against cores",
                    "Parallel efficiency against cores; 1 is ideal.");
        }
        PageParts.figure(html, "phases", figures.phases(), "Time per phase of the sampler loop",
                "Time per phase of the sampler loop per point (mean over repeats).");
        html.append("</section>\n");
    }

    private void runs() {
        html.append("<section id=\"runs\">\n<h2>Every run</h2>\n<table id=\"runs-table\">\n<thead><tr>")
                .append("<th>point</th><th>repeat</th><th>wall (s)</th><th>sampler loop (s)</th><th>speed-up</th>")
                .append("<th>efficiency</th><th>load average at start</th><th>run report</th></tr></thead>\n<tbody>\n");
        for (StudyReport.Run run : study.runs()) {
            html.append("<tr data-point=\"").append(e(run.point())).append("\" data-repeat=\"").append(run.repeat())
                    .append("\"><th>").append(e(run.point())).append("</th>")
                    .append(PageParts.countCell("repeat", run.repeat()))
                    .append(PageParts.cell("wall_seconds", run.wallSeconds()))
                    .append(PageParts.cell("loop_seconds", run.loopSeconds()))
                    .append(PageParts.cell("speedup", run.speedup()))
                    .append(PageParts.cell("efficiency", run.efficiency()))
                    .append(PageParts.cell("load_average", run.loadAverage(), "–")).append("<td class=\"text\">");
            Path runFolder = study.folder().toAbsolutePath().normalize().resolve(run.runFolder()).normalize();
            Path page = runFolder.resolve(ReportWriter.FOLDER).resolve(ReportWriter.PAGE);
            if (runFolder.startsWith(study.folder().toAbsolutePath().normalize()) && Files.isRegularFile(page)) {
                html.append("<a class=\"run-report\" href=\"").append(e(PageParts.address("../" + run.runFolder()
                        + "/" + ReportWriter.FOLDER + "/" + ReportWriter.PAGE))).append("\">report</a>");
            } else {
                html.append("–");
            }
            html.append("</td></tr>\n");
        }
        html.append("</tbody>\n</table>\n</section>\n");
    }

    private void reading() {
        html.append("""
                <section id="reading">
                <h2>Reading timings</h2>
                <p>Timings on a shared machine move with its load: compare the load averages, prefer the paired \
                speed-ups (repeat r against repeat r) to single times, and repeat a study before a decision \
                about hardware or settings rests on it. A speed-up above the ideal usually means the baseline \
                run was disturbed.</p>
                </section>
                """);
    }
}
