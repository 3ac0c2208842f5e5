package org.skerry.cli.report;

import java.awt.Color;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.DoubleUnaryOperator;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.LegendItem;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;

/**
 * Each parameter's posterior as a weighted histogram of the final particles (density scale),
 * with the 95 % interval of {@code summary.json} ({@code q2_5}, {@code q97_5}) as dashed lines
 * and, when the model could be built again, the prior density over the same range.
 */
final class PosteriorFigures {

    /** Bins per histogram: enough to show shape at N of a few thousand, few enough to stay smooth. */
    static final int BINS = 40;

    /** A written histogram with the numbers behind it, so a reader (or a test) can check them. */
    record Figure(String parameter, WeightedHistogram histogram, double low, double high,
            FigureFile.Written files) {
    }

    private PosteriorFigures() {
    }

    static List<Figure> write(RunReport run, Path folder) throws IOException {
        List<Figure> figures = new ArrayList<>();
        List<String> names = run.parameters();
        for (int i = 0; i < names.size(); i++) {
            String name = names.get(i);
            WeightedHistogram histogram = WeightedHistogram.of(run.values().get(i), run.weights(), BINS);
            var summary = run.summary().parameters().get(name);
            double low = summary.quantiles().getOrDefault("q2_5", Double.NaN);
            double high = summary.quantiles().getOrDefault("q97_5", Double.NaN);
            DoubleUnaryOperator prior = run.prior().available() ? run.prior().densities().get(i) : null;
            JFreeChart chart = chart(name, histogram, low, high, prior);
            figures.add(new Figure(name, histogram, low, high,
                    FigureFile.write(folder, String.format("posterior-%02d-%s", i + 1, FileNames.safe(name)),
                            ChartStyle.WIDTH, ChartStyle.HEIGHT, chart::draw)));
        }
        return figures;
    }

    private static JFreeChart chart(String name, WeightedHistogram histogram, double low, double high,
            DoubleUnaryOperator prior) {
        XYIntervalSeries bars = new XYIntervalSeries("posterior (weighted histogram)");
        double[] edges = histogram.edges();
        for (int b = 0; b < histogram.bins(); b++) {
            double d = histogram.density(b);
            bars.add((edges[b] + edges[b + 1]) / 2, edges[b], edges[b + 1], d, 0, d);
        }
        XYIntervalSeriesCollection data = new XYIntervalSeriesCollection();
        data.addSeries(bars);
        XYBarRenderer renderer = new XYBarRenderer();
        renderer.setBarPainter(new StandardXYBarPainter());
        renderer.setShadowVisible(false);
        renderer.setDrawBarOutline(true);
        renderer.setSeriesPaint(0, Palette.SKY_BLUE);
        renderer.setSeriesOutlinePaint(0, Color.WHITE);
        NumberAxis x = new NumberAxis(name);
        x.setAutoRangeIncludesZero(false);
        NumberAxis y = new NumberAxis("density");
        XYPlot plot = new XYPlot(data, x, y, renderer);
        LegendItemCollection legend = new LegendItemCollection();
        LegendItem barItem = new LegendItem("posterior (weighted histogram of the final particles)", Palette.SKY_BLUE);
        barItem.setLabelFont(ChartStyle.LEGEND);
        legend.add(barItem);
        for (double q : new double[] {low, high}) {
            if (Double.isFinite(q)) {
                ValueMarker marker = new ValueMarker(q, Palette.VERMILLION, ChartStyle.DASHED);
                plot.addDomainMarker(marker);
            }
        }
        legend.add(ChartStyle.lineItem("95 % interval: " + Readable.number(low) + " to " + Readable.number(high),
                Palette.VERMILLION, ChartStyle.DASHED));
        if (prior != null) {
            XYSeries density = new XYSeries("prior density");
            int points = 200;
            for (int k = 0; k <= points; k++) {
                double at = edges[0] + (edges[edges.length - 1] - edges[0]) * k / points;
                double value = prior.applyAsDouble(at);
                if (Double.isFinite(value)) {
                    density.add(at, value);
                }
            }
            XYLineAndShapeRenderer line = new XYLineAndShapeRenderer(true, false);
            line.setSeriesPaint(0, Palette.BLACK);
            line.setSeriesStroke(0, ChartStyle.LINE);
            plot.setDataset(1, new XYSeriesCollection(density));
            plot.setRenderer(1, line);
            // Draw the prior over the bars, not hidden behind them.
            plot.setDatasetRenderingOrder(org.jfree.chart.plot.DatasetRenderingOrder.FORWARD);
            legend.add(ChartStyle.lineItem("prior density", Palette.BLACK, ChartStyle.LINE));
        }
        plot.setFixedLegendItems(legend);
        return ChartStyle.apply(new JFreeChart("Posterior of " + name, ChartStyle.TITLE, plot, true),
                BINS + " equal bins over the particles of positive weight; bar area = posterior mass");
    }
}
