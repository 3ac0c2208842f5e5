package org.skerry.cli.report;

import java.awt.Shape;
import java.awt.geom.Rectangle2D;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.plot.DatasetRenderingOrder;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYErrorRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/**
 * One forest plot per parameter across a batch's analyses: a row per analysis (dataset, then
 * variant, in the batch's order, the first at the top), its posterior mean as a marker coloured
 * and shaped by variant, the 95 % interval ({@code q2_5} to {@code q97_5} of its summary.json) as
 * a horizontal bar and the median as a black tick. A failed analysis keeps its row, empty, so a
 * gap reads as a gap. The numbers go into the SVG as {@code data-*} attributes as well.
 */
final class ForestFigures {

    /** One parameter's figure and the rows behind it (null summary values where an analysis has none). */
    record Figure(String parameter, List<BatchReport.Row> rows, FigureFile.Written files) {
    }

    private static final Shape TICK = new Rectangle2D.Double(-1.25, -9, 2.5, 18);

    private ForestFigures() {
    }

    static List<Figure> write(BatchReport batch, Path folder) throws IOException {
        List<Figure> figures = new ArrayList<>();
        List<String> parameters = batch.parameters();
        for (int p = 0; p < parameters.size(); p++) {
            String name = parameters.get(p);
            List<BatchReport.Row> rows = batch.rows();
            int height = Math.max(ChartStyle.HEIGHT - 120, Math.min(1800, 190 + 34 * rows.size()));
            FigureFile.Written files = FigureFile.write(folder, String.format("forest-%02d-%s", p + 1,
                    FileNames.safe(name)), ChartStyle.WIDTH, height, chart(batch, name)::draw, data(rows, name));
            figures.add(new Figure(name, rows, files));
        }
        return figures;
    }

    /** {@code mean, q50, q2_5, q97_5} of {@code parameter} in a row's summary, or null. */
    static double[] values(BatchReport.Row row, String parameter) {
        if (row.summary() == null || !row.summary().parameters().containsKey(parameter)) {
            return null;
        }
        SummaryFile.ParameterSummary s = row.summary().parameters().get(parameter);
        return new double[] {s.mean(), s.quantiles().getOrDefault("q50", Double.NaN),
            s.quantiles().getOrDefault("q2_5", Double.NaN), s.quantiles().getOrDefault("q97_5", Double.NaN)};
    }

    private static JFreeChart chart(BatchReport batch, String parameter) {
        List<BatchReport.Row> rows = batch.rows();
        List<String> variants = batch.variants();
        int n = rows.size();
        String[] labels = new String[n];
        Map<String, XYIntervalSeries> byVariant = new LinkedHashMap<>();
        variants.forEach(v -> byVariant.put(v, new XYIntervalSeries("variant " + v)));
        XYSeries medians = new XYSeries("median", false);
        for (int i = 0; i < n; i++) {
            BatchReport.Row row = rows.get(i);
            int y = n - 1 - i; // the first analysis at the top
            double[] v = values(row, parameter);
            labels[y] = row.label() + (row.succeeded() ? "" : " (" + row.status() + ")");
            if (v != null) {
                byVariant.get(row.variant()).add(v[0], v[2], v[3], y, y, y);
                if (Double.isFinite(v[1])) {
                    medians.add(v[1], y);
                }
            }
        }
        XYIntervalSeriesCollection intervals = new XYIntervalSeriesCollection();
        byVariant.values().forEach(intervals::addSeries);
        XYErrorRenderer bars = new XYErrorRenderer();
        bars.setDrawYError(false);
        bars.setDrawXError(true);
        bars.setErrorStroke(ChartStyle.LINE);
        bars.setCapLength(8);
        bars.setDefaultLinesVisible(false);
        bars.setDefaultShapesVisible(true);
        LegendItemCollection legend = new LegendItemCollection();
        for (int k = 0; k < variants.size(); k++) {
            bars.setSeriesPaint(k, Palette.series(k));
            bars.setSeriesShape(k, ChartStyle.marker(k));
            legend.add(ChartStyle.markerItem("variant " + variants.get(k) + ": mean, 95 % interval", Palette.series(k),
                    ChartStyle.marker(k)));
        }
        NumberAxis x = new NumberAxis(parameter);
        x.setAutoRangeIncludesZero(false);
        SymbolAxis y = new SymbolAxis(null, labels);
        y.setGridBandsVisible(false);
        y.setLowerMargin(0.5 / Math.max(1, n));
        y.setUpperMargin(0.5 / Math.max(1, n));
        XYPlot plot = new XYPlot(intervals, x, y, bars);
        XYLineAndShapeRenderer ticks = new XYLineAndShapeRenderer(false, true);
        ticks.setSeriesPaint(0, Palette.BLACK);
        ticks.setSeriesShape(0, TICK);
        plot.setDataset(1, new XYSeriesCollection(medians));
        plot.setRenderer(1, ticks);
        plot.setDatasetRenderingOrder(DatasetRenderingOrder.FORWARD);
        legend.add(ChartStyle.markerItem("median", Palette.BLACK, TICK));
        plot.setFixedLegendItems(legend);
        JFreeChart chart = ChartStyle.apply(new JFreeChart("Posterior of " + parameter + " across analyses",
                ChartStyle.TITLE, plot, true), "one row per analysis (dataset · variant); from each run's summary.json");
        y.setTickLabelFont(ChartStyle.TICK);
        return chart;
    }

    private static Map<String, String> data(List<BatchReport.Row> rows, String parameter) {
        List<String> names = new ArrayList<>();
        double[][] columns = new double[4][rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            names.add(rows.get(i).dataset() + "/" + rows.get(i).variant());
            double[] v = values(rows.get(i), parameter);
            for (int k = 0; k < 4; k++) {
                columns[k][i] = v == null ? Double.NaN : v[k];
            }
        }
        Map<String, String> data = new LinkedHashMap<>();
        data.put("data-parameter", parameter);
        data.put("data-analyses", String.join(" ", names));
        data.put("data-mean", PageParts.numbers(columns[0]));
        data.put("data-q50", PageParts.numbers(columns[1]));
        data.put("data-q2-5", PageParts.numbers(columns[2]));
        data.put("data-q97-5", PageParts.numbers(columns[3]));
        return data;
    }
}
