package org.skerry.cli.report;

import java.awt.Paint;
import java.awt.Shape;
import java.awt.Stroke;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.CombinedDomainXYPlot;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/**
 * The per-iteration figures from {@code iterations.csv}: temperature, ESS/N with the resampling
 * threshold, acceptance and MH steps with the step cap, evidence increments with the running log
 * evidence, and invalid evaluations. Iteration 0 (the draw from the prior) makes no moves, so it
 * has no acceptance or steps to plot.
 */
final class IterationFigures {

    /** A written figure with its heading and the caption that says how to read it. */
    record Figure(String id, String heading, String caption, FigureFile.Written files) {
    }

    private IterationFigures() {
    }

    static List<Figure> write(RunReport run, Path folder) throws IOException {
        CsvColumns rows = run.iterations();
        double[] it = rows.column("iteration");
        List<Figure> figures = new ArrayList<>();
        boolean abc = run.summary().isAbc();
        if (abc) {
            figures.add(figure(folder, "tolerance", "Tolerance per iteration",
                    "Top: the ABC tolerance on the scaled distance between simulated and observed summaries (the "
                            + "prior draw at iteration 0 has none). Where the distance's scales are re-estimated "
                            + "each iteration, its unit changes as the run goes. Bottom: the share of particles "
                            + "within the tolerance. A tolerance that stops falling while acceptance drops means "
                            + "the summaries cannot be matched more closely at this budget.",
                    tolerance(it, rows.column("tolerance"), rows.column("share_within_tolerance"))));
        } else {
            figures.add(figure(folder, "temperature", "Temperature per iteration",
                    "How the run walked from the prior (0) to the posterior (1). Many small steps mean the "
                            + "likelihood is sharp relative to the prior; with data tempering it is the share of "
                            + "observations included.", temperature(it, rows.column("temperature"))));
        }
        figures.add(figure(folder, "ess", "Effective sample size per iteration",
                "ESS/N after reweighting, before any resampling; the population is resampled when it falls to the "
                        + "dashed threshold (filled markers). Repeated drops far below the threshold mean the targets "
                        + "change too fast.", ess(run, it, rows)));
        figures.add(figure(folder, "moves", "Metropolis–Hastings moves per iteration",
                "Top: share of proposals accepted. Bottom: MH steps per particle"
                        + (run.maxSteps() > 0 ? ", with the step cap (sampler.moves.max-steps) dashed; steps at the "
                        + "cap mean many particles may not have moved and the posterior may be under-explored."
                        : " (a fixed count)."), moves(run, it, rows)));
        if (!abc) {
            figures.add(figure(folder, "evidence", "Log evidence per iteration",
                    "Top: the log evidence increment of each reweighting. Bottom: the running log evidence, their sum; "
                            + "its last value is log Ẑ of the summary.", evidence(it, rows)));
        }
        figures.add(figure(folder, "invalid", "Invalid and zero-likelihood evaluations per iteration",
                "Invalid: NaN, +∞ or an exception from the model, after retries (weight zero, counted apart). "
                        + "Zero likelihood: the model returned −∞ (a valid zero). Invalid evaluations make the "
                        + "posterior conditional on where the model works.", invalid(it, rows)));
        return figures;
    }

    private static Figure figure(Path folder, String id, String heading, String caption, JFreeChart chart)
            throws IOException {
        return new Figure(id, heading, caption,
                FigureFile.write(folder, id, ChartStyle.WIDTH, ChartStyle.HEIGHT, chart::draw));
    }

    private static JFreeChart temperature(double[] it, double[] temperature) {
        XYPlot plot = plot(axis("temperature φ (0 = prior, 1 = posterior)"),
                series("temperature", it, temperature, 0), Palette.BLUE, ChartStyle.LINE, true);
        ((NumberAxis) plot.getRangeAxis()).setRange(0, 1.02);
        return chart("Temperature per iteration", plot, "iteration 0 is the draw from the prior");
    }

    private static JFreeChart tolerance(double[] it, double[] tolerance, double[] share) {
        XYPlot top = plot(axis("tolerance (scaled distance)"), series("tolerance", it, tolerance, 1), Palette.BLUE,
                ChartStyle.LINE, true);
        XYPlot bottom = plot(axis("share within the tolerance"), series("share within", it, share, 1),
                Palette.BLUISH_GREEN, ChartStyle.LINE, true);
        ((NumberAxis) bottom.getRangeAxis()).setRange(0, 1.02);
        return chart("Tolerance per iteration", combined(top, bottom), "ABC; iteration 0 is the draw from the prior");
    }

    private static JFreeChart ess(RunReport run, double[] it, CsvColumns rows) {
        double n = run.particles();
        double[] ess = rows.column("ess");
        double[] share = new double[ess.length];
        for (int i = 0; i < ess.length; i++) {
            share[i] = ess[i] / n;
        }
        XYSeriesCollection data = new XYSeriesCollection();
        data.addSeries(series("ESS / N", it, share, 0));
        XYSeries resampled = new XYSeries("resampled in this iteration");
        double[] flag = rows.column("resampled");
        for (int i = 0; i < it.length; i++) {
            if (flag[i] == 1) {
                resampled.add(it[i], share[i]);
            }
        }
        data.addSeries(resampled);
        data.addSeries(constant("resampling threshold (" + Readable.number(run.threshold()) + ")", it,
                run.threshold()));
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        style(renderer, 0, Palette.BLUE, ChartStyle.LINE, true, false);
        style(renderer, 1, Palette.VERMILLION, ChartStyle.LINE, false, true);
        renderer.setSeriesShape(1, new java.awt.geom.Rectangle2D.Double(-5, -5, 10, 10));
        style(renderer, 2, Palette.BLACK, ChartStyle.DASHED, true, false);
        renderer.setSeriesShapesVisible(2, false);
        XYPlot plot = new XYPlot(data, iterationAxis(), axis("ESS / N (share of particles)"), renderer);
        ((NumberAxis) plot.getRangeAxis()).setRange(0, 1.02);
        return chart("Effective sample size per iteration", plot, "N = " + Readable.count(run.particles())
                + " particles; ESS before resampling");
    }

    private static JFreeChart moves(RunReport run, double[] it, CsvColumns rows) {
        XYPlot acceptance = plot(axis("acceptance rate"), series("acceptance", it, rows.column("acceptance"), 1),
                Palette.BLUISH_GREEN, ChartStyle.LINE, true);
        ((NumberAxis) acceptance.getRangeAxis()).setRange(0, 1.02);
        XYSeriesCollection steps = new XYSeriesCollection(series("MH steps per particle", it, rows.column("mh_steps"), 1));
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        style(renderer, 0, Palette.ORANGE, ChartStyle.LINE, true, true);
        if (run.maxSteps() > 0) {
            steps.addSeries(constant("step cap (" + run.maxSteps() + ")", it, run.maxSteps()));
            style(renderer, 1, Palette.BLACK, ChartStyle.DASHED, true, false);
        }
        NumberAxis stepAxis = axis("MH steps");
        stepAxis.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        stepAxis.setAutoRangeIncludesZero(true);
        XYPlot stepPlot = new XYPlot(steps, null, stepAxis, renderer);
        return chart("Metropolis–Hastings moves per iteration", combined(acceptance, stepPlot),
                "iteration 0 makes no moves");
    }

    private static JFreeChart evidence(double[] it, CsvColumns rows) {
        XYPlot increments = plot(axis("increment of log Ẑ"),
                series("log evidence increment", it, rows.column("log_evidence_increment"), 1), Palette.REDDISH_PURPLE,
                ChartStyle.LINE, true);
        XYPlot running = plot(axis("log Ẑ so far"), series("running log evidence", it, rows.column("log_evidence"), 0),
                Palette.BLUE, ChartStyle.LINE, true);
        return chart("Log evidence per iteration", combined(increments, running), "natural logarithm");
    }

    private static JFreeChart invalid(double[] it, CsvColumns rows) {
        XYSeriesCollection data = new XYSeriesCollection();
        data.addSeries(series("invalid (after retries)", it, rows.column("invalid"), 0));
        data.addSeries(series("zero likelihood (valid)", it, rows.column("zero_likelihood"), 0));
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        style(renderer, 0, Palette.VERMILLION, ChartStyle.LINE, true, true);
        style(renderer, 1, Palette.SKY_BLUE, ChartStyle.DASHED, true, true);
        NumberAxis counts = axis("evaluations in the iteration");
        counts.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        counts.setAutoRangeIncludesZero(true);
        return chart("Invalid and zero-likelihood evaluations", new XYPlot(data, iterationAxis(), counts, renderer),
                "per iteration, out of its likelihood evaluations");
    }

    private static JFreeChart chart(String title, XYPlot plot, String note) {
        if (plot.getDomainAxis() == null) {
            plot.setDomainAxis(iterationAxis());
        }
        return ChartStyle.apply(new JFreeChart(title, ChartStyle.TITLE, plot, true), note);
    }

    private static XYPlot combined(XYPlot top, XYPlot bottom) {
        CombinedDomainXYPlot plot = new CombinedDomainXYPlot(iterationAxis());
        plot.setGap(12);
        ChartStyle.xyPlot(top);
        ChartStyle.xyPlot(bottom);
        plot.add(top, 1);
        plot.add(bottom, 1);
        return plot;
    }

    private static XYPlot plot(NumberAxis range, XYSeries series, Paint paint, Stroke stroke, boolean shapes) {
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer();
        style(renderer, 0, paint, stroke, true, shapes);
        return new XYPlot(new XYSeriesCollection(series), null, range, renderer);
    }

    private static void style(XYLineAndShapeRenderer renderer, int series, Paint paint, Stroke stroke, boolean lines,
            boolean shapes) {
        renderer.setSeriesPaint(series, paint);
        renderer.setSeriesStroke(series, stroke);
        renderer.setSeriesLinesVisible(series, lines);
        renderer.setSeriesShapesVisible(series, shapes);
        Shape dot = ChartStyle.DOT;
        renderer.setSeriesShape(series, dot);
    }

    /** The points from iteration {@code from} on with a finite value. */
    private static XYSeries series(String name, double[] it, double[] values, int from) {
        XYSeries series = new XYSeries(name, false, true);
        for (int i = 0; i < it.length; i++) {
            if (it[i] >= from && Double.isFinite(values[i])) {
                series.add(it[i], values[i]);
            }
        }
        return series;
    }

    private static XYSeries constant(String name, double[] it, double value) {
        XYSeries series = new XYSeries(name);
        series.add(it[0], value);
        series.add(Math.max(it[it.length - 1], it[0] + 1), value);
        return series;
    }

    private static NumberAxis iterationAxis() {
        NumberAxis axis = axis("iteration");
        axis.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        axis.setAutoRangeIncludesZero(true);
        return axis;
    }

    private static NumberAxis axis(String label) {
        NumberAxis axis = new NumberAxis(label);
        axis.setAutoRangeIncludesZero(false);
        ChartStyle.axis(axis);
        return axis;
    }
}
