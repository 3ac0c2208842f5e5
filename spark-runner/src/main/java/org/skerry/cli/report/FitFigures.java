package org.skerry.cli.report;

import java.awt.Color;
import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItem;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.DatasetRenderingOrder;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYDifferenceRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.skerry.cli.output.DoubleText;
import org.skerry.engine.model.Quantity;
import org.skerry.engine.model.predictive.PredictiveSummary;

/**
 * The fit against the data: the observed values with the 50 % and 95 % posterior predictive
 * bands and the predictive median, and the standardised residuals
 * {@code (observed − predictive mean) ÷ predictive sd} with lines at ±2. The observed values,
 * positions and band edges are written into each SVG as {@code data-*} attributes.
 */
final class FitFigures {

    /** The two written figures. */
    record Written(FigureFile.Written fit, FigureFile.Written residuals) {
    }

    /** The 95 % band's fill: a light tint of sky blue, so the 50 % band stands out inside it. */
    private static final Color WIDE_BAND = new Color(0xCFE6F6);

    private FitFigures() {
    }

    static Written write(PredictiveFit fit, Path folder) throws IOException {
        PredictiveSummary s = fit.summary();
        Map<String, String> data = bandData(s, "");
        FigureFile.Written bands = FigureFile.write(folder, "fit-data", ChartStyle.WIDTH, ChartStyle.HEIGHT,
                bandChart(s)::draw, data);
        Map<String, String> residualData = new LinkedHashMap<>();
        residualData.put("data-positions", numbers(s.positions()));
        residualData.put("data-residuals", numbers(s.residuals()));
        FigureFile.Written residuals = FigureFile.write(folder, "fit-residuals", ChartStyle.WIDTH, ChartStyle.HEIGHT,
                residualChart(s)::draw, residualData);
        return new Written(bands, residuals);
    }

    private static JFreeChart bandChart(PredictiveSummary s) {
        XYPlot plot = bandPlot(s);
        plot.setFixedLegendItems(bandLegend());
        return ChartStyle.apply(new JFreeChart("Fit against the data", ChartStyle.TITLE, plot, true),
                s.draws() + " replicate datasets from weighted posterior draws; about 1 point in 20 should lie "
                        + "outside the 95 % band");
    }

    /**
     * The observed values over the 95 % and 50 % predictive bands and the predictive median, with
     * labelled axes; the comparison of variants puts several side by side.
     */
    static XYPlot bandPlot(PredictiveSummary s) {
        double[] x = s.positions();
        XYPlot plot = new XYPlot();
        plot.setDomainAxis(new NumberAxis(label(s.positionQuantity())));
        NumberAxis y = new NumberAxis(label(s.observedQuantity()));
        y.setAutoRangeIncludesZero(false);
        plot.setRangeAxis(y);
        // Bands as the area between two lines: the 95 % band below the 50 % band, the data on top.
        plot.setDataset(0, band("95 %", x, s.quantile(0), s.quantile(4)));
        plot.setRenderer(0, bandRenderer(WIDE_BAND));
        plot.setDataset(1, band("50 %", x, s.quantile(1), s.quantile(3)));
        plot.setRenderer(1, bandRenderer(Palette.SKY_BLUE));
        XYSeries median = new XYSeries("predictive median", false);
        XYSeries observed = new XYSeries("observed", false);
        for (int i = 0; i < x.length; i++) {
            median.add(x[i], s.quantile(2)[i]);
            observed.add(x[i], s.observed()[i]);
        }
        XYLineAndShapeRenderer medianLine = new XYLineAndShapeRenderer(true, false);
        medianLine.setSeriesPaint(0, Palette.BLUE);
        medianLine.setSeriesStroke(0, ChartStyle.LINE);
        plot.setDataset(2, new XYSeriesCollection(median));
        plot.setRenderer(2, medianLine);
        XYLineAndShapeRenderer dots = new XYLineAndShapeRenderer(false, true);
        dots.setSeriesPaint(0, Palette.VERMILLION);
        dots.setSeriesShape(0, ChartStyle.DOT);
        plot.setDataset(3, new XYSeriesCollection(observed));
        plot.setRenderer(3, dots);
        plot.setDatasetRenderingOrder(DatasetRenderingOrder.FORWARD);
        return plot;
    }

    /** The legend of {@link #bandPlot}. */
    static LegendItemCollection bandLegend() {
        LegendItemCollection legend = new LegendItemCollection();
        legend.add(item("observed (the data file)", Palette.VERMILLION));
        legend.add(ChartStyle.lineItem("posterior predictive median", Palette.BLUE, ChartStyle.LINE));
        legend.add(item("50 % predictive band", Palette.SKY_BLUE));
        legend.add(item("95 % predictive band", WIDE_BAND));
        return legend;
    }

    /** The numbers behind a band plot as {@code data-<prefix>…} attributes. */
    static Map<String, String> bandData(PredictiveSummary s, String prefix) {
        Map<String, String> data = new LinkedHashMap<>();
        data.put("data-" + prefix + "positions", numbers(s.positions()));
        data.put("data-" + prefix + "observed", numbers(s.observed()));
        data.put("data-" + prefix + "predictive-mean", numbers(s.mean()));
        data.put("data-" + prefix + "predictive-sd", numbers(s.sd()));
        data.put("data-" + prefix + "q2-5", numbers(s.quantile(0)));
        data.put("data-" + prefix + "q97-5", numbers(s.quantile(4)));
        return data;
    }

    private static JFreeChart residualChart(PredictiveSummary s) {
        double[] x = s.positions();
        double[] r = s.residuals();
        XYSeries points = new XYSeries("standardised residual", false);
        for (int i = 0; i < x.length; i++) {
            if (Double.isFinite(r[i])) {
                points.add(x[i], r[i]);
            }
        }
        XYLineAndShapeRenderer dots = new XYLineAndShapeRenderer(false, true);
        dots.setSeriesPaint(0, Palette.BLUE);
        dots.setSeriesShape(0, ChartStyle.DOT);
        NumberAxis y = new NumberAxis("(observed − predictive mean) ÷ predictive sd");
        XYPlot plot = new XYPlot(new XYSeriesCollection(points), new NumberAxis(label(s.positionQuantity())), y, dots);
        for (double level : new double[] {-2, 2}) {
            plot.addRangeMarker(new ValueMarker(level, Palette.VERMILLION, ChartStyle.DASHED));
        }
        plot.addRangeMarker(new ValueMarker(0, Palette.BLACK, ChartStyle.LINE));
        LegendItemCollection legend = new LegendItemCollection();
        legend.add(item("standardised residual", Palette.BLUE));
        legend.add(ChartStyle.lineItem("±2", Palette.VERMILLION, ChartStyle.DASHED));
        plot.setFixedLegendItems(legend);
        return ChartStyle.apply(new JFreeChart("Standardised residuals", ChartStyle.TITLE, plot, true),
                "runs of residuals on one side, or a trend, point at a misfit the bands alone may hide");
    }

    private static XYSeriesCollection band(String name, double[] x, double[] low, double[] high) {
        XYSeries upper = new XYSeries(name + " upper", false);
        XYSeries lower = new XYSeries(name + " lower", false);
        for (int i = 0; i < x.length; i++) {
            upper.add(x[i], high[i]);
            lower.add(x[i], low[i]);
        }
        XYSeriesCollection data = new XYSeriesCollection();
        data.addSeries(upper);
        data.addSeries(lower);
        return data;
    }

    private static XYDifferenceRenderer bandRenderer(Color fill) {
        XYDifferenceRenderer renderer = new XYDifferenceRenderer(fill, fill, false);
        renderer.setSeriesPaint(0, fill);
        renderer.setSeriesPaint(1, fill);
        return renderer;
    }

    private static LegendItem item(String label, Color paint) {
        LegendItem item = new LegendItem(label, paint);
        item.setLabelFont(ChartStyle.LEGEND);
        return item;
    }

    static String label(Quantity quantity) {
        return quantity.unit().isEmpty() ? quantity.label() : quantity.label() + " (" + quantity.unit() + ")";
    }

    private static String numbers(double[] values) {
        StringBuilder text = new StringBuilder();
        for (int i = 0; i < values.length; i++) {
            text.append(i == 0 ? "" : " ").append(DoubleText.format(values[i]));
        }
        return text.toString();
    }
}
