package org.skerry.cli.report;

import java.awt.Color;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.annotations.XYBoxAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYErrorRenderer;
import org.jfree.chart.ui.Layer;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;

/**
 * The log Bayes factors of a batch: one row per dataset and non-reference variant, the factor
 * against the reference variant as a marker with a bar of ± one combined standard error
 * (√(se² + se_ref²), as batch-summary.json has it), and behind it a shaded "not a preference"
 * zone from −2 to +2 combined errors around zero: a factor inside its zone does not tell the two
 * variants apart beyond the Monte Carlo error of the two runs. Rows whose error is not reliable
 * get no bar and no zone.
 */
final class BayesFactorFigure {

    /** The zone's half-width, in combined standard errors. */
    static final double ZONE = 2.0;

    /** A grey that every colour vision sees as grey, light enough for the markers to stand out. */
    static final Color ZONE_FILL = new Color(0xDDDDDD);

    /** The written figure with the rows it shows, top first. */
    record Written(List<BatchReport.Row> rows, FigureFile.Written files) {
    }

    private BayesFactorFigure() {
    }

    /** The rows a Bayes-factor figure shows: non-reference variants with a finite factor. */
    static List<BatchReport.Row> rows(BatchReport batch) {
        List<BatchReport.Row> out = new ArrayList<>();
        for (BatchReport.Row row : batch.rows()) {
            if (!row.variant().equals(batch.referenceVariant()) && Double.isFinite(row.logBayesFactor())) {
                out.add(row);
            }
        }
        return out;
    }

    /** Writes the figure, or returns null when no row has a Bayes factor. */
    static Written write(BatchReport batch, Path folder) throws IOException {
        List<BatchReport.Row> rows = rows(batch);
        if (rows.isEmpty()) {
            return null;
        }
        int height = Math.max(ChartStyle.HEIGHT - 120, Math.min(1800, 220 + 40 * rows.size()));
        Map<String, String> data = new LinkedHashMap<>();
        double[] factors = new double[rows.size()];
        double[] errors = new double[rows.size()];
        List<String> names = new ArrayList<>();
        for (int i = 0; i < rows.size(); i++) {
            factors[i] = rows.get(i).logBayesFactor();
            errors[i] = rows.get(i).logBayesFactorError();
            names.add(rows.get(i).dataset() + "/" + rows.get(i).variant());
        }
        data.put("data-reference", batch.referenceVariant());
        data.put("data-analyses", String.join(" ", names));
        data.put("data-log-bayes-factor", PageParts.numbers(factors));
        data.put("data-error", PageParts.numbers(errors));
        data.put("data-zone-errors", PageParts.numbers(new double[] {ZONE}));
        return new Written(rows, FigureFile.write(folder, "bayes-factors", ChartStyle.WIDTH, height,
                chart(batch, rows)::draw, data));
    }

    private static JFreeChart chart(BatchReport batch, List<BatchReport.Row> rows) {
        int n = rows.size();
        String[] labels = new String[n];
        XYIntervalSeries points = new XYIntervalSeries("log Bayes factor");
        XYPlot plot = new XYPlot();
        boolean anyUnreliable = false;
        List<XYBoxAnnotation> zones = new ArrayList<>();
        double low = 0;
        double high = 0;
        for (int i = 0; i < n; i++) {
            BatchReport.Row row = rows.get(i);
            int y = n - 1 - i;
            labels[y] = row.dataset() + " · " + row.variant();
            double b = row.logBayesFactor();
            double e = row.logBayesFactorError();
            low = Math.min(low, b - (Double.isFinite(e) ? ZONE * e : 0));
            high = Math.max(high, b + (Double.isFinite(e) ? ZONE * e : 0));
            low = Math.min(low, Double.isFinite(e) ? -ZONE * e : 0);
            high = Math.max(high, Double.isFinite(e) ? ZONE * e : 0);
            if (Double.isFinite(e)) {
                points.add(b, b - e, b + e, y, y, y);
                zones.add(new XYBoxAnnotation(-ZONE * e, y - 0.38, ZONE * e, y + 0.38, null, null, ZONE_FILL));
            } else {
                points.add(b, b, b, y, y, y);
                labels[y] += " (error unreliable)";
                anyUnreliable = true;
            }
        }
        XYIntervalSeriesCollection data = new XYIntervalSeriesCollection();
        data.addSeries(points);
        XYErrorRenderer renderer = new XYErrorRenderer();
        renderer.setDrawYError(false);
        renderer.setDrawXError(true);
        renderer.setErrorStroke(ChartStyle.LINE);
        renderer.setCapLength(10);
        renderer.setDefaultLinesVisible(false);
        renderer.setDefaultShapesVisible(true);
        renderer.setSeriesPaint(0, Palette.BLUE);
        renderer.setSeriesShape(0, ChartStyle.marker(3));
        // Behind the markers and the grid's zero line, so neither is hidden by a zone.
        zones.forEach(zone -> renderer.addAnnotation(zone, Layer.BACKGROUND));
        NumberAxis x = new NumberAxis("log Bayes factor against " + batch.referenceVariant()
                + " (natural log; > 0 favours the row's variant)");
        // Every zone and bar in view, with a margin: the automatic range ignores the zones.
        double margin = high > low ? 0.08 * (high - low) : 1;
        x.setRange(low - margin, high + margin);
        SymbolAxis y = new SymbolAxis(null, labels);
        y.setGridBandsVisible(false);
        y.setLowerMargin(0.5 / n);
        y.setUpperMargin(0.5 / n);
        plot.setDataset(data);
        plot.setRenderer(renderer);
        plot.setDomainAxis(x);
        plot.setRangeAxis(y);
        plot.addDomainMarker(new ValueMarker(0, Palette.BLACK, ChartStyle.LINE));
        LegendItemCollection legend = new LegendItemCollection();
        legend.add(ChartStyle.markerItem("log Bayes factor, bar ± 1 combined standard error", Palette.BLUE,
                ChartStyle.marker(3)));
        legend.add(ChartStyle.boxItem("not a preference: within ± 2 combined errors of 0", ZONE_FILL));
        plot.setFixedLegendItems(legend);
        return ChartStyle.apply(new JFreeChart("Log Bayes factors per dataset", ChartStyle.TITLE, plot, true),
                "a marker outside its grey zone differs from 0 by more than two combined single-run errors"
                        + (anyUnreliable ? "; rows marked unreliable have none" : ""));
    }
}
